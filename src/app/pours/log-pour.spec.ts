import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { provideRouter, Router } from '@angular/router';
import { planPour, type MaterialDataSheet, type Role, type SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BenchIcons } from '../core/bench-icons';
import { BENCH_DB_NAME, BenchDb } from '../sync/bench-db';
import { dropDatabase, until } from '../sync/sync-testing';
import type {
  LocalBuild,
  LocalContainer,
  LocalLedgerEntry,
  LocalMaterial,
  LocalPour,
  SyncedFields,
} from '../sync/synced-records';
import { LogPour } from './log-pour';

// Where the numbers below come from: 1 mL = 1000 mm³ (NIST SP 811); mass = volume × density (definition of
// density); a share of a container costs its price × the share of its size (common practice); layers are
// ceil(depth / maximum layer) (common practice). The data sheet is invented, no maker's figures: 1 : 1 by
// weight, both parts 1 g/mL, at most 10 mm a layer, times at 20 °C, the room the screen assumes (20 °C), so
// the times stand as printed. The shelf holds 500 g of part A bought for EUR 40.00 and 500 g of part B for
// EUR 30.00.

const SESSION_KEY = 'benchtide.session';
const WORKSHOP_ID = v7();

const DATA_SHEET: MaterialDataSheet = {
  mixRatio: { basis: 'weight', partA: 1, partB: 1 },
  densityAGPerMl: 1,
  densityBGPerMl: 1,
  potLifeMin: 40,
  recoatMin: 360,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 10,
};

function signIn(role: Role): void {
  const session: SessionView = {
    account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
    workshops: [{ id: WORKSHOP_ID, name: 'River Club', personal: false, role, memberCount: 2 }],
  };
  localStorage.setItem(SESSION_KEY, JSON.stringify(session));
}

/** The fields every record has, as the server sends them. */
function synced(at = '2025-03-01T09:00:00.000Z'): Omit<SyncedFields, 'id'> {
  return { workshopId: WORKSHOP_ID, createdAt: at, updatedAt: at, deletedAt: null, changeNumber: 1 };
}

function euros(amount: number): string {
  return new Intl.NumberFormat(undefined, { style: 'currency', currency: 'EUR' }).format(amount);
}

describe('LogPour', () => {
  let fixture: ComponentFixture<LogPour>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let navigate: jasmine.Spy;
  let harbour: LocalBuild;
  let resin: LocalMaterial;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      imports: [LogPour],
      providers: [
        { provide: BENCH_DB_NAME, useValue: `log-pour-spec-${v7()}` },
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    db = TestBed.inject(BenchDb);
    navigate = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
  });
  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function arrangeShelf(): Promise<void> {
    const canal: LocalBuild = {
      id: v7(),
      ...synced('2025-02-01T09:00:00.000Z'),
      name: 'Canal lock',
      scaleRatio: 76,
      status: 'building',
      notes: '',
    };
    harbour = { id: v7(), ...synced(), name: 'Harbour diorama', scaleRatio: 87, status: 'building', notes: '' };
    resin = {
      id: v7(),
      ...synced(),
      name: 'Clear casting resin',
      kind: 'two-part-epoxy',
      dataSheet: DATA_SHEET,
      measure: null,
      shelfLifeOpenedDays: null,
      safetySheet: '',
    };
    await db.builds.bulkPut([canal, harbour]);
    await db.materials.put(resin);
    await putContainer('A', '2025-02-01', 4000);
    await putContainer('B', '2025-02-03', 3000);
  }

  /** A full container of one part, with its purchase in the stock book. */
  async function putContainer(part: 'A' | 'B', boughtOn: string, priceMinor: number): Promise<void> {
    const container: LocalContainer = {
      id: v7(),
      ...synced(),
      materialId: resin.id,
      part,
      sizeQty: 500,
      unit: 'g',
      priceMinor,
      currency: 'EUR',
      boughtOn,
      openedOn: null,
      useBy: null,
      lowStockQty: null,
      lot: null,
    };
    const purchase: LocalLedgerEntry = {
      id: container.id,
      ...synced(),
      containerId: container.id,
      kind: 'purchase',
      quantity: 500,
      costMinor: priceMinor,
      at: `${boughtOn}T12:00:00Z`,
      pourId: null,
      note: '',
    };
    await db.containers.put(container);
    await db.ledgerEntries.put(purchase);
  }

  /** Yesterday's pour of the mill pond: 100 × 50 mm, 4 mm deep, in a 22 °C room. */
  async function putEarlierPour(): Promise<void> {
    const startAt = new Date(Date.now() - 24 * 3_600_000).toISOString();
    const result = planPour({
      shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
      depthMm: 4,
      wastePercent: 10,
      material: DATA_SHEET,
      roomTempC: 22,
      startAtMs: Date.parse(startAt),
      scaleResolutionG: 0.1,
    });
    if (!result.ok) throw new Error('The earlier pour must plan');
    const { request, ...plan } = result.plan;
    const pour: LocalPour = {
      id: v7(),
      ...synced(startAt),
      buildId: harbour.id,
      stepId: null,
      materialId: resin.id,
      startAt,
      request,
      plan,
      shortfall: [],
      note: 'Mill pond',
      layerCount: plan.layers.count,
    };
    await db.pours.put(pour);
  }

  /** Waits until the builds, the material and its containers have come from the device's records. */
  async function render(ready: () => unknown = () => query('.containers mat-chip-option')): Promise<void> {
    fixture = TestBed.createComponent(LogPour);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await settle('the form', ready);
  }

  async function settle(what: string, check: () => unknown): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function queryAll(selector: string): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>(selector));
  }

  function textOf(selector: string | Element | null): string {
    const element = typeof selector === 'string' ? query(selector) : selector;
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function field(name: string): HTMLInputElement {
    const input = query(`[data-field="${name}"]`) as HTMLInputElement | null;
    if (!input) throw new Error(`No field ${name}`);
    return input;
  }

  /** The message under a field. */
  function hintOf(name: string): string {
    return textOf(field(name).closest('mat-form-field')?.querySelector('mat-hint') ?? null);
  }

  async function type(name: string, text: string): Promise<void> {
    const input = field(name);
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  async function typeFeature(lengthMm: string, widthMm: string, depthMm: string): Promise<void> {
    await type('length', lengthMm);
    await type('width', widthMm);
    await type('depth', depthMm);
  }

  async function press(label: string | RegExp): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: label }))).click();
    await fixture.whenStable();
  }

  async function chosen(name: 'build' | 'material'): Promise<string> {
    const select = await loader.getHarness(MatSelectHarness.with({ selector: `[data-field="${name}"]` }));
    return select.getValueText();
  }

  function takes(): string[] {
    return queryAll('ul[aria-label="What this pour takes"] li').map((item) => textOf(item));
  }

  function containers(): string[] {
    return queryAll('.containers mat-chip-option').map((chip) => textOf(chip));
  }

  /** Waits for the containers to show what the pour drew from them, as this device's stock book has it. */
  async function shelfShows(left: readonly string[]): Promise<void> {
    const wanted = JSON.stringify(left);
    await settle('the stock drawn', () => JSON.stringify(containers()) === wanted);
  }

  async function logged(count: number): Promise<LocalPour[]> {
    await until(() => navigate.calls.count() > 0, 'the way back to the bench');
    const pours = await db.pours.toArray();
    expect(pours.length).toBe(count);
    return pours.sort((a, b) => a.startAt.localeCompare(b.startAt));
  }

  describe('with the shelf stocked', () => {
    beforeEach(async () => {
      signIn('builder');
      await arrangeShelf();
    });

    describe('what it chooses first', () => {
      beforeEach(() => render());

      it('should choose the build worked on last and the material on the shelf', async () => {
        expect(await chosen('build')).toBe('Harbour diorama');
        expect(await chosen('material')).toBe('Clear casting resin');
        // The room a house usually has (common practice), to be changed at the bench.
        expect(field('roomTemp').value).toBe('20');
      });

      it('should offer no repeat before the first pour', () => {
        expect(query('.repeat')).toBeNull();
      });
    });

    describe('the plan as it is typed', () => {
      beforeEach(() => render());

      it('should show no plan before the feature is typed', () => {
        expect(query('[data-result="to-mix"]')).toBeNull();
        expect(query('ul[aria-label="What this pour takes"]')).toBeNull();
      });

      it('should show the plan, what it takes from the shelf and what it costs', async () => {
        await typeFeature('100', '50', '4');

        // Worked by hand: 100 × 50 × 4 mm = 20 000 mm³ = 20 mL, plus the 10 % for cup and stick = 22 mL, in one
        // layer (4 mm is under the 10 mm maximum). 1 : 1 by weight at 1 g/mL: 22 g, 11 g of each part.
        expect(textOf('[data-result="to-mix"] .value')).toBe('22 mL');
        expect(textOf('[data-result="layers"]')).toBe('1 layer of 4 mm');
        expect(takes()).toEqual([
          'Part A: 11 g from the container bought 1 Feb 2025',
          'Part B: 11 g from the container bought 3 Feb 2025',
        ]);
        // 11 g of 500 g at EUR 40.00 is EUR 0.88; 11 g of 500 g at EUR 30.00 is EUR 0.66: EUR 1.54 in all.
        expect(textOf('.cost')).toBe(`This pour costs ${euros(1.54)} in material.`);
        expect(query('.short')).toBeNull();
      });

      it('should start the pour and go back to the bench', async () => {
        await typeFeature('100', '50', '4');
        await type('note', 'Harbour basin');

        await press('Start pour');

        const [pour] = await logged(1);
        expect(navigate).toHaveBeenCalledOnceWith('/');
        expect(pour?.buildId).toBe(harbour.id);
        expect(pour?.materialId).toBe(resin.id);
        expect(pour?.note).toBe('Harbour basin');
        expect(pour?.request.depthMm).toBe(4);
        // The 11 g of each part is drawn from the shelf at once, offline: 500 - 11 = 489 g left in each.
        await shelfShows(['Part A · bought 1 Feb 2025 · 489 g left', 'Part B · bought 3 Feb 2025 · 489 g left']);
      });
    });

    describe('the number of layers', () => {
      beforeEach(() => render());

      it('should start at the fewest the maximum layer allows and say why', async () => {
        await typeFeature('100', '50', '25');

        // ceil(25 / 10) = 3 layers (common practice: never thicker than the maximum layer).
        expect(field('layerCount').value).toBe('3');
        expect(hintOf('layerCount')).toBe(
          'At least 3 for 25 mm at most 10 mm a layer; more for thin detail or tinted layers.',
        );
      });

      it('should log the pour with the layers chosen, each thinner', async () => {
        await typeFeature('100', '50', '25');
        await type('layerCount', '5');

        // Worked by hand: 25 mm in 5 layers is 5 mm a layer.
        expect(textOf('[data-result="layers"]')).toBe('5 layers of 5 mm');
        await press('Start pour');

        const [pour] = await logged(1);
        expect(pour?.layerCount).toBe(5);
        expect(pour?.plan.layers.count).toBe(5);
        const [first] = await db.pourLayers.where({ pourId: pour!.id }).toArray();
        expect(first?.number).toBe(1);
        expect(first?.depthMm).toBe(5);
      });

      it('should refuse fewer layers than the maximum layer allows, and save nothing', async () => {
        await typeFeature('100', '50', '25');
        await type('layerCount', '2');

        expect(hintOf('layerCount')).toBe(
          'At least 3 layers: 25 mm at most 10 mm a layer. Thicker layers can overheat, crack or yellow.',
        );
        await press('Start pour');
        expect(await db.pours.count()).toBe(0);
        expect(navigate).not.toHaveBeenCalled();
      });

      it('should refuse more than 50 layers', async () => {
        await typeFeature('100', '50', '25');
        await type('layerCount', '51');

        expect(hintOf('layerCount')).toBe('A pour can have at most 50 layers');
      });
    });

    describe('repeating the last pour', () => {
      beforeEach(async () => {
        await putEarlierPour();
        await render(() => query('.repeat') && query('.containers mat-chip-option'));
      });

      it('should say what the last pour was', () => {
        // 22 mL at 1 g/mL is 22 g mixed (worked example above).
        expect(textOf('.repeat-title')).toBe('Repeat the last pour');
        expect(textOf('.repeat-what')).toBe('Mill pond · Clear casting resin, 22 g mixed');
      });

      it('should log the same pour again in two taps', async () => {
        let taps = 0;
        const tap = async (label: string | RegExp) => {
          taps += 1;
          await press(label);
        };

        await tap(/Repeat the last pour/);
        expect(field('length').value).toBe('100');
        expect(field('width').value).toBe('50');
        expect(field('depth').value).toBe('4');
        expect(field('roomTemp').value).toBe('22');
        expect(field('note').value).toBe('Mill pond');
        await tap('Start pour');

        expect(taps).toBe(2);
        const [, again] = await logged(2);
        expect(again?.request.depthMm).toBe(4);
        expect(again?.request.roomTempC).toBe(22);
        expect(again?.note).toBe('Mill pond');
        expect(again?.buildId).toBe(harbour.id);
        expect((await db.outbox.toArray()).map((row) => row.mutation.type)).toEqual(['pour.create']);
        await shelfShows(['Part A · bought 1 Feb 2025 · 489 g left', 'Part B · bought 3 Feb 2025 · 489 g left']);
      });
    });

    describe('a pour larger than the shelf', () => {
      beforeEach(async () => {
        await render();
        // Worked by hand: 400 × 250 × 10 mm = 1 000 000 mm³ = 1000 mL, plus 10 % = 1100 mL in one 10 mm layer;
        // 550 g of each part at 1 g/mL, against 500 g of each on the shelf: 50 g short of each.
        await typeFeature('400', '250', '10');
      });

      it('should show what the shelf is short of', () => {
        expect(queryAll('.short p').map((line) => textOf(line))).toEqual([
          'Part A: the shelf is 50 g short.',
          'Part B: the shelf is 50 g short.',
        ]);
      });

      it('should refuse to start until the rest is said to come from another bottle', async () => {
        await press('Start pour');

        expect(textOf('.problem')).toBe(
          'The shelf does not hold enough for this pour. Add a container on the Shelf, or tick that the rest comes ' +
            'from a bottle not on the shelf.',
        );
        expect(navigate).not.toHaveBeenCalled();
        expect(await db.pours.count()).toBe(0);
        expect(await db.outbox.count()).toBe(0);
      });

      it('should log it with the shortfall once that is ticked', async () => {
        const bottle = await loader.getHarness(MatCheckboxHarness.with({ label: /bottle not on the shelf/ }));
        await bottle.check();
        await fixture.whenStable();

        await press('Start pour');

        const [pour] = await logged(1);
        expect(pour?.shortfall).toEqual([
          { part: 'A', quantityG: 50 },
          { part: 'B', quantityG: 50 },
        ]);
        const [row] = await db.outbox.toArray();
        expect(row?.mutation.type).toBe('pour.create');
        expect(row?.mutation.type === 'pour.create' && row.mutation.data.whenShort).toBe('record-shortfall');
        // The shelf gives all it holds; the 50 g of each part beyond it is noted, not overdrawn.
        await shelfShows(['Part A · bought 1 Feb 2025 · 0 g left', 'Part B · bought 3 Feb 2025 · 0 g left']);
      });
    });

    describe('messages beside the fields', () => {
      beforeEach(() => render());

      it('should not find fault with fields not yet typed in', () => {
        expect(hintOf('length')).toBe('');
        expect(hintOf('width')).toBe('');
        expect(hintOf('depth')).toBe('');
        expect(query('.problem')).toBeNull();
      });

      it('should find fault only with the field typed in', async () => {
        await type('length', '-5');

        expect(hintOf('length')).toBe('Length must be more than 0 mm');
        expect(hintOf('width')).toBe('');
        expect(hintOf('depth')).toBe('');
      });

      it('should show every message once Start is pressed, and save nothing', async () => {
        await press('Start pour');

        expect(hintOf('length')).toBe('Length must be a number');
        expect(hintOf('width')).toBe('Width must be a number');
        expect(hintOf('depth')).toBe('Depth must be a number');
        expect(textOf('.problem')).toBe('Some values need another look: see the notes beside the fields.');
        expect(navigate).not.toHaveBeenCalled();
        expect(await db.pours.count()).toBe(0);
      });
    });
  });

  describe('as a viewer', () => {
    beforeEach(async () => {
      signIn('viewer');
      await arrangeShelf();
      await render(() => query('.lead'));
    });

    it('should say a viewer cannot log pours, and offer no Start button', async () => {
      expect(textOf('.lead')).toBe('As a viewer of this workshop you can follow its builds, but not log pours.');
      expect(query('form')).toBeNull();
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Start pour' }))).toEqual([]);
    });
  });
});
