import { sql } from 'drizzle-orm';
import request from 'supertest';
import { makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { makeRecords } from '../support/records.js';
import { testServer, type TestServer } from '../support/test-app.js';

const ID = '01a23480-c067-7052-80f4-c9235d8e0e8f';

/** The workshop's whole record, as a fingerprint to compare before and after a refused write. */
async function fingerprint(server: TestServer, workshopId: string): Promise<string> {
  const result = await server.ctx.db.execute(sql`
    SELECT (SELECT change_counter FROM workshops WHERE id = ${workshopId}) AS changes,
           (SELECT count(*) FROM builds WHERE workshop_id = ${workshopId}) AS builds,
           (SELECT count(*) FROM build_steps WHERE workshop_id = ${workshopId}) AS steps,
           (SELECT count(*) FROM materials WHERE workshop_id = ${workshopId}) AS materials,
           (SELECT count(*) FROM containers WHERE workshop_id = ${workshopId}) AS containers,
           (SELECT count(*) FROM ledger_entries WHERE workshop_id = ${workshopId}) AS entries,
           (SELECT count(*) FROM pours WHERE workshop_id = ${workshopId}) AS pours,
           (SELECT string_agg(caption, '|') FROM photos WHERE workshop_id = ${workshopId}) AS captions`);
  return JSON.stringify(result.rows[0]);
}

describe('bad input on every record write', () => {
  let server: TestServer;
  let owner: TestAccount;
  let workshopId: string;
  let records: Awaited<ReturnType<typeof makeRecords>>;

  beforeAll(async () => {
    server = await testServer();
    owner = await makeAccount(server.ctx, 'Vera');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
    records = await makeRecords(server.ctx, owner, workshopId);
  });

  const cases: readonly { route: string; body: (r: typeof records) => object; field: string; message: string }[] = [
    {
      route: 'POST /builds',
      body: () => ({ id: ID, name: 'Ford', scaleRatio: 0, status: 'planning' }),
      field: 'scaleRatio',
      message: 'Scale must be more than 0',
    },
    {
      route: 'POST /builds',
      body: () => ({ id: 'not-an-id', name: 'Ford', scaleRatio: 35, status: 'planning' }),
      field: 'id',
      message: 'Build must be an id made by the app',
    },
    {
      route: 'PATCH /builds/:build',
      body: () => ({ status: 'abandoned' }),
      field: 'status',
      message: 'Status must be planning, building or finished',
    },
    {
      route: 'POST /steps',
      body: (r) => ({ id: ID, buildId: r.buildId, kind: 'painting', title: '', happenedAt: '2026-11-01T10:00:00Z' }),
      field: 'title',
      message: 'Title is required',
    },
    {
      route: 'PATCH /steps/:step',
      body: () => ({ happenedAt: 'yesterday' }),
      field: 'happenedAt',
      message: 'When must be a date and time',
    },
    {
      route: 'POST /materials',
      body: () => ({ id: ID, name: 'Resin', kind: 'two-part-epoxy', dataSheet: {} }),
      field: 'dataSheet.mixRatio',
      message: 'Enter the mix ratio from the data sheet',
    },
    { route: 'PATCH /materials/:material', body: () => ({ name: '' }), field: 'name', message: 'Name is required' },
    {
      route: 'POST /containers',
      body: (r) => ({
        id: ID,
        materialId: r.materialId,
        part: 'C',
        sizeQty: 500,
        unit: 'g',
        priceMinor: 100,
        currency: 'EUR',
        boughtOn: '2026-10-01',
      }),
      field: 'part',
      message: 'Part must be A, B or single',
    },
    {
      route: 'PATCH /containers/:container',
      body: () => ({ priceMinor: 12.5 }),
      field: 'priceMinor',
      message: 'Price must be a whole number of cents',
    },
    {
      route: 'POST /containers/:container/waste',
      body: () => ({ id: ID, quantity: -4 }),
      field: 'quantity',
      message: 'Amount must be more than 0',
    },
    {
      route: 'POST /containers/:container/stocktake',
      body: () => ({ id: ID, countedQty: -1 }),
      field: 'countedQty',
      message: 'Counted amount must be 0 or more',
    },
    {
      route: 'POST /pours',
      body: (r) => ({
        id: ID,
        buildId: r.buildId,
        materialId: r.materialId,
        shape: { kind: 'circle', diameterMm: 0 },
        depthMm: 5,
        roomTempC: 20,
        startAt: '2026-11-20T18:00:00Z',
      }),
      field: 'shape.diameterMm',
      message: 'Diameter must be more than 0 mm',
    },
    {
      route: 'PATCH /photos/:photo',
      body: () => ({ caption: 'Gloss '.repeat(100) }),
      field: 'caption',
      message: 'Caption must be at most 500 characters',
    },
  ];

  for (const { route, body, field, message } of cases) {
    it(`should refuse ${route} with "${message}" and change nothing`, async () => {
      const [method, template] = route.split(' ') as [string, string];
      const path = template
        .replace(':build', records.buildId)
        .replace(':step', records.stepId)
        .replace(':material', records.materialId)
        .replace(':container', records.containerId)
        .replace(':photo', records.photoId);
      const before = await fingerprint(server, workshopId);

      const url = `/api/workshops/${workshopId}${path}`;
      const call = method === 'POST' ? request(server.app).post(url) : request(server.app).patch(url);
      const response = await call.set('Cookie', owner.cookie).send(body(records));

      expect(response.status).toBe(400);
      expect(response.body.error.fields[field]).toBe(message);
      expect(await fingerprint(server, workshopId)).toBe(before);
    });
  }
});
