import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { addDays, findMaterialPreset, type NewContainer, type NewMaterial } from '@benchtide/shared';
import { format } from 'date-fns';
import { DataSheetFieldsHarness } from '../pours/data-sheet-fields-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, TEST_DATA_SHEET, until } from '../sync/sync-testing';
import { localDay } from './container-row';
import { ShelfPage } from './shelf-page';
import { eventually, putPourUse, screenIsPhone, shelfTestProviders, signIn, WORKSHOP_ID } from './shelf-testing';

// Stock is the plain sum of a container's stock-book entries (purchase +, pour use and waste −, stocktake the
// count minus what was expected), worked by hand below. Price per unit is price ÷ size: 40.00 EUR for 500 g is
// 0.08 EUR a gram, written "€0.08" the en-US way. The material and its data sheet are invented test values.

const RESIN = 'Casting resin, blue-lid kit';

describe('ShelfPage', () => {
  let fixture: ComponentFixture<ShelfPage>;
  let loader: HarnessLoader;
  let root: HarnessLoader;
  let db: BenchDb;
  let store: OfflineStore;

  function configure(role: Parameters<typeof signIn>[0], phone = false): void {
    signIn(role);
    TestBed.configureTestingModule({
      imports: [ShelfPage],
      providers: [...shelfTestProviders('shelf-page-spec'), screenIsPhone(phone)],
    });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  }

  async function render(): Promise<void> {
    fixture = TestBed.createComponent(ShelfPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  }

  async function settle(what: string, check: () => boolean): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function queryAll(selector: string, within: ParentNode = fixture.nativeElement as HTMLElement): HTMLElement[] {
    return Array.from(within.querySelectorAll<HTMLElement>(selector));
  }

  function text(element: Element | null): string {
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function rowOf(containerId: string): HTMLElement | null {
    return query(`tr[data-container="${containerId}"]`);
  }

  function cell(containerId: string, name: string): string {
    return text(rowOf(containerId)?.querySelector(`[data-cell="${name}"]`) ?? null);
  }

  /** The amounts shown in a material's table, top to bottom. */
  function amounts(materialId: string): string[] {
    return queryAll(`[data-material="${materialId}"] [data-cell="amount"]`).map(text);
  }

  function material(fields: Partial<Omit<NewMaterial, 'id'>> = {}): Promise<string> {
    return store.create('material', WORKSHOP_ID, {
      name: RESIN,
      kind: 'two-part-epoxy',
      dataSheet: TEST_DATA_SHEET,
      safetySheet: 'Paper copy in the red folder by the sink',
      ...fields,
    });
  }

  function container(materialId: string, fields: Partial<Omit<NewContainer, 'id' | 'materialId'>> = {}) {
    return store.create('container', WORKSHOP_ID, {
      materialId,
      part: 'A',
      sizeQty: 500,
      unit: 'g',
      priceMinor: 4000,
      currency: 'EUR',
      boughtOn: '2025-02-01',
      ...fields,
    });
  }

  function waste(containerId: string, quantity: number): Promise<string> {
    return store.recordWaste(WORKSHOP_ID, containerId, { quantity, note: '' });
  }

  /** 500 g bought, 84.5 g drawn by a pour, 10 g wasted: 500 − 84.5 − 10 = 405.5 g left. */
  async function workedExample(): Promise<{ materialId: string; containerId: string }> {
    const materialId = await material();
    const containerId = await container(materialId, { lot: 'L-0211' });
    await putPourUse(db, containerId, -84.5);
    await waste(containerId, 10);
    return { materialId, containerId };
  }

  async function shown(materialId: string): Promise<void> {
    await render();
    await settle('the material on the shelf', () => query(`[data-material="${materialId}"]`) !== null);
  }

  async function dialog(): Promise<MatDialogHarness> {
    return root.getHarness(MatDialogHarness);
  }

  async function dialogsOpen(): Promise<number> {
    return (await root.getAllHarnesses(MatDialogHarness)).length;
  }

  async function type(field: string, value: string): Promise<void> {
    const input = await root.getHarness(MatInputHarness.with({ selector: `[data-field="${field}"]` }));
    await input.setValue(value);
    await fixture.whenStable();
  }

  async function valueOf(field: string): Promise<string> {
    return (await root.getHarness(MatInputHarness.with({ selector: `[data-field="${field}"]` }))).getValue();
  }

  /** The data-sheet fields of the material form in the open dialog. */
  function dataSheet(): Promise<DataSheetFieldsHarness> {
    return root.getHarness(DataSheetFieldsHarness);
  }

  /** The words under a field in the open dialog. */
  function hintOf(field: string): string {
    const input = document.querySelector(`mat-dialog-container [data-field="${field}"]`);
    return text(input?.closest('mat-form-field')?.querySelector('mat-hint') ?? null);
  }

  function inDialog(selector: string): string {
    return text(document.querySelector(`mat-dialog-container ${selector}`));
  }

  async function pressInDialog(label: string): Promise<void> {
    await (await (await dialog()).getHarness(MatButtonHarness.with({ text: label }))).click();
    await fixture.whenStable();
  }

  async function pressOnPage(action: string, materialId?: string): Promise<void> {
    const within = materialId === undefined ? '' : `[data-material="${materialId}"] `;
    await (await loader.getHarness(MatButtonHarness.with({ selector: `${within}[data-action="${action}"]` }))).click();
    await fixture.whenStable();
  }

  async function choose(field: string, option: string): Promise<void> {
    const select = await root.getHarness(MatSelectHarness.with({ selector: `[data-field="${field}"]` }));
    await select.open();
    await select.clickOptions({ text: option });
    await fixture.whenStable();
  }

  async function containerAction(containerId: string, item: string): Promise<void> {
    const menu = await loader.getHarness(
      MatMenuHarness.with({ selector: `tr[data-container="${containerId}"] [data-action="menu"]` }),
    );
    await menu.clickItem({ text: item });
    await fixture.whenStable();
  }

  async function closed(what: string): Promise<void> {
    await eventually(dialogsOpen, (open) => open === 0, what);
    await fixture.whenStable();
  }

  async function entriesOf(containerId: string) {
    return (await db.ledgerEntries.where('containerId').equals(containerId).toArray()).sort((a, b) =>
      a.kind.localeCompare(b.kind),
    );
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  describe('for a builder', () => {
    beforeEach(() => configure('builder'));

    describe('the table', () => {
      it('should show what is left as the sum of the stock book: 500 − 84.5 − 10 = 405.5 g', async () => {
        const { materialId, containerId } = await workedExample();
        await shown(materialId);

        const table = await loader.getHarness(MatTableHarness.with({ ancestor: `[data-material="${materialId}"]` }));
        const [row] = await table.getRows();
        const cells = await row!.getCellTextByColumnName();
        expect(cells['part']).toBe('Part A');
        expect(cells['boughtOn']).toBe('1 Feb 2025');
        expect(cells['lot']).toBe('L-0211');
        expect(cell(containerId, 'amount')).toBe('405.5 of 500 g');
        // 405.5 / 500 = 81.1 % of the bar.
        const bar = await loader.getHarness(
          MatProgressBarHarness.with({ ancestor: `[data-container="${containerId}"]` }),
        );
        expect(await bar.getValue()).toBe(81.1);
        expect(cells['price']).toBe('€0.08 / g');
        expect(cell(containerId, 'stock-word')).toBe('');
      });

      it('should never print NaN: an entry that is not a number is left out of what is left', async () => {
        const { materialId, containerId } = await workedExample();
        await putPourUse(db, containerId, Number.NaN);
        await shown(materialId);

        expect(cell(containerId, 'amount')).toBe('405.5 of 500 g');
        expect(fixture.nativeElement.textContent).not.toContain('NaN');
      });

      it('should head each material with its kind, its mix and where its safety data sheet is', async () => {
        const materialId = await material();
        await shown(materialId);

        const section = query(`[data-material="${materialId}"]`);
        expect(text(section?.querySelector('h2') ?? null)).toBe(RESIN);
        // The invented test sheet mixes 1 : 1 by weight.
        expect(text(section?.querySelector('[data-field="kind"]') ?? null)).toBe('Two-part epoxy · 1 : 1 by weight');
        expect(text(section?.querySelector('[data-field="safety-sheet"]') ?? null)).toBe(
          'Safety data sheet: Paper copy in the red folder by the sink',
        );
        expect(text(section)).toContain('No container of it on the shelf yet.');
        expect(text(query('.safety'))).toContain("The maker's safety data sheet and your local rules come first.");
      });

      it('should say "low" at the low-stock level, "empty" at nothing, and nothing above the level', async () => {
        const materialId = await material();
        const atLevel = await container(materialId, { lowStockQty: 100, boughtOn: '2025-01-01' });
        const above = await container(materialId, { lowStockQty: 100, boughtOn: '2025-01-02' });
        const empty = await container(materialId, { lowStockQty: 50, boughtOn: '2025-01-03' });
        await waste(atLevel, 400);
        await waste(above, 399);
        await waste(empty, 500);
        await shown(materialId);

        // 500 − 400 = 100, at the level of 100; 500 − 399 = 101, above it; 500 − 500 = 0.
        expect(cell(atLevel, 'amount')).toBe('100 of 500 g');
        expect(cell(atLevel, 'stock-word')).toBe('low');
        expect(rowOf(atLevel)?.querySelector('[data-cell="stock-word"] mat-icon')).not.toBeNull();
        expect(cell(above, 'amount')).toBe('101 of 500 g');
        expect(cell(above, 'stock-word')).toBe('');
        expect(cell(empty, 'amount')).toBe('0 of 500 g');
        expect(cell(empty, 'stock-word')).toBe('empty');
      });

      it('should say when a container is past its use-by day or near it, counting the shelf life once opened', async () => {
        const today = localDay();
        const materialId = await material({ shelfLifeOpenedDays: 20 });
        const old = await container(materialId, { useBy: '2020-01-01' });
        const opened = await container(materialId, { openedOn: addDays(today, -10) });
        const sealed = await container(materialId, { useBy: addDays(today, 60) });
        await shown(materialId);

        // Opened 10 days ago with 20 days once opened: good until today + 10, inside the 14 days' notice.
        const [year, month, day] = addDays(today, 10).split('-').map(Number);
        const soon = new Date(year!, month! - 1, day);
        expect(cell(old, 'use-by-word')).toBe('past use-by');
        expect(cell(old, 'dates')).toContain('Use by 1 Jan 2020');
        expect(cell(opened, 'use-by-word')).toBe(`use by ${format(soon, 'd MMM')}`);
        expect(cell(opened, 'dates')).toContain(`Use by ${format(soon, 'd MMM yyyy')}`);
        expect(cell(sealed, 'use-by-word')).toBe('');
        expect(cell(sealed, 'dates')).toContain('Not opened');
      });

      it('should sort by what is left, both ways', async () => {
        const materialId = await material();
        for (const left of [300, 500, 120, 450, 80, 250]) {
          const id = await container(materialId);
          if (left < 500) await waste(id, 500 - left);
        }
        await shown(materialId);
        expect(amounts(materialId)[0]).toBe('300 of 500 g');

        const sort = await loader.getHarness(MatSortHarness.with({ ancestor: `[data-material="${materialId}"]` }));
        const [remaining] = await sort.getSortHeaders({ label: 'Remaining' });
        await remaining!.click();
        expect(amounts(materialId)).toEqual(
          ['80', '120', '250', '300', '450', '500'].map((left) => `${left} of 500 g`),
        );

        await remaining!.click();
        expect(amounts(materialId)[0]).toBe('500 of 500 g');
        expect(amounts(materialId)[5]).toBe('80 of 500 g');
      });

      it('should filter by lot and say when nothing matches', async () => {
        const materialId = await material();
        for (let n = 1; n <= 6; n += 1) await container(materialId, { lot: `L-0${n}` });
        await shown(materialId);

        await type('filter', 'l-03');
        expect(queryAll(`[data-material="${materialId}"] tr[data-container]`).length).toBe(1);
        expect(text(query('[data-cell="lot"]'))).toBe('L-03');

        await type('filter', 'no such lot');
        expect(queryAll('tr[data-container]').length).toBe(0);
        expect(text(query('td.none'))).toBe('No container matches “no such lot”.');

        await type('filter', '');
        expect(queryAll('tr[data-container]').length).toBe(6);
      });

      it('should offer no filter for a short list', async () => {
        const materialId = await material();
        await container(materialId);
        await shown(materialId);

        expect(query('[data-field="filter"]')).toBeNull();
        expect(query('mat-paginator')).toBeNull();
      });

      it('should page a long list ten at a time', async () => {
        const materialId = await material();
        for (let n = 1; n <= 12; n += 1)
          await container(materialId, { boughtOn: `2025-01-${String(n).padStart(2, '0')}` });
        await shown(materialId);

        const paginator = await loader.getHarness(MatPaginatorHarness);
        expect(queryAll('tr[data-container]').length).toBe(10);
        expect(await paginator.getRangeLabel()).toBe('1 – 10 of 12');

        await paginator.goToNextPage();
        expect(queryAll('tr[data-container]').length).toBe(2);
        expect(text(query('[data-cell="boughtOn"]'))).toBe('11 Jan 2025');
      });
    });

    describe('adding a material', () => {
      it('should say what to do on an empty shelf', async () => {
        await render();
        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);

        expect(text(query('[data-state="empty"] h2'))).toBe('Add the first material you pour with');
        expect(query('[data-state="empty"] [data-action="add-material"]')).not.toBeNull();
      });

      it('should fill the data sheet from typical values, say to check them, and save it on this device', async () => {
        await render();
        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);
        await pressOnPage('add-material');

        await type('name', 'Gloss medium, big tub');
        await choose('preset', 'Acrylic gloss medium (single part)');
        expect(inDialog('.typical')).toBe('Typical values only: check the maker’s data sheet and type in its numbers');
        expect(
          await (await root.getHarness(MatSelectHarness.with({ selector: '[data-field="kind"]' }))).getValueText(),
        ).toBe('Single-part medium');
        expect(await (await dataSheet()).getValue('partA')).toBe('1');
        expect(await (await dataSheet()).getValue('maxLayer')).toBe('3');
        await type('shelfLife', '30');
        await type('safetySheet', 'https://example.org/gloss-medium-sheet.pdf');
        await pressInDialog('Add material');
        await closed('the material form to close');

        const [saved] = await db.materials.toArray();
        expect(saved).toEqual(
          jasmine.objectContaining({
            name: 'Gloss medium, big tub',
            kind: 'single-part-medium',
            shelfLifeOpenedDays: 30,
            safetySheet: 'https://example.org/gloss-medium-sheet.pdf',
            workshopId: WORKSHOP_ID,
          }),
        );
        expect(saved?.dataSheet).toEqual(
          jasmine.objectContaining(findMaterialPreset('acrylic-gloss-medium')!.dataSheet),
        );
        expect((await db.outbox.toArray()).map((row) => row.mutation.type)).toEqual(['material.create']);
        await settle('the new section', () => query(`[data-material="${saved!.id}"]`) !== null);
        expect(query('[data-field="safety-sheet"] a')?.getAttribute('href')).toBe(
          'https://example.org/gloss-medium-sheet.pdf',
        );
      });

      it('should keep foam board by area with no data sheet, show its cautions, and offer m² for its sheets', async () => {
        await render();
        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);
        await pressOnPage('add-material');

        await type('name', 'Blue foam board, 50 mm');
        await choose('kind', 'Foam and boards');
        expect(query('bt-data-sheet-fields')).toBeNull();
        expect(inDialog('[data-cautions]')).toContain('hot wire');
        expect(inDialog('[data-cautions]')).toContain('safety data sheet');
        await choose('measure', 'by area');
        await pressInDialog('Add material');
        await closed('the material form to close');

        const [saved] = await db.materials.toArray();
        expect(saved).toEqual(jasmine.objectContaining({ kind: 'foam-and-boards', dataSheet: null, measure: 'area' }));
        await settle('the new section', () => query(`[data-material="${saved!.id}"]`) !== null);
        expect(query(`[data-material="${saved!.id}"]`)?.textContent).toContain('Foam and boards · by area');

        await pressOnPage('add-container', saved!.id);
        expect(query('[data-field="part"]')).toBeNull();
        const toggles = await root.getAllHarnesses(MatButtonToggleHarness.with({ ancestor: '[data-field="unit"]' }));
        expect(await Promise.all(toggles.map((toggle) => toggle.getText()))).toEqual(['m²']);
        await type('size', '0.72');
        await type('price', '12.99');
        await pressInDialog('Add container');
        await closed('the container form to close');
        const [board] = await db.containers.toArray();
        expect(board).toEqual(jasmine.objectContaining({ unit: 'm2', sizeQty: 0.72, priceMinor: 1299 }));
        await settle('the new row', () => cell(board!.id, 'amount') === '0.72 of 0.72 m²');
      });

      it('should refuse a material without a name in the schema’s words and write nothing', async () => {
        await render();
        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);
        await pressOnPage('add-material');
        await choose('preset', 'Coating epoxy, 1:1 by volume');
        await type('name', '   ');

        await pressInDialog('Add material');

        expect(hintOf('name')).toBe('Name is required');
        expect(inDialog('.problem')).toContain('Nothing was saved');
        expect(await dialogsOpen()).toBe(1);
        expect(await (await dataSheet()).getValue('partA')).toBe('1');
        expect(await db.materials.count()).toBe(0);
        expect(await db.outbox.count()).toBe(0);
      });

      it('should put each data-sheet message beside its field', async () => {
        await render();
        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);
        await pressOnPage('add-material');
        await choose('preset', 'Coating epoxy, 1:1 by volume');
        await type('name', 'Bench coat');
        await (await dataSheet()).setValue('densityA', '0');

        await pressInDialog('Add material');

        expect(await (await dataSheet()).getHint('densityA')).toBe('Part A density must be more than 0 g/mL');
        expect(await db.materials.count()).toBe(0);
      });
    });

    describe('editing a material', () => {
      it('should send only what changed, and the safety data sheet so that it is never emptied', async () => {
        const materialId = await material();
        await shown(materialId);
        await db.outbox.clear();

        await pressOnPage('edit-material', materialId);
        expect(await valueOf('name')).toBe(RESIN);
        expect(await (await dataSheet()).getValue('potLife')).toBe('30');
        await type('name', 'Casting resin, red-lid kit');
        await pressInDialog('Save changes');
        await closed('the material form to close');

        const [row] = await db.outbox.toArray();
        expect(row?.mutation).toEqual(
          jasmine.objectContaining({
            type: 'material.patch',
            data: { name: 'Casting resin, red-lid kit', safetySheet: 'Paper copy in the red folder by the sink' },
          }),
        );
        await settle(
          'the new name',
          () => text(query(`[data-material="${materialId}"] h2`)) === 'Casting resin, red-lid kit',
        );
      });
    });

    describe('adding a container', () => {
      it('should write it and its purchase through the store, in the currency of the last one added', async () => {
        const materialId = await material();
        await container(materialId, { currency: 'GBP' });
        await shown(materialId);
        const create = spyOn(store, 'create').and.callThrough();

        await pressOnPage('add-container', materialId);
        expect(await valueOf('currency')).toBe('GBP');
        expect(await valueOf('boughtOn')).toBe(localDay());
        expect(await (await root.getHarness(MatButtonToggleHarness.with({ text: 'Part A' }))).isChecked()).toBeTrue();
        await (await root.getHarness(MatButtonToggleHarness.with({ text: 'Part B' }))).check();
        await (await root.getHarness(MatButtonToggleHarness.with({ text: 'mL' }))).check();
        await type('size', '250');
        await type('price', '12,50');
        await type('lot', 'B-77');
        await type('lowStock', '50');
        await pressInDialog('Add container');
        await closed('the container form to close');

        expect(create).toHaveBeenCalledTimes(1);
        const added = (await db.containers.toArray()).find((row) => row.part === 'B');
        // 12,50 typed with a comma is 12.50 GBP: 1250 pence.
        expect(added).toEqual(
          jasmine.objectContaining({
            materialId,
            sizeQty: 250,
            unit: 'mL',
            priceMinor: 1250,
            currency: 'GBP',
            boughtOn: localDay(),
            lot: 'B-77',
            lowStockQty: 50,
          }),
        );
        expect(await entriesOf(added!.id)).toEqual([
          jasmine.objectContaining({ id: added!.id, kind: 'purchase', quantity: 250 }),
        ]);
        const queued = (await db.outbox.toArray()).map((row) => row.mutation);
        expect(queued.at(-1)).toEqual(jasmine.objectContaining({ type: 'container.create' }));
        await settle('the new row', () => cell(added!.id, 'amount') === '250 of 250 mL');
        // 12.50 GBP ÷ 250 mL = 0.05 GBP a millilitre.
        expect(cell(added!.id, 'price')).toBe('£0.05 / mL');
      });

      it('should refuse a negative size in the schema’s words, keep what was typed and write nothing', async () => {
        const materialId = await material();
        await shown(materialId);
        const create = spyOn(store, 'create').and.callThrough();

        await pressOnPage('add-container', materialId);
        await type('size', '-5');
        await type('lot', 'C-12');
        await pressInDialog('Add container');

        expect(hintOf('size')).toBe('Size must be more than 0');
        expect(hintOf('price')).toBe('Type the price paid, such as 12.50, or 0 if it cost nothing');
        expect(await valueOf('lot')).toBe('C-12');
        expect(await dialogsOpen()).toBe(1);
        expect(create).not.toHaveBeenCalled();
        expect(await db.containers.count()).toBe(0);
        expect(await db.outbox.count()).toBe(1);

        await type('size', '5');
        await type('price', '3');
        expect(hintOf('size')).toBe('As printed on the label');
        await pressInDialog('Add container');
        await closed('the container form to close');
        expect(await db.containers.count()).toBe(1);
        await settle('the new row', () => amounts(materialId).includes('5 of 5 g'));
      });

      it('should refuse a currency that is not a three-letter code', async () => {
        const materialId = await material();
        await shown(materialId);

        await pressOnPage('add-container', materialId);
        await type('size', '500');
        await type('price', '40');
        await type('currency', 'E1');
        await pressInDialog('Add container');

        expect(hintOf('currency')).toBe('Currency must be a three-letter code such as EUR');
        expect(await db.containers.count()).toBe(0);
      });
    });

    describe('a container’s stock', () => {
      it('should record waste as an entry taking the amount off, costed at the container’s price', async () => {
        const materialId = await material();
        const containerId = await container(materialId);
        await shown(materialId);

        await containerAction(containerId, 'Record waste');
        await type('amount', '10');
        await type('note', 'Set in the cup');
        expect(inDialog('[data-field="after"]')).toBe('Leaves 490 g');
        expect(inDialog('[data-field="caution"]')).toContain('Let leftovers cure in the cup before disposal');
        await pressInDialog('Record waste');
        await closed('the waste form to close');

        // 10 g × 4000 cents ÷ 500 g = 80 cents.
        const [, wasted] = await entriesOf(containerId);
        expect(wasted).toEqual(
          jasmine.objectContaining({ kind: 'waste', quantity: -10, note: 'Set in the cup', costMinor: 80 }),
        );
        await settle('the new amount', () => cell(containerId, 'amount') === '490 of 500 g');
      });

      it('should refuse an amount of waste that is not a number, and write nothing', async () => {
        const materialId = await material();
        const containerId = await container(materialId);
        await shown(materialId);
        const before = await db.outbox.count();

        await containerAction(containerId, 'Record waste');
        await type('amount', 'a bit');
        await pressInDialog('Record waste');
        expect(hintOf('amount')).toBe('Amount must be a number');

        await type('amount', '-3');
        expect(hintOf('amount')).toBe('Amount must be more than 0');
        expect((await entriesOf(containerId)).length).toBe(1);
        expect(await db.outbox.count()).toBe(before);
      });

      it('should record a stocktake as the count less what was expected: 400 − 405.5 = −5.5 g', async () => {
        const { materialId, containerId } = await workedExample();
        await shown(materialId);

        await containerAction(containerId, 'Stocktake');
        expect(inDialog('[data-field="difference"]')).toBe('The shelf expects 405.5 g.');
        await type('counted', '400');
        expect(inDialog('[data-field="difference"]')).toBe('The shelf expects 405.5 g: this records −5.5 g.');
        await pressInDialog('Record count');
        await closed('the stocktake form to close');

        const counted = (await entriesOf(containerId)).find((entry) => entry.kind === 'stocktake');
        expect(counted?.quantity).toBe(-5.5);
        await settle('the counted amount', () => cell(containerId, 'amount') === '400 of 500 g');
      });

      it('should record a count above what was expected as a positive entry', async () => {
        const { materialId, containerId } = await workedExample();
        await shown(materialId);

        await containerAction(containerId, 'Stocktake');
        await type('counted', '410');
        // 410 − 405.5 = +4.5 g.
        expect(inDialog('[data-field="difference"]')).toBe('The shelf expects 405.5 g: this records +4.5 g.');
        await pressInDialog('Record count');
        await closed('the stocktake form to close');

        const counted = (await entriesOf(containerId)).find((entry) => entry.kind === 'stocktake');
        expect(counted?.quantity).toBe(4.5);
        await settle('the counted amount', () => cell(containerId, 'amount') === '410 of 500 g');
      });

      it('should refuse a negative count and write nothing', async () => {
        const { materialId, containerId } = await workedExample();
        await shown(materialId);

        await containerAction(containerId, 'Stocktake');
        await type('counted', '-1');
        await pressInDialog('Record count');

        expect(hintOf('counted')).toBe('Counted amount must be 0 or more');
        expect((await entriesOf(containerId)).some((entry) => entry.kind === 'stocktake')).toBeFalse();
      });

      it('should change the opened day and low-stock level of a container', async () => {
        const materialId = await material();
        const containerId = await container(materialId, { lowStockQty: 100 });
        await shown(materialId);
        await db.outbox.clear();

        await containerAction(containerId, 'Edit');
        expect(await valueOf('price')).toBe('40');
        await type('openedOn', '2025-03-01');
        await type('lowStock', '');
        await pressInDialog('Save changes');
        expect(hintOf('lowStock')).toBe(
          'Low-stock level cannot be emptied once set: type 0 to hear only when it is empty',
        );
        await type('lowStock', '500');
        await pressInDialog('Save changes');
        await closed('the container form to close');

        const [row] = await db.outbox.toArray();
        expect(row?.mutation).toEqual(
          jasmine.objectContaining({ type: 'container.patch', data: { openedOn: '2025-03-01', lowStockQty: 500 } }),
        );
        // 500 g left is at the new level of 500 g.
        await settle('low now', () => cell(containerId, 'stock-word') === 'low');
        expect(cell(containerId, 'dates')).toContain('Opened 1 Mar 2025');
      });
    });

    describe('deleting', () => {
      it('should delete a container only once confirmed', async () => {
        const { materialId, containerId } = await workedExample();
        await shown(materialId);

        await containerAction(containerId, 'Delete');
        expect(inDialog('[data-field="consequence"]')).toBe(
          `Part A of ${RESIN}, bought 1 Feb 2025, lot L-0211, with 405.5 of 500 g left, comes off the shelf. ` +
            'Pours already logged keep their amounts and costs.',
        );
        await pressInDialog('Keep it');
        await closed('the question to close');
        expect((await db.containers.get(containerId))?.deletedAt).toBeNull();

        await containerAction(containerId, 'Delete');
        await pressInDialog('Delete');
        await closed('the question to close');

        await eventually(
          () => db.containers.get(containerId),
          (row) => row?.deletedAt !== null,
          'the container deleted',
        );
        await settle('the row gone', () => rowOf(containerId) === null);
        expect(text(query(`[data-material="${materialId}"]`))).toContain('No container of it on the shelf yet.');
      });

      it('should delete a material with the containers on it', async () => {
        const materialId = await material();
        const containerId = await container(materialId);
        await shown(materialId);

        const menu = await loader.getHarness(MatMenuHarness.with({ selector: '[data-action="material-menu"]' }));
        await menu.clickItem({ text: 'Delete material' });
        await fixture.whenStable();
        expect(inDialog('[data-field="consequence"]')).toBe(
          `${RESIN} comes off the shelf. Its container goes with it. Pours already logged keep their amounts and costs.`,
        );
        await pressInDialog('Delete');
        await closed('the question to close');

        await settle('the empty shelf', () => query('[data-state="empty"]') !== null);
        expect((await db.containers.get(containerId))?.deletedAt).not.toBeNull();
        expect((await db.materials.get(materialId))?.deletedAt).not.toBeNull();
      });
    });
  });

  describe('for a viewer', () => {
    beforeEach(() => configure('viewer'));

    it('should show the shelf with no action at all', async () => {
      const { materialId, containerId } = await workedExample();
      await shown(materialId);

      expect(cell(containerId, 'amount')).toBe('405.5 of 500 g');
      expect(queryAll('[data-action]').length).toBe(0);
      expect(queryAll('button').length).toBe(0);
      expect(queryAll('th').map(text)).toEqual([
        'Part',
        'Bought on',
        'Lot',
        'Remaining',
        'Opened / use by',
        'Price per unit',
      ]);
    });

    it('should say the shelf is empty without offering to fill it', async () => {
      await render();
      await settle('the empty shelf', () => query('[data-state="empty"]') !== null);

      expect(text(query('[data-state="empty"] h2'))).toBe('The shelf of Tideway Bench Club is empty');
      expect(queryAll('button').length).toBe(0);
    });
  });

  describe('on a phone', () => {
    beforeEach(() => configure('builder', true));

    it('should stack a container’s details in one cell beside what is left', async () => {
      const { materialId, containerId } = await workedExample();
      await shown(materialId);

      expect(queryAll('th').map(text)).toEqual(['Container', 'Remaining', 'Actions']);
      const details = queryAll('[data-cell="container"] > span', rowOf(containerId)!).map(text);
      expect(details).toEqual([
        'Part A',
        'Bought 1 Feb 2025',
        'Lot L-0211',
        'Not opened',
        'No use-by date',
        '€0.08 / g',
      ]);
      expect(cell(containerId, 'amount')).toBe('405.5 of 500 g');
    });

    it('should fit the 358 px a 390 px wide phone leaves it, with no sideways scrolling', async () => {
      const materialId = await material();
      const containerId = await container(materialId, {
        lot: 'LOT-2025-0211-B',
        openedOn: '2025-02-03',
        useBy: '2026-08-31',
        lowStockQty: 600,
      });
      await shown(materialId);

      (fixture.nativeElement as HTMLElement).style.width = '358px';
      await fixture.whenStable();

      const section = query(`[data-material="${materialId}"]`)!;
      const scroller = query('.scroller')!;
      expect(cell(containerId, 'stock-word')).toBe('low');
      expect(scroller.scrollWidth).toBeLessThanOrEqual(scroller.clientWidth);
      expect(section.scrollWidth).toBeLessThanOrEqual(section.clientWidth);
      for (const button of queryAll('[data-action]', section)) {
        expect(button.getBoundingClientRect().height).toBeGreaterThanOrEqual(48);
      }
    });
  });

  describe('without a workshop', () => {
    it('should ask a modeller who is not signed in to sign in', async () => {
      configure('signed-out');
      await render();

      expect(query('[data-state="signed-out"]')).not.toBeNull();
      expect(queryAll('[data-action]').length).toBe(0);
    });
  });
});
