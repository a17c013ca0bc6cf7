import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatChipListboxHarness } from '@angular/material/chips/testing';
import { MatExpansionPanelHarness } from '@angular/material/expansion/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { DEFERENCE_NOTE } from '@benchtide/shared';
import { BenchIcons } from '../core/bench-icons';
import { DevicePreferences } from '../core/device-preferences';
import { PourPlanner } from './pour-planner';

// Where the numbers below come from:
// 1 mL = 1000 mm³, 1 in = 25.4 mm, °F = 1.8 × °C + 32 (NIST SP 811); 1 US fl oz = 29.5735295625 mL and
// 1 oz = 28.349523125 g (NIST Handbook 44, Appendix C); mass = volume × density (definition of density).
// The 10-degree rule t = t_ref × 2^((T_ref - T) / 10) and n = ceil(depth / maximum layer) are common practice.
// The material numbers are the typical values from memory in shared/material-presets.ts; these specs check that
// the screen shows what the shared maths makes of them, worked by hand.
// Defaults with no saved draft: rectangle 120 × 45 mm, 6 mm deep, nothing displaced, 10 % extra, deep-pour epoxy
// (2:1 by volume, 1.12 and 0.98 g/mL, at most 50 mm a layer, times at 25 °C, no colder than 18 °C),
// room 20 °C, a scale that reads 0.1 g.

const DRAFT_KEY = 'benchtide.pour-plan-draft';
const PREFERENCES_KEY = 'benchtide.device-preferences';

describe('PourPlanner', () => {
  let fixture: ComponentFixture<PourPlanner>;
  let loader: HarnessLoader;

  function configure(): void {
    TestBed.configureTestingModule({
      imports: [PourPlanner],
      providers: [provideHttpClient(), provideAppInitializer(() => inject(BenchIcons).register())],
    });
  }

  async function createPlanner(): Promise<void> {
    fixture = TestBed.createComponent(PourPlanner);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function render(): Promise<void> {
    configure();
    await createPlanner();
  }

  function query<T extends Element = HTMLElement>(selector: string): T | null {
    return (fixture.nativeElement as HTMLElement).querySelector<T>(selector);
  }

  function queryAll(selector: string): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>(selector));
  }

  function textOf(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function result(name: string): string {
    return textOf(`[data-result="${name}"]`);
  }

  /** "Mix in all" and the weight beside it. */
  function toMix(): { volume: string; mass: string } {
    return { volume: textOf('[data-result="to-mix"] .value'), mass: textOf('[data-result="to-mix"] .aside') };
  }

  /** A row of the amounts table: what, weigh, or measure. */
  function row(name: string): string[] {
    return queryAll(`[data-result="${name}"] > *`).map((cell) => (cell.textContent ?? '').trim());
  }

  function field(name: string): HTMLInputElement {
    const input = query<HTMLInputElement>(`[data-field="${name}"]`);
    if (!input) throw new Error(`No field ${name}`);
    return input;
  }

  /** The plain-words message under a field. */
  function hintOf(name: string): string {
    return (field(name).closest('mat-form-field')?.querySelector('mat-hint')?.textContent ?? '').trim();
  }

  function suffixOf(name: string): string {
    return (field(name).closest('mat-form-field')?.querySelector('[matTextSuffix]')?.textContent ?? '').trim();
  }

  /** What the "No plan yet" card lists. */
  function listedProblems(): string[] {
    return queryAll('bt-pour-plan-sheet .invalid li').map((item) => item.textContent?.trim() ?? '');
  }

  async function type(name: string, text: string): Promise<void> {
    const input = field(name);
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  async function chooseShape(label: string): Promise<void> {
    const shapes = await loader.getHarness(MatChipListboxHarness);
    await shapes.selectChips({ text: label });
    await fixture.whenStable();
  }

  async function chooseIn(select: MatSelectHarness, option: string): Promise<void> {
    await select.open();
    await select.clickOptions({ text: option });
    await fixture.whenStable();
  }

  async function choosePreset(name: string): Promise<void> {
    await chooseIn(await loader.getHarness(MatSelectHarness.with({ selector: '[data-field="preset"]' })), name);
  }

  async function chooseScale(step: string): Promise<void> {
    const formField = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'My scale reads to' }));
    const select = await formField.getControl(MatSelectHarness);
    if (!select) throw new Error('No scale select');
    await chooseIn(select, step);
  }

  async function switchTo(units: RegExp): Promise<void> {
    const toggle = await loader.getHarness(MatButtonToggleHarness.with({ text: units }));
    await toggle.check();
    await fixture.whenStable();
  }

  function clearStorage(): void {
    localStorage.removeItem(DRAFT_KEY);
    localStorage.removeItem(PREFERENCES_KEY);
  }

  beforeEach(clearStorage);
  afterEach(clearStorage);

  describe('the plan from the defaults', () => {
    beforeEach(render);

    it('should fill in the starting values', () => {
      expect(field('length').value).toBe('120');
      expect(field('width').value).toBe('45');
      expect(field('depth').value).toBe('6');
      expect(field('displaced').value).toBe('0');
      expect(field('waste').value).toBe('10');
      expect(field('partA').value).toBe('2');
      expect(field('partB').value).toBe('1');
      expect(field('densityA').value).toBe('1.12');
      expect(field('densityB').value).toBe('0.98');
      expect(field('maxLayer').value).toBe('50');
      expect(field('potLife').value).toBe('180');
      expect(field('referenceTemp').value).toBe('25');
      expect(field('minCureTemp').value).toBe('18');
      expect(field('roomTemp').value).toBe('20');
      expect(suffixOf('length')).toBe('mm');
      expect(suffixOf('displaced')).toBe('mL');
      expect(suffixOf('roomTemp')).toBe('°C');
    });

    it('should show how much to mix at once, with no button to press', () => {
      // Worked by hand: 120 × 45 × 6 mm = 32 400 mm³ = 32.4 mL (1 mL = 1000 mm³, NIST SP 811);
      // plus 10 %: 32.4 × 1.1 = 35.64 mL, shown to 0.1 mL.
      expect(textOf('[data-result="to-mix"] .label')).toBe('Mix in all');
      expect(toMix().volume).toBe('35.6 mL');
      // 2:1 by volume mixes at (2 × 1.12 + 1 × 0.98) / 3 = 1.0733 g/mL; 35.64 mL × 1.0733 = 38.25 g.
      expect(toMix().mass).toBe('about 38.3 g');
      // 120 × 45 mm = 5400 mm² = 54 cm².
      expect(textOf('.breakdown')).toBe(
        '54 cm² of surface gives 32.4 mL; less 0 mL for rocks and banks is 32.4 mL; plus 10 % for the cup and stick.',
      );
    });

    it('should pour it in one layer', () => {
      // ceil(6 / 50) = 1 layer (common practice: never thicker than the maximum layer).
      expect(result('layers')).toBe('1 layer of 6 mm');
      expect(query('bt-layer-diagram svg')?.getAttribute('aria-label')).toBe(
        'Side view: 1 layer filling 6 mm of depth',
      );
      expect(queryAll('bt-layer-diagram rect.layer').length).toBe(1);
    });

    it('should give part A and part B to weigh to the 0.1 g of the scale', () => {
      // Worked by hand, 2:1 by volume: A = 35.64 × 2/3 = 23.76 mL, × 1.12 g/mL = 26.61 g -> 26.6 g;
      // B = 35.64 × 1/3 = 11.88 mL, × 0.98 g/mL = 11.64 g -> 11.6 g; the cup marks are 1 mL: 24 mL and 12 mL.
      expect(row('part-a')).toEqual(['Part A', '26.6 g', '24 mL']);
      expect(row('part-b')).toEqual(['Part B', '11.6 g', '12 mL']);
      expect(textOf('.mix mat-card-subtitle')).toBe('2 : 1 by volume');
      expect(query('[data-result="mix-total"]')).toBeNull();
    });

    it('should show no warning', () => {
      // 11.6 g is far above 20 steps of 0.1 g; 11.6 / 26.6 is 0.3 % off 11.64 / 26.61; 20 °C is above 18 °C.
      expect(query('[data-warning]')).toBeNull();
      expect(query('bt-pour-plan-sheet .invalid')).toBeNull();
    });
  });

  describe('layers', () => {
    beforeEach(render);

    it('should split 120 mm into 3 layers of 40 mm', async () => {
      await type('depth', '120');

      // ceil(120 / 50) = ceil(2.4) = 3 layers of 120 / 3 = 40 mm (common practice).
      expect(result('layers')).toBe('3 layers of 40 mm');
      expect(queryAll('bt-layer-diagram rect.layer').length).toBe(3);
      expect(query('bt-layer-diagram svg')?.getAttribute('aria-label')).toBe(
        'Side view: 3 layers filling 120 mm of depth',
      );
      // 120 × 45 × 120 mm = 648 mL (NIST SP 811), × 1.1 = 712.8 mL, / 3 = 237.6 mL a layer.
      expect(toMix().volume).toBe('713 mL');
      expect(textOf('[data-result="layers"] + mat-card-subtitle')).toBe(
        '238 mL each; this material allows 50 mm at most',
      );
    });

    it('should give the amounts for each layer and for all of them', async () => {
      await type('depth', '120');

      // Per layer 237.6 mL: A = 158.4 mL × 1.12 = 177.41 g -> 177.4 g, B = 79.2 mL × 0.98 = 77.62 g -> 77.6 g;
      // all 3 layers: 3 × 177.4 = 532.2 g and 3 × 77.6 = 232.8 g.
      expect(row('part-a')).toEqual(['Part A', '177.4 g', '158 mL']);
      expect(row('part-b')).toEqual(['Part B', '77.6 g', '79 mL']);
      expect(result('mix-total')).toBe('All 3 layers: part A 532.2 g and part B 232.8 g');
    });

    it('should put each layer on at the earliest recoat time of the one before', async () => {
      await type('depth', '120');

      // Recoat 24 h × 2^((25 - 20) / 10) = 33.94 h (10-degree rule, common practice); layer 3 goes on at
      // 2 × 33.94 = 67.88 h, about 2 d 20 h; demould 72 h × 1.414 = 101.8 h after that, 169.7 h: about 7 d 2 h.
      const layers = queryAll('.milestones li:not([data-result])');
      expect(layers.length).toBe(3);
      expect(layers[2]?.textContent).toContain('(+2 d 20 h)');
      expect(result('demould')).toContain('(+7 d 2 h)');
    });

    it('should pour a depth of exactly two maximum layers in two layers, not three', async () => {
      await type('depth', '100');

      // 100 / 50 = 2 exactly, so 2 layers of 50 mm (common practice: a layer may be as thick as the maximum).
      expect(result('layers')).toBe('2 layers of 50 mm');
      expect(query('[data-warning="layer-too-thick"]')).toBeNull();
    });
  });

  describe('values that make no sense', () => {
    beforeEach(render);

    it('should refuse a negative depth in plain words and give no numbers', async () => {
      await type('depth', '-3');

      expect(hintOf('depth')).toBe('Depth must be more than 0 mm');
      expect(textOf('bt-pour-plan-sheet .invalid mat-card-title')).toBe('No plan yet');
      expect(listedProblems()).toEqual(['Depth must be more than 0 mm']);
      expect(query('[data-result]')).toBeNull();
      expect(query('[data-warning]')).toBeNull();
    });

    it('should refuse a density of 0 and open the data-sheet values to show where', async () => {
      await type('densityA', '0');

      expect(hintOf('densityA')).toBe('Part A density must be more than 0 g/mL');
      expect(listedProblems()).toEqual(['Part A density must be more than 0 g/mL']);
      expect(query('[data-result]')).toBeNull();
      expect(await (await loader.getHarness(MatExpansionPanelHarness)).isExpanded()).toBeTrue();
    });

    it('should say so when a field cannot be read as a number', async () => {
      await type('depth', 'abc');

      expect(hintOf('depth')).toBe('Depth must be a number');
      expect(listedProblems()).toEqual(['Depth must be a number']);
      expect(query('[data-result]')).toBeNull();
    });

    it('should keep the data-sheet values folded away while every value makes sense', async () => {
      expect(await (await loader.getHarness(MatExpansionPanelHarness)).isExpanded()).toBeFalse();
    });

    it('should list every problem at once', async () => {
      await type('depth', '0');
      await type('roomTemp', '90');

      expect(listedProblems()).toEqual([
        'Depth must be more than 0 mm',
        'Room temperature must be between -30 and 60 °C',
      ]);
    });

    it('should show the plan again once the value is put right', async () => {
      await type('depth', '-3');
      await type('depth', '6');

      expect(hintOf('depth')).toBe('');
      expect(query('bt-pour-plan-sheet .invalid')).toBeNull();
      expect(toMix().volume).toBe('35.6 mL');
    });
  });

  describe('typing numbers', () => {
    beforeEach(render);

    it('should take a comma as the decimal point', async () => {
      await type('depth', '6,5');

      // 120 × 45 × 6.5 mm = 35 100 mm³ = 35.1 mL (NIST SP 811), × 1.1 = 38.61 mL.
      expect(result('layers')).toBe('1 layer of 6.5 mm');
      expect(toMix().volume).toBe('38.6 mL');
    });

    it('should take rocks and banks off before adding the extra', async () => {
      await type('displaced', '2.4');

      // 32.4 - 2.4 = 30 mL, × 1.1 = 33 mL.
      expect(toMix().volume).toBe('33 mL');
    });

    it('should mix the exact net volume when the extra is left empty', async () => {
      await type('waste', '');

      // 32.4 mL with nothing added.
      expect(toMix().volume).toBe('32.4 mL');
    });
  });

  describe('shapes', () => {
    beforeEach(render);

    it('should start as a rectangle', async () => {
      const shapes = await loader.getHarness(MatChipListboxHarness);
      const selected = await shapes.getChips({ selected: true });

      expect(await Promise.all(selected.map((chip) => chip.getText()))).toEqual(['Rectangle']);
    });

    it('should work out a circle from its diameter', async () => {
      await chooseShape('Circle');
      await type('diameter', '100');

      // pi r² (CRC Standard Mathematical Tables, the circle): pi × 50² = 7854 mm² = 78.5 cm²;
      // × 6 mm = 47 124 mm³ = 47.1 mL (NIST SP 811); × 1.1 = 51.84 mL.
      expect(query('[data-field="length"]')).toBeNull();
      expect(suffixOf('diameter')).toBe('mm');
      expect(textOf('.breakdown')).toContain('78.5 cm² of surface gives 47.1 mL');
      expect(toMix().volume).toBe('51.8 mL');
    });

    it('should ask for the diameter before giving a plan', async () => {
      await chooseShape('Circle');

      expect(query('[data-result]')).toBeNull();
      expect(hintOf('diameter')).toBe('Diameter must be a number');
    });

    it('should work out a traced outline with the shoelace formula', async () => {
      await chooseShape('Traced outline');
      await type('outline', '3, 4\n5, 11\n12, 8\n9, 5\n5, 6');
      await type('depth', '10');

      // Shoelace formula, the five-point worked example of Wikipedia's "Shoelace formula" article, by hand:
      // 2A = |(3·11 - 5·4) + (5·8 - 12·11) + (12·5 - 9·8) + (9·6 - 5·5) + (5·4 - 3·6)|
      //    = |13 - 92 - 12 + 29 + 2| = 60, so A = 30 mm² = 0.3 cm²; × 10 mm = 300 mm³ = 0.3 mL (NIST SP 811);
      // × 1.1 = 0.33 mL, shown to 0.1 mL; 0.33 mL × 1.0733 g/mL = 0.354 g tells it from 0.3 mL (0.322 g).
      expect(textOf('.breakdown')).toContain('0.3 cm² of surface gives 0.3 mL');
      expect(toMix().volume).toBe('0.3 mL');
      expect(toMix().mass).toBe('about 0.35 g');
    });

    it('should warn that so small an outline is too little to weigh', async () => {
      await chooseShape('Traced outline');
      await type('outline', '3, 4\n5, 11\n12, 8\n9, 5\n5, 6');
      await type('depth', '10');

      // Part B is 0.11 mL × 0.98 = 0.108 g, less than 20 steps of 0.1 g (common practice, shared/mix.ts).
      expect(query('[data-warning="batch-too-small"]')).not.toBeNull();
    });

    it('should explain an outline whose points lie on one line', async () => {
      await chooseShape('Traced outline');
      await type('outline', '0, 0\n10, 10\n20, 20');

      expect(hintOf('outline')).toBe('The traced outline has no area: its points lie on one line');
      expect(query('[data-result]')).toBeNull();
    });

    it('should take a surface area in cm²', async () => {
      await chooseShape('Area I know');
      await type('area', '54');

      // 54 cm² = 5400 mm², the same as the default rectangle: 35.6 mL.
      expect(suffixOf('area')).toBe('cm²');
      expect(toMix().volume).toBe('35.6 mL');
    });
  });

  describe('the cure estimate', () => {
    beforeEach(render);

    it('should correct the data-sheet times for a room colder than the data sheet', () => {
      // 10-degree rule (common practice): 2^((25 - 20) / 10) = 2^0.5 = 1.414.
      expect(result('cure-basis')).toBe('Estimate for 20 °C: data-sheet times × 1.41');
      // Demould 72 h × 1.414 = 101.8 h, about 4 d 6 h; full cure 168 h × 1.414 = 237.6 h, about 9 d 22 h.
      expect(result('demould')).toContain('(+4 d 6 h)');
      expect(result('full-cure')).toContain('(+9 d 22 h)');
    });

    it('should use the data-sheet times as they are at the data-sheet temperature', async () => {
      await type('roomTemp', '25');

      // 2^0 = 1: demould 72 h = 3 d.
      expect(result('cure-basis')).toBe('Estimate for 25 °C: data-sheet times × 1');
      expect(result('demould')).toContain('(+3 d)');
    });

    it('should warn below the minimum cure temperature and work the times at the minimum', async () => {
      await type('roomTemp', '10');

      // 10 °C is below 18 °C: times at 18 °C, 2^((25 - 18) / 10) = 2^0.7 = 1.62 (common practice).
      expect(query('[data-warning="below-minimum-temperature"]')).not.toBeNull();
      expect(result('cure-basis')).toBe('Estimate for 18 °C: data-sheet times × 1.62');
    });

    it('should warn of a hot room', async () => {
      await type('roomTemp', '32');

      expect(query('[data-warning="hot-room"]')).not.toBeNull();
      expect(query('[data-warning="below-minimum-temperature"]')).toBeNull();
    });
  });

  describe('materials and cautions', () => {
    beforeEach(render);

    it('should show the two-part cautions for epoxy, then the safety data sheet first', () => {
      const cautions = queryAll('[data-caution]').map((caution) => caution.dataset['caution']);

      expect(cautions).toContain('foam');
      expect(cautions).toContain('gloves');
      expect(cautions).not.toContain('seal');
      expect(textOf('bt-pour-cautions .defer')).toBe(DEFERENCE_NOTE);
      expect(textOf('bt-pour-cautions .defer')).toBe("The maker's safety data sheet and your local rules come first.");
    });

    it('should say the preset values are typical and to be checked', () => {
      expect(textOf('mat-hint.typical')).toBe('Typical values, check your data sheet and type in its numbers below');
    });

    describe('with a single-part medium', () => {
      beforeEach(() => choosePreset('Acrylic gloss medium (single part)'));

      it('should fill in the medium from the preset', () => {
        expect(field('partA').value).toBe('1');
        expect(field('partB').value).toBe('');
        expect(field('densityA').value).toBe('1.06');
        expect(field('maxLayer').value).toBe('3');
        expect(field('recoatMax').value).toBe('');
        expect(query('[data-field="densityB"]')).toBeNull();
      });

      it('should give one amount of medium and no part B', () => {
        // ceil(6 / 3) = 2 layers of 3 mm; 35.64 / 2 = 17.82 mL a layer, × 1.06 g/mL = 18.89 g -> 18.9 g;
        // both layers 2 × 18.9 = 37.8 g.
        expect(result('layers')).toBe('2 layers of 3 mm');
        expect(row('part-a')).toEqual(['Medium', '18.9 g', '18 mL']);
        expect(query('[data-result="part-b"]')).toBeNull();
        expect(textOf('.mix mat-card-subtitle')).toBe('single part');
        expect(result('mix-total')).toBe('All 2 layers: 37.8 g');
      });

      it('should work the times from its own data-sheet temperature', () => {
        // 2^((21 - 20) / 10) = 2^0.1 = 1.072 (common practice).
        expect(result('cure-basis')).toBe('Estimate for 20 °C: data-sheet times × 1.07');
      });

      it('should show the water-based cautions instead of the epoxy ones', () => {
        const cautions = queryAll('[data-caution]').map((caution) => caution.dataset['caution']);

        expect(cautions).toContain('seal');
        expect(cautions).not.toContain('foam');
        expect(textOf('bt-pour-cautions .defer')).toBe(DEFERENCE_NOTE);
      });
    });

    it('should weigh by weight for a ratio given by weight', async () => {
      await choosePreset('Casting epoxy, 100:45 by weight');

      // 35.64 mL; ceil(6 / 12) = 1 layer. By weight, 1 g of mix takes (100/145) / 1.16 + (45/145) / 0.96
      // = 0.5945 + 0.3233 = 0.9178 mL, so 35.64 mL weighs 35.64 / 0.9178 = 38.83 g:
      // A = 38.83 × 100/145 = 26.78 g -> 26.8 g, B = 38.83 × 45/145 = 12.05 g -> 12.1 g.
      expect(row('part-a').slice(0, 2)).toEqual(['Part A', '26.8 g']);
      expect(row('part-b').slice(0, 2)).toEqual(['Part B', '12.1 g']);
      expect(textOf('.mix mat-card-subtitle')).toBe('100 : 45 by weight');
    });
  });

  describe('the scale', () => {
    beforeEach(render);

    it('should round to what a scale that reads whole grams can weigh', async () => {
      await chooseScale('1 g');

      // 26.61 g -> 27 g and 11.64 g -> 12 g.
      expect(row('part-a')).toEqual(['Part A', '27 g', '24 mL']);
      expect(row('part-b')).toEqual(['Part B', '12 g', '12 mL']);
    });

    it('should leave the typed numbers as they were', async () => {
      await type('depth', '6,50');
      await type('length', '120.0');

      await chooseScale('0.01 g');

      expect(field('depth').value).toBe('6,50');
      expect(field('length').value).toBe('120.0');
      // 120 × 45 × 6.5 mm = 35.1 mL, × 1.1 = 38.61 mL: A = 25.74 mL × 1.12 = 28.83 g.
      expect(row('part-a').slice(0, 2)).toEqual(['Part A', '28.83 g']);
    });
  });

  describe('units', () => {
    beforeEach(render);

    it('should convert the typed numbers to inches and degrees Fahrenheit', async () => {
      await switchTo(/^in/);

      // 120 / 25.4 = 4.724 in; 45 / 25.4 = 1.772 in; 6 / 25.4 = 0.236 in; 50 / 25.4 = 1.969 in;
      // 20 °C = 68 °F, 25 °C = 77 °F, 18 °C = 64.4 °F (NIST SP 811).
      expect(field('length').value).toBe('4.724');
      expect(field('width').value).toBe('1.772');
      expect(field('depth').value).toBe('0.236');
      expect(field('maxLayer').value).toBe('1.969');
      expect(field('roomTemp').value).toBe('68');
      expect(field('referenceTemp').value).toBe('77');
      expect(field('minCureTemp').value).toBe('64.4');
      expect(suffixOf('length')).toBe('in');
      expect(suffixOf('displaced')).toBe('fl oz');
      expect(suffixOf('roomTemp')).toBe('°F');
    });

    it('should give the plan in fluid ounces and ounces', async () => {
      await switchTo(/^in/);

      // From the converted fields: 4.724 × 1.772 × 0.236 in = 1.9755 in³ = 32.37 mL (1 in = 25.4 mm);
      // × 1.1 = 35.61 mL / 29.5735 = 1.204 fl oz. A = 23.74 mL × 1.12 = 26.59 g -> 26.6 g / 28.3495 = 0.938 oz;
      // B = 11.87 mL × 0.98 = 11.63 g -> 11.6 g / 28.3495 = 0.409 oz; cups 24 mL = 0.81 fl oz, 12 mL = 0.41 fl oz.
      expect(toMix().volume).toBe('1.2 fl oz');
      expect(row('part-a')).toEqual(['Part A', '0.94 oz', '0.81 fl oz']);
      expect(row('part-b')).toEqual(['Part B', '0.41 oz', '0.41 fl oz']);
      // 68 °F is 20 °C and 77 °F is 25 °C: the same 2^0.5.
      expect(result('cure-basis')).toBe('Estimate for 68 °F: data-sheet times × 1.41');
    });

    it('should come back to the same millimetres', async () => {
      await switchTo(/^in/);
      await switchTo(/^mm/);

      // 4.724 × 25.4 = 119.99 mm; 0.236 × 25.4 = 5.994 mm; 68 °F = 20 °C.
      expect(field('length').value).toBe('119.99');
      expect(field('depth').value).toBe('5.994');
      expect(field('roomTemp').value).toBe('20');
    });

    it('should read a preset chosen in imperial in inches', async () => {
      await switchTo(/^in/);
      await choosePreset('Coating epoxy, 1:1 by volume');

      // 6 mm / 25.4 = 0.236 in; 25 °C = 77 °F; 18 °C = 64.4 °F.
      expect(field('maxLayer').value).toBe('0.236');
      expect(field('referenceTemp').value).toBe('77');
      expect(field('minCureTemp').value).toBe('64.4');
    });
  });

  describe('the draft', () => {
    it('should read back the last inputs when the planner opens again', async () => {
      await render();
      await type('depth', '12');

      TestBed.resetTestingModule();
      await render();

      // 120 × 45 × 12 mm = 64.8 mL (NIST SP 811), × 1.1 = 71.28 mL.
      expect(field('depth').value).toBe('12');
      expect(result('layers')).toBe('1 layer of 12 mm');
      expect(toMix().volume).toBe('71.3 mL');
    });

    it('should keep it in local storage with its units', async () => {
      await render();
      await type('depth', '12');

      const stored = JSON.parse(localStorage.getItem(DRAFT_KEY) ?? 'null');

      expect(stored?.value?.depth).toBe('12');
      expect(stored?.units?.length).toBe('mm');
    });

    it('should convert a draft kept in metric when the device has switched to imperial', async () => {
      localStorage.setItem(PREFERENCES_KEY, JSON.stringify({ unitSystem: 'imperial', temperatureUnit: 'F' }));
      localStorage.setItem(
        DRAFT_KEY,
        JSON.stringify({
          units: { length: 'mm', volume: 'mL', mass: 'g', temperature: 'C' },
          value: { depth: '25.4' },
        }),
      );

      await render();

      // 25.4 mm = 1 in (NIST SP 811).
      expect(field('depth').value).toBe('1');
      expect(suffixOf('depth')).toBe('in');
    });

    it('should keep the numbers true when the units change on another screen', async () => {
      await render();
      fixture.destroy();

      TestBed.inject(DevicePreferences).update({ unitSystem: 'imperial', temperatureUnit: 'F' });
      await createPlanner();

      // Same draft, now in inches: 120 / 25.4 = 4.724 in; 20 °C = 68 °F (NIST SP 811).
      expect(field('length').value).toBe('4.724');
      expect(field('roomTemp').value).toBe('68');
      expect(toMix().volume).toBe('1.2 fl oz');
    });

    it('should start from the defaults when the stored draft cannot be read', async () => {
      localStorage.setItem(DRAFT_KEY, '{not json');

      await render();

      expect(field('depth').value).toBe('6');
      expect(toMix().volume).toBe('35.6 mL');
    });
  });
});
