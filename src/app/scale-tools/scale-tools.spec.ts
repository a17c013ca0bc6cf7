import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { ScalePickerHarness } from './scale-picker-testing';
import { ScaleTools } from './scale-tools';

// Scales and gauges used below, and where the numbers come from:
// HO is 1:87.1 on 16.5 mm track, N is 1:160 on 9 mm track (NMRA S-1.2); O (North America) is 1:48 (NMRA S-1.2);
// standard gauge is 1435 mm (UIC); 1 in = 25.4 mm and 1 ft = 304.8 mm (NIST Handbook 44).
// Every other number is a design example, worked by hand from those.

const PREFERENCES_KEY = 'benchtide.device-preferences';
const RATIO_MESSAGE = 'Type N of 1:N, a number above 0 (for example 100 for 1:100)';

describe('ScaleTools', () => {
  let fixture: ComponentFixture<ScaleTools>;
  let loader: HarnessLoader;

  async function render(): Promise<void> {
    TestBed.configureTestingModule({ imports: [ScaleTools] });
    fixture = TestBed.createComponent(ScaleTools);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  function query<T extends Element = HTMLElement>(selector: string): T | null {
    return (fixture.nativeElement as HTMLElement).querySelector<T>(selector);
  }

  function textOf(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function field(name: string): HTMLInputElement {
    const input = query<HTMLInputElement>(`[data-field="${name}"]`);
    if (!input) throw new Error(`No field ${name}`);
    return input;
  }

  /** The unit shown after a field, inside its Material form field. */
  function suffixOf(name: string): string {
    return (field(name).closest('mat-form-field')?.querySelector('[matTextSuffix]')?.textContent ?? '').trim();
  }

  async function type(name: string, text: string): Promise<void> {
    const input = field(name);
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  async function selectIn(label: string): Promise<MatSelectHarness> {
    const formField = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    const select = await formField.getControl(MatSelectHarness);
    if (!select) throw new Error(`No select labelled ${label}`);
    return select;
  }

  async function choose(label: string, option: string): Promise<void> {
    const select = await selectIn(label);
    await select.open();
    await select.clickOptions({ text: option });
    await select.close();
    await fixture.whenStable();
  }

  function picker(label: string): Promise<ScalePickerHarness> {
    return loader.getHarness(ScalePickerHarness.with({ label }));
  }

  async function switchToImperial(): Promise<void> {
    const imperial = await loader.getHarness(MatButtonToggleHarness.with({ text: /^in/ }));
    await imperial.check();
    await fixture.whenStable();
  }

  function baseOf(scaleId: string): string {
    return textOf(`[data-scale="${scaleId}"] .size`);
  }

  beforeEach(() => localStorage.removeItem(PREFERENCES_KEY));
  afterEach(() => localStorage.removeItem(PREFERENCES_KEY));

  describe('real and model lengths', () => {
    beforeEach(render);

    it('should show 10 m real as 114.8 mm on the model at HO', () => {
      // 10 000 mm / 87.1 = 114.81 mm
      expect(field('real-length').value).toBe('10');
      expect(suffixOf('real-length')).toBe('m');
      expect(field('model-length').value).toBe('114.8');
      expect(suffixOf('model-length')).toBe('mm');
    });

    it('should follow the real length as it is typed', async () => {
      await type('real-length', '40');

      // 40 000 mm / 87.1 = 459.24 mm
      expect(field('model-length').value).toBe('459.2');
    });

    it('should work back from the model to the real length', async () => {
      await type('model-length', '100');

      // 100 mm x 87.1 = 8710 mm
      expect(field('real-length').value).toBe('8.71');
      expect(field('model-length').value).toBe('100');
    });

    it('should keep the typed text until the field is left', async () => {
      await type('model-length', '100.0');

      expect(field('model-length').value).toBe('100.0');

      field('model-length').dispatchEvent(new Event('blur'));
      await fixture.whenStable();

      expect(field('model-length').value).toBe('100');
      expect(field('real-length').value).toBe('8.71');
    });

    it('should say so in plain words when the length cannot be read', async () => {
      await type('real-length', 'abc');

      expect(textOf('mat-card [role="alert"]')).toBe('Type a length of 0 or more');
      expect(field('model-length').value).toBe('');
    });
  });

  describe('choosing the scale', () => {
    beforeEach(render);

    it('should start at HO and name its source', async () => {
      const scale = await picker('Scale');

      expect(await scale.getScaleText()).toBe('HO · 1:87.1');
      expect(await scale.getHint()).toBe('Source: NMRA S-1.2');
    });

    it('should convert at the scale picked from the list', async () => {
      await (await picker('Scale')).chooseScale('N · 1:160');

      // 10 000 mm / 160 = 62.5 mm
      expect(field('model-length').value).toBe('62.5');
      expect(textOf('[data-result="figure"] .result-value')).toBe('10.9 mm');
    });

    it('should not show the ratio field for a standard scale', async () => {
      expect(await loader.getAllHarnesses(MatFormFieldHarness.with({ floatingLabelText: 'N of 1:N' }))).toEqual([]);
    });

    describe('with Other 1:N…', () => {
      let scale: ScalePickerHarness;

      beforeEach(async () => {
        scale = await picker('Scale');
        await scale.chooseScale('Other 1:N…');
      });

      it('should show the ratio field, starting from the scale before', async () => {
        expect(await scale.getRatio()).toBe('87.1');
        expect(await scale.getHint()).toBe('Your own ratio');
      });

      it('should convert at the typed ratio', async () => {
        await scale.setRatio('100');

        // 10 000 mm / 100 = 100 mm
        expect(field('model-length').value).toBe('100');
        expect(textOf('mat-card:nth-of-type(2) mat-card-title')).toBe('Figures and track at 1:100');
      });

      for (const invalid of ['0', 'abc']) {
        it(`should explain "${invalid}" in plain words and give no number`, async () => {
          await scale.setRatio(invalid);

          expect(await scale.getRatioError()).toBe(RATIO_MESSAGE);
          expect(field('model-length').value).toBe('');
          expect(field('real-length').value).toBe('10');
          expect(textOf('[data-result="figure"] .result-value')).toBe('—');
          expect(textOf('[data-result="gauge"] .result-value')).toBe('—');
        });
      }

      it('should give numbers again once the ratio can be read', async () => {
        await scale.setRatio('0');
        await scale.setRatio('50');

        // 10 000 mm / 50 = 200 mm; 1750 mm / 50 = 35 mm
        expect(await scale.getRatioError()).toBeNull();
        expect(field('model-length').value).toBe('200');
        expect(textOf('[data-result="figure"] .result-value')).toBe('35 mm');
      });
    });
  });

  describe('one scene at several scales', () => {
    beforeEach(render);

    it('should start from a 40 m by 12 m scene', () => {
      expect(field('real-width').value).toBe('40');
      expect(field('real-depth').value).toBe('12');
    });

    it('should give the base at each chosen scale', () => {
      // 40 000 and 12 000 mm divided by 160, 87.1, 48 and 35
      expect(baseOf('n')).toBe('250 mm × 75 mm');
      expect(baseOf('ho')).toBe('459 mm × 138 mm');
      expect(baseOf('o-na')).toBe('833 mm × 250 mm');
      expect(baseOf('fig-35')).toBe('1143 mm × 343 mm');
    });

    it('should list the scales from the largest model to the smallest', () => {
      const rows = Array.from(fixture.nativeElement.querySelectorAll('tr[data-scale]') as NodeListOf<HTMLElement>);

      expect(rows.map((row) => row.dataset['scale'])).toEqual(['fig-35', 'o-na', 'ho', 'n']);
    });

    it('should draw one base per chosen scale, the widest at 1:35', () => {
      const rects = Array.from(
        fixture.nativeElement.querySelectorAll('svg.drawing rect') as NodeListOf<SVGRectElement>,
      );
      const widthOf = (rect: SVGRectElement) => Number(rect.getAttribute('width'));
      const labelOf = (rect: SVGRectElement) => rect.nextElementSibling?.textContent?.trim();
      const widest = rects.reduce((best, rect) => (widthOf(rect) > widthOf(best) ? rect : best));
      const nRect = rects.find((rect) => labelOf(rect) === 'N');

      expect(rects.length).toBe(4);
      expect(labelOf(widest)).toBe('1:35');
      // Same drawing scale for all: 1:35 is 160 / 35 = 4.571 times as wide as N.
      expect(widthOf(widest) / widthOf(nRect!)).toBeCloseTo(4.571, 3);
    });

    it('should follow a new real width', async () => {
      await type('real-width', '80');

      // 80 000 mm / 160 = 500 mm
      expect(baseOf('n')).toBe('500 mm × 75 mm');
    });

    it('should drop a scale taken out of the comparison', async () => {
      await choose('Scales to compare', 'N · 1:160');

      expect(query('[data-scale="n"]')).toBeNull();
      expect(fixture.nativeElement.querySelectorAll('tr[data-scale]').length).toBe(3);
      expect(fixture.nativeElement.querySelectorAll('svg.drawing rect').length).toBe(3);
    });

    it('should ask for a size above 0 and draw nothing without one', async () => {
      await type('real-depth', '0');

      expect(textOf('bt-footprint-comparison [role="alert"]')).toBe('Type a depth above 0');
      expect(query('tr[data-scale]')).toBeNull();
      expect(query('svg.drawing')).toBeNull();
    });
  });

  describe('figures and track', () => {
    beforeEach(render);

    it('should give a 1.75 m person as 20.1 mm at HO', () => {
      // 1750 mm / 87.1 = 20.09 mm
      expect(field('figure-height').value).toBe('1.75');
      expect(textOf('[data-result="figure"] .result-value')).toBe('20.1 mm');
    });

    it('should follow a new real height', async () => {
      await type('figure-height', '1.8');

      // 1800 mm / 87.1 = 20.67 mm
      expect(textOf('[data-result="figure"] .result-value')).toBe('20.7 mm');
    });

    it('should give standard gauge at HO true to scale, and the track made for HO', () => {
      // 1435 mm / 87.1 = 16.48 mm; HO track is 16.5 mm by NMRA S-1.2
      expect(textOf('[data-result="gauge"] .result-value')).toBe('16.5 mm');
      expect(textOf('[data-result="gauge"] .result-note')).toBe('The track made for HO is 16.5 mm');
      expect(textOf('mat-card:nth-of-type(2) mat-card-title')).toBe('Figures and track at HO');
    });

    it('should give another prototype gauge without the standard-gauge track note', async () => {
      await choose('Real track gauge', 'Metre gauge');

      // 1000 mm / 87.1 = 11.48 mm
      expect(textOf('[data-result="gauge"] .result-value')).toBe('11.5 mm');
      expect(query('[data-result="gauge"] .result-note')).toBeNull();
    });

    it('should name the track made for the chosen scale', async () => {
      await (await picker('Scale')).chooseScale('N · 1:160');

      // 1435 mm / 160 = 8.97 mm; N track is 9 mm by NMRA S-1.2
      expect(textOf('[data-result="gauge"] .result-value')).toBe('8.97 mm');
      expect(textOf('[data-result="gauge"] .result-note')).toBe('The track made for N is 9 mm');
    });
  });

  describe('how much bigger', () => {
    beforeEach(render);

    function factors(): string[] {
      const strong = fixture.nativeElement.querySelectorAll('[data-result="comparison"] strong') as NodeListOf<Element>;
      return Array.from(strong).map((element) => element.textContent?.trim() ?? '');
    }

    it('should compare 1:35 with N by length and by volume', () => {
      // 160 / 35 = 4.571; 4.571 cubed = 95.52
      expect(factors()).toEqual(['4.57×', '95.5×']);
      expect(textOf('[data-result="comparison"]')).toContain('A 1:35 model is 4.57× as long as the same thing at N');
    });

    it('should follow a change of the smaller scale', async () => {
      await (await picker('Smaller scale')).chooseScale('HO · 1:87.1');

      // 87.1 / 35 = 2.489; 2.489 cubed = 15.41
      expect(factors()).toEqual(['2.49×', '15.4×']);
    });

    it('should compare with a typed ratio, and not at all while it cannot be read', async () => {
      const larger = await picker('Larger scale');
      await larger.chooseScale('Other 1:N…');

      await larger.setRatio('0');

      expect(query('[data-result="comparison"]')).toBeNull();

      await larger.setRatio('80');

      // 160 / 80 = 2; 2 cubed = 8
      expect(factors()).toEqual(['2×', '8×']);
    });
  });

  describe('units', () => {
    it('should show feet and inches after switching to imperial', async () => {
      await render();

      await switchToImperial();

      // 10 000 mm = 32.81 ft; 114.81 mm = 4.520 in; 20.09 mm = 0.791 in; 250 mm = 9.84 in, 75 mm = 2.95 in
      expect(suffixOf('real-length')).toBe('ft');
      expect(suffixOf('model-length')).toBe('in');
      expect(field('real-length').value).toBe('32.81');
      expect(field('model-length').value).toBe('4.52');
      expect(textOf('[data-result="figure"] .result-value')).toBe('0.791 in');
      expect(baseOf('n')).toBe('9.84 in × 2.95 in');
    });

    it('should keep the real scene and person the same size in the new units', async () => {
      await render();

      await switchToImperial();

      // 40 000 mm = 131.23 ft; 12 000 mm = 39.37 ft; 1750 mm = 5.741 ft
      expect(field('real-width').value).toBe('131.2');
      expect(field('real-depth').value).toBe('39.37');
      expect(suffixOf('real-width')).toBe('ft');
      expect(field('figure-height').value).toBe('5.741');
      expect(suffixOf('figure-height')).toBe('ft');
    });

    it('should read typed lengths in the new units', async () => {
      await render();
      await switchToImperial();

      await type('real-length', '10');
      await type('real-width', '100');
      await type('figure-height', '6');

      // 10 ft = 3048 mm, / 87.1 = 34.99 mm = 1.378 in; 100 ft = 30 480 mm, / 160 = 190.5 mm = 7.5 in;
      // 6 ft = 1828.8 mm, / 87.1 = 21.0 mm = 0.827 in
      expect(field('model-length').value).toBe('1.378');
      expect(baseOf('n')).toBe('7.5 in × 2.95 in');
      expect(textOf('[data-result="figure"] .result-value')).toBe('0.827 in');
    });

    it('should remember imperial on this device', async () => {
      await render();
      await switchToImperial();

      expect(JSON.parse(localStorage.getItem(PREFERENCES_KEY) ?? '{}').unitSystem).toBe('imperial');
    });

    it('should open in the units remembered on this device', async () => {
      localStorage.setItem(PREFERENCES_KEY, JSON.stringify({ unitSystem: 'imperial' }));

      await render();

      expect(suffixOf('real-length')).toBe('ft');
      expect(field('real-length').value).toBe('32.81');
    });
  });
});
