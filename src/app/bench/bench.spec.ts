import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, DeferBlockBehavior, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { firstLayer, planPour, type MaterialDataSheet, type SessionView } from '@benchtide/shared';
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
import { Bench } from './bench';

const SESSION_KEY = 'benchtide.session';
const WORKSHOP_ID = v7();
const HOUR = 3_600_000;

/**
 * Invented round numbers, no maker's figures: 1 : 1 by volume, both parts 1 g/mL, at most 10 mm a layer,
 * full cure 72 h after the last layer, at 20 °C.
 */
const DATA_SHEET: MaterialDataSheet = {
  mixRatio: { basis: 'volume', partA: 1, partB: 1 },
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

function signIn(): void {
  const session: SessionView = {
    account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
    workshops: [{ id: WORKSHOP_ID, name: 'River Club', personal: false, role: 'owner', memberCount: 2 }],
  };
  localStorage.setItem(SESSION_KEY, JSON.stringify(session));
}

/** The fields every record has, as the server sends them. */
function synced(): Omit<SyncedFields, 'id'> {
  const at = '2025-03-01T09:00:00.000Z';
  return { workshopId: WORKSHOP_ID, createdAt: at, updatedAt: at, deletedAt: null, changeNumber: 1 };
}

async function putBuild(db: BenchDb, name: string): Promise<LocalBuild> {
  const build: LocalBuild = { id: v7(), ...synced(), name, scaleRatio: 87, status: 'building', notes: '' };
  await db.builds.put(build);
  return build;
}

async function putMaterial(db: BenchDb, name: string): Promise<LocalMaterial> {
  const material: LocalMaterial = {
    id: v7(),
    ...synced(),
    name,
    kind: 'two-part-epoxy',
    dataSheet: DATA_SHEET,
    measure: null,
    shelfLifeOpenedDays: null,
    safetySheet: '',
  };
  await db.materials.put(material);
  return material;
}

/** A 100 × 50 × 4 mm pour started `hoursAgo`, planned with the shared maths as the server plans it. */
async function putPour(db: BenchDb, buildId: string, materialId: string, hoursAgo: number): Promise<LocalPour> {
  const startAt = new Date(Date.now() - hoursAgo * HOUR).toISOString();
  const result = planPour({
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    material: DATA_SHEET,
    roomTempC: 20,
    startAtMs: Date.parse(startAt),
    scaleResolutionG: 0.1,
  });
  if (!result.ok) throw new Error('The pour must plan');
  const { request, ...plan } = result.plan;
  const pour: LocalPour = {
    id: v7(),
    ...synced(),
    buildId,
    stepId: null,
    materialId,
    startAt,
    request,
    plan,
    layerCount: plan.layers.count,
    shortfall: [],
    note: '',
  };
  await db.pours.put(pour);
  // Layer 1 goes on with its pour and shares its id, as the store writes it.
  await db.pourLayers.put({ id: pour.id, ...synced(), pourId: pour.id, ...firstLayer(plan, startAt, 20) });
  return pour;
}

/** A container of part A whose stock book holds the entries given, in grams. */
async function putContainer(
  db: BenchDb,
  materialId: string,
  lowStockQty: number | null,
  quantities: readonly number[],
): Promise<LocalContainer> {
  const container: LocalContainer = {
    id: v7(),
    ...synced(),
    materialId,
    part: 'A',
    sizeQty: 500,
    unit: 'g',
    priceMinor: 4000,
    currency: 'EUR',
    boughtOn: '2025-02-01',
    openedOn: null,
    useBy: null,
    lowStockQty,
    lot: null,
  };
  await db.containers.put(container);
  const entries = quantities.map((quantity, index): LocalLedgerEntry => ({
    id: v7(),
    ...synced(),
    containerId: container.id,
    kind: index === 0 ? 'purchase' : 'pour-use',
    quantity,
    costMinor: 0,
    at: '2025-03-01T09:00:00.000Z',
    pourId: null,
    note: '',
  }));
  await db.ledgerEntries.bulkPut(entries);
  return container;
}

describe('Bench', () => {
  let fixture: ComponentFixture<Bench>;
  let db: BenchDb;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      imports: [Bench],
      providers: [
        { provide: BENCH_DB_NAME, useValue: `bench-spec-${v7()}` },
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
      deferBlockBehavior: DeferBlockBehavior.Playthrough,
    });
    db = TestBed.inject(BenchDb);
  });
  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function render(): Promise<void> {
    fixture = TestBed.createComponent(Bench);
    await fixture.whenStable();
  }

  /** Waits for the deferred board and the device's records to show what `check` looks for. */
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

  function textOf(element: Element | null): string {
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function links(): { text: string; href: string | null }[] {
    return queryAll('a').map((link) => ({ text: textOf(link), href: link.getAttribute('href') }));
  }

  describe('signed out', () => {
    beforeEach(render);

    it('should offer to sign in, to create an account or to plan without one', () => {
      expect(links()).toEqual([
        { text: 'Sign in', href: '/sign-in' },
        { text: 'Create an account', href: '/sign-up' },
        { text: 'Plan a pour without an account', href: '/pour-planner' },
      ]);
      expect(query('bt-bench-board')).toBeNull();
      expect(textOf(query('.lead'))).toContain('with or without a connection');
    });

    it('should give the cautions before any pour', () => {
      expect(textOf(query('.caution mat-card-title'))).toBe('Before any pour');
      expect(queryAll('.caution li').map(textOf)).toEqual([
        'Wear nitrile gloves and eye protection; resin and hardener can sensitise skin.',
        'Work with fresh air moving through the room.',
        "Never pour thicker than the data sheet's maximum layer: thick pours overheat.",
        'Seal foam first: curing heat and solvents melt extruded polystyrene.',
      ]);
      expect(textOf(query('.caution .defer'))).toBe("The maker's safety data sheet and your local rules come first.");
    });
  });

  describe('signed in', () => {
    beforeEach(signIn);

    it('should show the board, the quick actions and the cautions, and no sign-in offer', async () => {
      await render();
      await settle('the board', () => query('bt-bench-board .curing'));

      expect(links()).toEqual([
        { text: 'Log a step', href: '/builds' },
        { text: 'Add a photo', href: '/add-photo' },
        { text: 'Log a pour', href: '/log-pour' },
      ]);
      expect(textOf(query('.log-pour'))).toBe('Log a pour');
      expect(textOf(query('.caution mat-card-title'))).toBe('Before any pour');
    });

    it('should say nothing is curing when no pour is', async () => {
      await render();
      await settle('the board', () => query('bt-bench-board .empty'));

      expect(textOf(query('.empty'))).toBe(
        'Nothing is curing. Log a pour when you mix one, and its timers start here.',
      );
      expect(query('bt-pour-timer')).toBeNull();
      expect(query('.shelf')).toBeNull();
    });

    it('should give each pour still curing a timer named after its build', async () => {
      const harbour = await putBuild(db, 'Harbour diorama');
      const canal = await putBuild(db, 'Canal lock');
      const resin = await putMaterial(db, 'Clear casting resin');
      await putPour(db, harbour.id, resin.id, 1);
      // Fully cured 72 h after it went on, a week ago: long past the half day a cured pour stays on the bench.
      await putPour(db, canal.id, resin.id, 10 * 24);

      await render();
      await settle('a timer', () => query('bt-pour-timer'));

      expect(queryAll('bt-pour-timer h3').map(textOf)).toEqual(['Harbour diorama']);
      expect(query('.empty')).toBeNull();
      expect(textOf(query('bt-bench-board > section > .estimate, .curing > .estimate'))).toBe(
        'Cure times are estimates from the data sheet and the room temperature you gave.',
      );
    });

    it('should list a container at or below its low-stock level, and not one above it', async () => {
      const resin = await putMaterial(db, 'Clear casting resin');
      // 500 g bought, 420 g poured: 80 g left, below the 100 g the modeller set.
      await putContainer(db, resin.id, 100, [500, -420]);
      // 500 g bought, 300 g poured: 200 g left, above the same level.
      await putContainer(db, resin.id, 100, [500, -300]);
      // 120 g left, but no level set: nobody asked to watch it.
      await putContainer(db, resin.id, null, [500, -380]);

      await render();
      await settle('the shelf', () => query('.shelf li'));

      expect(textOf(query('#shelf-heading'))).toBe('On the shelf');
      expect(queryAll('.shelf li').map(textOf)).toEqual(['Clear casting resin: running low, 80 g left']);
    });

    it('should list a container exactly at its low-stock level', async () => {
      const resin = await putMaterial(db, 'Clear casting resin');
      await putContainer(db, resin.id, 100, [500, -400]);

      await render();
      await settle('the shelf', () => query('.shelf li'));

      expect(queryAll('.shelf li').map(textOf)).toEqual(['Clear casting resin: running low, 100 g left']);
    });
  });
});
