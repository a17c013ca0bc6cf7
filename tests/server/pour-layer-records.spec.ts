import { eq } from 'drizzle-orm';
import { v7 } from 'uuid';
import { ledgerEntries, pourLayers, reminders } from '../../server/db/schema/index.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody, type Api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

const MIN = 60_000;

interface ContainerView {
  id: string;
  remainingQty: number;
}

// TEST_DATA_SHEET (tests/support/shelf.ts, invented): 1:1 by weight, part densities 1.1 and 0.9 g/mL,
// recoat from 240 min at 20 °C, at most 10 mm a layer. A 100 × 50 mm pour 20 mm deep is two layers.
describe('layers of a pour as recorded', () => {
  let server: TestServer;
  let client: Api;
  let buildId: string;
  let materialId: string;
  let startMs: number;

  beforeAll(async () => {
    server = await testServer();
  });

  beforeEach(async () => {
    const owner = await makeAccount(server.ctx, 'Fionn');
    const workshop = await makeWorkshop(server.ctx, owner);
    client = api(server, owner, workshop.id);
    buildId = await addBuild(client);
    materialId = await addMaterial(client);
    startMs = server.clock.now().getTime() - 600 * MIN;
  });

  async function remaining(containerId: string): Promise<number> {
    const shelf = (await client.get('/shelf').expect(200)).body as { containers: ContainerView[] }[];
    return shelf.flatMap((material) => material.containers).find((container) => container.id === containerId)!
      .remainingQty;
  }

  async function logPour(fields: object = {}) {
    const body = pourBody(buildId, materialId, { depthMm: 20, startAt: new Date(startMs).toISOString(), ...fields });
    const answer = await client.post('/pours', body).expect(201);
    return { id: body.id, pour: answer.body };
  }

  const layerBody = (pourId: string, number: number, atMin: number, fields: object = {}) => ({
    id: v7(),
    pourId,
    number,
    pouredAt: new Date(startMs + atMin * MIN).toISOString(),
    roomTempC: 20,
    ...fields,
  });

  it('should write layer 1 with the pour, under the pour’s id, with the layers planned', async () => {
    await addContainer(client, materialId, { part: 'A' });
    await addContainer(client, materialId, { part: 'B' });
    const { id, pour } = await logPour();
    expect(pour.layerCount).toBe(2);
    const layers = (await client.get(`/pours/${id}/layers`).expect(200)).body;
    expect(layers.length).toBe(1);
    expect(layers[0]).toEqual(
      jasmine.objectContaining({ id, pourId: id, number: 1, depthMm: 10, weighedAG: null, weighedBG: null }),
    );
    expect(Date.parse(layers[0].pouredAt)).toBe(startMs);
  });

  // Worked by hand: both layers weighed, so the pour takes 25.0 + 24.0 = 49.0 g of part A and
  // 24.6 + 24.4 = 49.0 g of part B; part B's container is measured by volume, 49.0 / 0.9 = 54.444 mL.
  it('should draw the stock again from what was weighed, to the gram', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', sizeQty: 500, unit: 'g' });
    const partB = await addContainer(client, materialId, { part: 'B', sizeQty: 500, unit: 'mL' });
    const { id } = await logPour();
    await client.patch(`/layers/${id}`, { weighedAG: 25, weighedBG: 24.6 }).expect(200);
    await client.post('/layers', layerBody(id, 2, 250, { weighedAG: 24, weighedBG: 24.4 })).expect(201);

    expect(await remaining(partA)).toBe(451);
    expect(await remaining(partB)).toBe(445.556);
    const uses = await server.ctx.db.select().from(ledgerEntries).where(eq(ledgerEntries.pourId, id));
    expect(
      uses
        .filter((use) => use.deletedAt === null)
        .map((use) => use.quantity)
        .sort((a, b) => a - b),
    ).toEqual([-54.444, -49]);
  });

  it('should keep the first of two devices recording the same layer and tell the second when', async () => {
    await addContainer(client, materialId, { part: 'A' });
    await addContainer(client, materialId, { part: 'B' });
    const { id } = await logPour();
    const first = layerBody(id, 2, 250);
    await client.post('/layers', first).expect(201);
    const second = await client.post('/layers', layerBody(id, 2, 270)).expect(409);

    expect(second.body.error.code).toBe('layer_already_poured');
    const kept = new Date(startMs + 250 * MIN).toISOString().slice(11, 16);
    expect(second.body.error.message).toContain(`Layer 2 was already recorded as poured at`);
    expect(second.body.error.message).toContain(`${kept} UTC`);
    const layers = (await client.get(`/pours/${id}/layers`).expect(200)).body;
    expect(layers.map((layer: { id: string }) => layer.id)).toEqual([id, first.id]);
  });

  it('should refuse each bad layer in plain words and change nothing', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', sizeQty: 60 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 500 });
    const { id } = await logPour({ layerCount: 3 });
    const second = layerBody(id, 2, 250);
    await client.post('/layers', second).expect(201);
    const state = async () => ({
      layers: (await client.get(`/pours/${id}/layers`).expect(200)).body,
      pour: (await client.get(`/pours/${id}`).expect(200)).body,
      stock: await remaining(partA),
      reminders: await server.ctx.db.select().from(reminders).where(eq(reminders.pourId, id)),
    });
    const before = await state();

    const refusals: [Promise<{ body: { error: { code: string; message: string; fields?: object } } }>, string][] = [
      [client.post('/layers', layerBody(id, 4, 500)).expect(400), 'This pour has 3 layers'],
      [client.post('/layers', layerBody(id, 2, 500)).expect(409), 'already recorded'],
      [client.post('/layers', layerBody(id, 3, 200)).expect(400), 'cannot go on before layer 2'],
      [client.post('/layers', layerBody(id, 3, 600 + 61)).expect(400), 'more than an hour from now'],
      // 60 g of part A on the shelf: two layers of about 16.5 g and 40 g more do not fit.
      [client.post('/layers', layerBody(id, 3, 500, { weighedAG: 40, weighedBG: 40 })).expect(409), 'The shelf holds'],
      [
        client.patch(`/layers/${second.id}`, { pouredAt: new Date(startMs - MIN).toISOString() }).expect(400),
        'before layer 1',
      ],
      [
        client.patch(`/layers/${id}`, { pouredAt: new Date(startMs + MIN).toISOString() }).expect(400),
        'Layer 1 goes on',
      ],
      [client.delete(`/layers/${id}`).expect(409), 'delete the pour'],
      [client.patch(`/pours/${id}`, { layerCount: 1 }).expect(400), 'cannot have fewer'],
    ];
    for (const [answer, words] of refusals) expect((await answer).body.error.message).toContain(words);
    expect(await state()).toEqual(before);
  });

  it('should refuse taking back a layer under another, and a layer of a deleted pour', async () => {
    await addContainer(client, materialId, { part: 'A' });
    await addContainer(client, materialId, { part: 'B' });
    const { id } = await logPour({ layerCount: 3 });
    const second = layerBody(id, 2, 250);
    await client.post('/layers', second).expect(201);
    await client.post('/layers', layerBody(id, 3, 500)).expect(201);
    const under = await client.delete(`/layers/${second.id}`).expect(409);
    expect(under.body.error.message).toBe('Layer 3 is on top of layer 2: take back layer 3 first.');

    await client.delete(`/pours/${id}`).expect(204);
    const gone = await client.post('/layers', layerBody(id, 4, 550)).expect(404);
    expect(gone.body.error.message).toContain('This pour was deleted');
  });

  it('should re-plan the layers to come when the count changes, and refuse too few', async () => {
    await addContainer(client, materialId, { part: 'A' });
    await addContainer(client, materialId, { part: 'B' });
    const { id } = await logPour();
    const refused = await client.patch(`/pours/${id}`, { layerCount: 1 }).expect(400);
    // 20 mm in two layers of 10 mm: 10 mm is still to pour after layer 1.
    expect(refused.body.error.fields.layerCount).toContain('10 mm is still to pour');

    const replanned = await client.patch(`/pours/${id}`, { layerCount: 3 }).expect(200);
    expect(replanned.body.layerCount).toBe(3);
    await client.post('/layers', layerBody(id, 2, 250)).expect(201);
    const third = await client.post('/layers', layerBody(id, 3, 500)).expect(201);
    // The 10 mm left after layer 1, split in two.
    expect(third.body.depthMm).toBe(5);
    const keys = (await server.ctx.db.select().from(reminders).where(eq(reminders.pourId, id)))
      .filter((row) => row.cancelledAt === null)
      .map((row) => row.key)
      .sort();
    expect(keys).toEqual(['demould', 'full-cure']);
  });

  it('should put the stock back and tombstone the layers when the pour is deleted', async () => {
    const partA = await addContainer(client, materialId, { part: 'A', sizeQty: 500 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 500 });
    const { id } = await logPour();
    await client.post('/layers', layerBody(id, 2, 250, { weighedAG: 30, weighedBG: 30 })).expect(201);
    expect(await remaining(partA)).toBeLessThan(500);

    await client.delete(`/pours/${id}`).expect(204);

    expect(await remaining(partA)).toBe(500);
    const layers = await server.ctx.db.select().from(pourLayers).where(eq(pourLayers.pourId, id));
    expect(layers.length).toBe(2);
    expect(layers.every((layer) => layer.deletedAt !== null)).toBeTrue();
  });
});
