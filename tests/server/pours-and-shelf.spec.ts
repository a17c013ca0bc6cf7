import { addDays, formatISO } from 'date-fns';
import { parse } from 'csv-parse/sync';
import { v7 } from 'uuid';
import { USE_BY_NOTICE_DAYS } from '../../shared/shelf-warnings.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { makeRecords } from '../support/records.js';
import { addBuild, addContainer, addMaterial, api, pourBody, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

interface ContainerView {
  id: string;
  remainingQty: number;
  lowStock: boolean;
  useBySoon: boolean;
  expired: boolean;
}

async function remaining(client: Api, containerId: string): Promise<number> {
  const shelf = (await client.get('/shelf').expect(200)).body as { containers: ContainerView[] }[];
  return shelf.flatMap((material) => material.containers).find((container) => container.id === containerId)!
    .remainingQty;
}

describe('pours drawing on the shelf', () => {
  let server: TestServer;
  let client: Api;
  let buildId: string;
  let materialId: string;

  beforeEach(async () => {
    server ??= await testServer();
    const owner = await makeAccount(server.ctx, 'Ona');
    const workshop = await makeWorkshop(server.ctx, owner);
    client = api(server, owner, workshop.id);
    buildId = await addBuild(client);
    materialId = await addMaterial(client);
  });

  // Worked by hand: 20 mL of a 1:1-by-weight mix with part densities 1.1 and 0.9 g/mL weighs
  // 20 / (0.5/1.1 + 0.5/0.9) = 19.8 g (ideal mixing: the parts' volumes add, common practice), so 9.9 g of each part.
  it('should plan on the server, take 9.9 g of each part, and cost it from the container prices', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', sizeQty: 500, priceMinor: 2500 });
    const partB = await addContainer(client, materialId, { part: 'B', sizeQty: 500, priceMinor: 2000 });

    const pour = await client.post('/pours', pourBody(buildId, materialId)).expect(201);

    expect(pour.body.plan.volume.totalToMixMl).toBeCloseTo(20, 9);
    expect(pour.body.plan.mix.total.partAG).toBe(9.9);
    expect(await remaining(client, partA)).toBe(490.1);
    expect(await remaining(client, partB)).toBe(490.1);
    // 9.9 g × 2500/500 = 49.5 cents; 9.9 g × 2000/500 = 39.6 cents; 89.1 cents in all, rounded once to 89.
    const costs = (await client.get('/costs').expect(200)).body;
    expect(costs.byBuild).toEqual([{ key: buildId, label: 'Mill race', currency: 'EUR', costMinor: 89 }]);
  });

  it('should take the oldest container first and move on to the next', async () => {
    const older = await addContainer(client, materialId, {
      part: 'A',
      sizeQty: 5,
      priceMinor: 100,
      boughtOn: '2026-01-01',
    });
    const newer = await addContainer(client, materialId, { part: 'A', sizeQty: 500, boughtOn: '2026-06-01' });
    await addContainer(client, materialId, { part: 'B' });

    await client.post('/pours', pourBody(buildId, materialId)).expect(201);

    expect(await remaining(client, older)).toBe(0);
    expect(await remaining(client, newer)).toBe(495.1);
  });

  it('should refuse a pour the shelf cannot cover, writing nothing, unless told to record the shortfall', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', sizeQty: 5 });
    await addContainer(client, materialId, { part: 'B' });

    const refused = await client.post('/pours', pourBody(buildId, materialId)).expect(409);
    expect(refused.body.error.code).toBe('stock_short');
    expect(refused.body.error.message).toContain('5 g of part A; this pour needs 9.9 g');
    expect(await remaining(client, partA)).toBe(5);

    const recorded = await client
      .post('/pours', pourBody(buildId, materialId, { whenShort: 'record-shortfall' }))
      .expect(201);
    expect(recorded.body.shortfall).toEqual([{ part: 'A', quantityG: 4.9 }]);
    expect(await remaining(client, partA)).toBe(0);
  });

  it('should let two pours on the same container at the same moment both land, with exact stock', async () => {
    const partA = await addContainer(client, materialId, { part: 'A' });
    const partB = await addContainer(client, materialId, { part: 'B' });

    await Promise.all([
      client.post('/pours', pourBody(buildId, materialId)).expect(201),
      client.post('/pours', pourBody(buildId, materialId)).expect(201),
    ]);

    expect(await remaining(client, partA)).toBe(480.2);
    expect(await remaining(client, partB)).toBe(480.2);
  });

  it('should put the stock back when a pour is deleted', async () => {
    const partA = await addContainer(client, materialId, { part: 'A' });
    await addContainer(client, materialId, { part: 'B' });
    const pour = await client.post('/pours', pourBody(buildId, materialId)).expect(201);

    await client.delete(`/pours/${pour.body.id}`).expect(204);

    expect(await remaining(client, partA)).toBe(500);
    expect((await client.get('/costs')).body.byBuild).toEqual([]);
  });

  it('should convert grams into a container measured in millilitres by its part density', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', unit: 'mL', sizeQty: 250 });
    await addContainer(client, materialId, { part: 'B' });

    await client.post('/pours', pourBody(buildId, materialId)).expect(201);

    // 9.9 g of part A at 1.1 g/mL is 9 mL.
    expect(await remaining(client, partA)).toBe(241);
  });

  it('should refuse an impossible pour with the shared messages and write nothing', async () => {
    const partA = await addContainer(client, materialId, { part: 'A' });

    const response = await client.post('/pours', pourBody(buildId, materialId, { depthMm: -2 })).expect(400);

    expect(response.body.error.fields).toEqual({ depthMm: 'Depth must be more than 0 mm' });
    expect(await remaining(client, partA)).toBe(500);
  });

  it('should answer 404 for a build of another workshop', async () => {
    const stranger = await makeAccount(server.ctx, 'Pip');
    const theirs = api(server, stranger, (await makeWorkshop(server.ctx, stranger)).id);
    const theirBuild = await addBuild(theirs);

    await client.post('/pours', pourBody(theirBuild, materialId)).expect(404);
    await client.get(`/builds/${theirBuild}`).expect(404);
  });
});

describe('the shelf', () => {
  let server: TestServer;
  let client: Api;
  let materialId: string;

  beforeAll(async () => {
    server = await testServer();
    const owner = await makeAccount(server.ctx, 'Rex');
    client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    materialId = await addMaterial(client, { shelfLifeOpenedDays: 180 });
  });

  it('should keep what is not poured in its own measure, and refuse units and pours that do not fit', async () => {
    const foam = v7();
    await client
      .post('/materials', { id: foam, name: 'Blue foam board', kind: 'foam-and-boards', measure: 'area' })
      .expect(201);
    const sheet = await addContainer(client, foam, { part: 'single', sizeQty: 0.72, unit: 'm2', priceMinor: 1299 });
    expect(await remaining(client, sheet)).toBe(0.72);

    const grams = await client
      .post('/containers', {
        id: v7(),
        materialId: foam,
        part: 'single',
        sizeQty: 500,
        unit: 'g',
        priceMinor: 100,
        currency: 'EUR',
        boughtOn: '2026-10-01',
      })
      .expect(400);
    expect(grams.body.error.fields.unit).toBe('g is a weight, but this is measured as an area: choose m².');
    const noMeasure = await client
      .post('/materials', { id: v7(), name: 'Figures', kind: 'kits-figures-details' })
      .expect(400);
    expect(noMeasure.body.error.fields.measure).toContain('by weight, volume, pieces, length or area');
    const toLength = await client.patch(`/materials/${foam}`, { measure: 'length' }).expect(400);
    expect(toLength.body.error.message).toContain('Its containers on the shelf no longer fit');

    const buildId = await addBuild(client);
    const poured = await client.post('/pours', pourBody(buildId, foam)).expect(400);
    expect(poured.body.error.fields.materialId).toBe(
      'This material has no data sheet, so it cannot be poured: choose a pour material.',
    );
  });

  it('should record waste and a stocktake as ledger entries, and flag low stock', async () => {
    const container = await addContainer(client, materialId, { lowStockQty: 100 });

    await client.post(`/containers/${container}/waste`, { id: v7(), quantity: 12.5, note: 'skinned over' }).expect(201);
    expect(await remaining(client, container)).toBe(487.5);
    await client.post(`/containers/${container}/stocktake`, { id: v7(), countedQty: 80 }).expect(201);

    const shelf = (await client.get('/shelf')).body as { containers: ContainerView[] }[];
    const counted = shelf.flatMap((m) => m.containers).find((c) => c.id === container)!;
    expect(counted.remainingQty).toBe(80);
    expect(counted.lowStock).toBeTrue();
  });

  it('should flag a container past its use-by, counting shelf life from opening', async () => {
    const opened = await addContainer(client, materialId, { openedOn: '2025-01-10' });

    const shelf = (await client.get('/shelf')).body as { containers: (ContainerView & { useBy: string })[] }[];
    const entry = shelf.flatMap((m) => m.containers).find((c) => c.id === opened)!;

    // Opened 10 January 2025 with 180 days of shelf life: use by 9 July 2025 (counted by hand).
    expect(entry.useBy).toBe('2025-07-09');
    expect(entry.expired).toBeTrue();
  });

  it('should say a use-by is near when the device would, and not before', async () => {
    const day = (offset: number) => formatISO(addDays(server.clock.now(), offset), { representation: 'date' });
    const soon = await addContainer(client, materialId, { useBy: day(USE_BY_NOTICE_DAYS) });
    const later = await addContainer(client, materialId, { useBy: day(USE_BY_NOTICE_DAYS + 1) });

    const shelf = (await client.get('/shelf')).body as { containers: ContainerView[] }[];
    const flag = (id: string) => shelf.flatMap((m) => m.containers).find((c) => c.id === id)!.useBySoon;

    expect(flag(soon)).toBeTrue();
    expect(flag(later)).toBeFalse();
  });

  it('should keep the safety data sheet note when a change to a material leaves it out', async () => {
    const noted = await addMaterial(client, { safetySheet: 'Paper copy in the blue folder' });

    await client.patch(`/materials/${noted}`, { name: 'Clear resin, new lot' }).expect(200);

    const shelf = (await client.get('/shelf')).body as { id: string; safetySheet: string; name: string }[];
    expect(shelf.find((material) => material.id === noted)).toEqual(
      jasmine.objectContaining({ name: 'Clear resin, new lot', safetySheet: 'Paper copy in the blue folder' }),
    );
  });

  it('should refuse a container with an unknown currency code and store nothing', async () => {
    const response = await client.post('/containers', {
      id: v7(),
      materialId,
      part: 'A',
      sizeQty: 500,
      unit: 'g',
      priceMinor: 2500,
      currency: 'euro',
      boughtOn: '2026-10-01',
    });

    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ currency: 'Currency must be a three-letter code such as EUR' });
  });
});

describe('costs and exports', () => {
  it('should export the cost report as CSV that parses back to the same numbers', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Sid');
    const client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    const buildId = await addBuild(client, { name: 'Harbour, "east" quay' });
    const materialId = await addMaterial(client);
    await addContainer(client, materialId, { part: 'A', priceMinor: 2500 });
    await addContainer(client, materialId, { part: 'B', priceMinor: 2000 });
    await client.post('/pours', pourBody(buildId, materialId)).expect(201);

    const csv = await client
      .get('/costs.csv')
      .expect(200)
      .expect('Content-Type', /text\/csv/);
    const rows = parse(csv.text, { columns: true }) as Record<string, string>[];

    expect(rows).toContain(
      // 49.5 + 39.6 cents, rounded once (see the pour above)
      jasmine.objectContaining({ group: 'build', label: 'Harbour, "east" quay', cost_minor: '89', cost: '0.89' }),
    );
    expect(rows).toContain(jasmine.objectContaining({ group: 'total', currency: 'EUR', cost_minor: '89' }));
  });

  it('should write text a spreadsheet would run as a formula as plain text, and keep numbers numbers', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Vera');
    const client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    // OWASP "CSV Injection": cells starting with =, +, -, @, tab or carriage return run as formulas
    const planted = ['=HYPERLINK("https://example.org/x","open")', '+SUM(1,2)', '@SUM(A1)', '-2+3'];
    const buildIds: string[] = [];
    for (const name of planted) buildIds.push(await addBuild(client, { name, notes: `${name}\tmore` }));
    const materialId = await addMaterial(client, { name: '=1+1' });
    await addContainer(client, materialId, { part: 'A', priceMinor: 2500 });
    await addContainer(client, materialId, { part: 'B', priceMinor: 2000 });
    await client.post('/pours', pourBody(buildIds[0]!, materialId)).expect(201);

    const builds = parse((await client.get('/export/builds.csv').expect(200)).text, { columns: true }) as {
      name: string;
    }[];
    const costs = parse((await client.get('/costs.csv').expect(200)).text, { columns: true }) as Record<
      string,
      string
    >[];
    const ledger = parse((await client.get('/export/ledger.csv').expect(200)).text, { columns: true }) as {
      quantity: string;
    }[];

    expect(builds.map((row) => row.name).sort()).toEqual(planted.map((name) => `'${name}`).sort());
    expect(costs).toContain(jasmine.objectContaining({ group: 'build', label: `'${planted[0]}`, cost_minor: '89' }));
    expect(costs).toContain(jasmine.objectContaining({ group: 'material', label: "'=1+1" }));
    const draws = ledger.map((row) => row.quantity).filter((quantity) => quantity.startsWith('-'));
    expect(draws.length).toBeGreaterThan(0);
    for (const quantity of draws) expect(Number(quantity)).toBeLessThan(0);
  });

  it('should export the whole record as JSON and each table as CSV, to owners', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Tess');
    const client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    const buildId = await addBuild(client);

    const json = await client.get('/export.json').expect(200);
    const csv = await client.get('/export/builds.csv').expect(200);

    expect(json.body.tables.builds.map((b: { id: string }) => b.id)).toEqual([buildId]);
    expect((parse(csv.text, { columns: true }) as { id: string }[]).map((row) => row.id)).toEqual([buildId]);
    await client.get('/export/nothing.csv').expect(404);
  });

  it('should export the records of the photos, with the keys of their files in the photo store', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Oren');
    const workshopId = (await makeWorkshop(server.ctx, owner)).id;
    const { photoId } = await makeRecords(server.ctx, owner, workshopId);
    const client = api(server, owner, workshopId);

    const json = await client.get('/export.json').expect(200);
    const csv = await client.get('/export/photos.csv').expect(200);

    expect(json.body.tables.photos).toEqual([
      jasmine.objectContaining({ id: photoId, caption: 'Dry fit', displayKey: jasmine.stringContaining(photoId) }),
    ]);
    const rows = parse(csv.text, { columns: true }) as { id: string }[];
    expect(rows.map((row) => row.id)).toEqual([photoId]);
  });
});
