import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { AccountSession } from '../core/account-session';
import { BenchIcons } from '../core/bench-icons';
import { BENCH_DB_NAME, BenchDb } from '../sync/bench-db';
import { dropDatabase, until } from '../sync/sync-testing';
import { CostsPage } from './costs-page';

const WORKSHOP = '0190a0a0-0000-7000-8000-00000000c057';
const SESSION: SessionView = {
  account: { id: 'u-mae', email: 'mae@example.org', displayName: 'Mae', emailVerified: true },
  workshops: [{ id: WORKSHOP, name: 'Thornmoss club', personal: false, role: 'builder', memberCount: 2 }],
};

const synced = {
  workshopId: WORKSHOP,
  createdAt: '2026-11-01T00:00:00Z',
  updatedAt: '2026-11-01T00:00:00Z',
  deletedAt: null,
  changeNumber: 1,
};

describe('CostsPage', () => {
  let db: BenchDb;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [provideRouter([]), { provide: BENCH_DB_NAME, useValue: `costs-page-spec-${v7()}` }],
    });
    TestBed.inject(AccountSession).keep(SESSION);
    TestBed.inject(BenchIcons).register();
    db = TestBed.inject(BenchDb);
  });
  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function shelfWithUses(): Promise<void> {
    await db.builds.bulkAdd([
      { ...synced, id: 'b-weir', name: 'Weir at Thornmoss', scaleRatio: 87.1, status: 'building', notes: '' },
      { ...synced, id: 'b-pond', name: 'Duck pond', scaleRatio: 35, status: 'planning', notes: '' },
    ] as never[]);
    await db.materials.add({ ...synced, id: 'm-clear', name: 'Clear resin', kind: 'two-part-epoxy' } as never);
    await db.containers.add({
      ...synced,
      id: 'c-a',
      materialId: 'm-clear',
      part: 'A',
      sizeQty: 500,
      unit: 'g',
      priceMinor: 2500,
      currency: 'EUR',
      boughtOn: '2026-10-01',
    } as never);
    await db.pours.bulkAdd([
      { ...synced, id: 'p-1', buildId: 'b-weir', materialId: 'm-clear' },
      { ...synced, id: 'p-2', buildId: 'b-pond', materialId: 'm-clear' },
    ] as never[]);
    const entry = (id: string, kind: string, quantity: number, costMinor: number, at: string, pourId: string | null) =>
      ({ ...synced, id, containerId: 'c-a', kind, quantity, costMinor, at, pourId, note: '' }) as never;
    await db.ledgerEntries.bulkAdd([
      entry('e-buy', 'purchase', 500, 0, '2026-10-01T12:00:00Z', null),
      // Worked by hand at €25.00 for 500 g (5 cents a gram): 40 g is €2.00, 30 g €1.50, 10 g wasted €0.50.
      entry('e-1', 'pour-use', -40, 200, '2026-10-20T18:00:00Z', 'p-1'),
      entry('e-2', 'pour-use', -30, 150, '2026-11-03T18:00:00Z', 'p-2'),
      entry('e-3', 'waste', -10, 50, '2026-11-05T18:00:00Z', null),
    ]);
  }

  async function render(): Promise<HTMLElement> {
    const fixture = TestBed.createComponent(CostsPage);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function rows(page: HTMLElement, id: string): string[][] {
    const section = page.querySelector(`section:has(#${id})`)!;
    return Array.from(section.querySelectorAll('tr.mat-mdc-row')).map((row) =>
      Array.from(row.querySelectorAll('td')).map((cell) => cell.textContent!.trim()),
    );
  }

  it('should say what to do when nothing has been spent yet', async () => {
    const page = await render();

    expect(page.textContent).toContain('Nothing spent yet in Thornmoss club');
  });

  it('should total what was used and wasted, per build without the waste, and per material and month', async () => {
    await shelfWithUses();
    const fixture = TestBed.createComponent(CostsPage);
    const page = fixture.nativeElement as HTMLElement;
    await until(() => (fixture.detectChanges(), page.querySelector('.total .amount')), 'the total');
    await fixture.whenStable();

    expect(page.querySelector('.total .amount')!.textContent).toContain('4.00');
    expect(rows(page, 'by-build')).toEqual([
      ['Duck pond', jasmine.stringContaining('1.50') as unknown as string],
      ['Weir at Thornmoss', jasmine.stringContaining('2.00') as unknown as string],
    ]);
    expect(rows(page, 'by-material')[0]![1]).toContain('4.00');
    expect(rows(page, 'by-month').map((row) => row[1])).toEqual([
      jasmine.stringContaining('2.00') as unknown as string,
      jasmine.stringContaining('2.00') as unknown as string,
    ]);
    expect(page.querySelector('canvas[role="img"]')).not.toBeNull();
  });

  it('should never print NaN: a damaged entry is left out of the sums and the page says so', async () => {
    await shelfWithUses();
    const damaged = { ...synced, containerId: 'c-a', at: '2026-11-06T18:00:00Z', pourId: 'p-1', note: '' };
    await db.ledgerEntries.bulkAdd([
      { ...damaged, id: 'e-nan', kind: 'pour-use', quantity: -5, costMinor: Number.NaN },
      { ...damaged, id: 'e-sign', kind: 'pour-use', quantity: 5, costMinor: 25 },
    ] as never[]);
    const fixture = TestBed.createComponent(CostsPage);
    const page = fixture.nativeElement as HTMLElement;
    await until(() => (fixture.detectChanges(), page.querySelector('[data-unreadable]')), 'the note');
    await fixture.whenStable();

    expect(page.textContent).not.toContain('NaN');
    expect(page.querySelector('.total .amount')!.textContent).toContain('4.00');
    expect(page.querySelector('[data-unreadable]')!.textContent).toContain('2 stock-book entries on this device');
  });

  it('should add exact costs and round each line once: three uses of 0.4 cent make a cent', async () => {
    await shelfWithUses();
    const tiny = { ...synced, containerId: 'c-a', kind: 'pour-use', quantity: -0.08, pourId: 'p-2', note: '' };
    // hand-worked at 5 cents a gram: 0.08 g is 0.4 cent; three are 1.2 cents, shown as €0.01 more on the pond
    await db.ledgerEntries.bulkAdd(
      ['e-t1', 'e-t2', 'e-t3'].map((id) => ({ ...tiny, id, costMinor: 0.4, at: '2026-11-07T18:00:00Z' })) as never[],
    );
    const fixture = TestBed.createComponent(CostsPage);
    const page = fixture.nativeElement as HTMLElement;
    await until(() => (fixture.detectChanges(), page.querySelector('.total .amount')), 'the total');
    await fixture.whenStable();

    expect(rows(page, 'by-build')[0]).toEqual(['Duck pond', jasmine.stringContaining('1.51') as unknown as string]);
    expect(page.querySelector('.total .amount')!.textContent).toContain('4.01');
  });
});
