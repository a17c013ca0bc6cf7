import { sql } from 'drizzle-orm';
import { v7 } from 'uuid';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody } from '../support/shelf.js';
import { testServer } from '../support/test-app.js';

describe('the running sums of the stock book', () => {
  it('should equal the sums of the live ledger entries after pours, deletes, waste and stocktakes', async () => {
    const server = await testServer();
    const owner = await makeAccount(server.ctx, 'Uli');
    const workshop = await makeWorkshop(server.ctx, owner);
    const client = api(server, owner, workshop.id);
    const buildId = await addBuild(client);
    const materialId = await addMaterial(client);
    const partA = await addContainer(client, materialId, { part: 'A', priceMinor: 2999 });
    await addContainer(client, materialId, { part: 'B', unit: 'mL', priceMinor: 1777 });
    const pours: string[] = [];
    for (let i = 0; i < 6; i += 1) {
      const body = pourBody(buildId, materialId, { depthMm: 1 + i, startAt: `2026-0${1 + (i % 3)}-15T18:00:00Z` });
      pours.push((await client.post('/pours', body).expect(201)).body.id);
    }
    await client.delete(`/pours/${pours[2]}`).expect(204);
    await client.post(`/containers/${partA}/waste`, { id: v7(), quantity: 3.3 }).expect(201);
    await client.post(`/containers/${partA}/stocktake`, { id: v7(), countedQty: 400 }).expect(201);

    const stock = await server.ctx.db.execute(sql`
      SELECT s.container_id, s.remaining::text AS kept, COALESCE(sum(l.quantity), 0)::numeric(16,3)::text AS summed
      FROM container_stock s LEFT JOIN ledger_entries l ON l.container_id = s.container_id AND l.deleted_at IS NULL
      WHERE s.workshop_id = ${workshop.id} GROUP BY s.container_id, s.remaining`);
    const costs = await server.ctx.db.execute(sql`
      SELECT (SELECT sum(cost_minor) FROM cost_totals WHERE workshop_id = ${workshop.id})::bigint AS kept,
             (SELECT sum(cost_minor) FROM ledger_entries WHERE workshop_id = ${workshop.id}
                AND deleted_at IS NULL AND kind IN ('pour-use', 'waste'))::bigint AS summed`);

    expect(stock.rows.length).toBe(2);
    for (const row of stock.rows) expect(row['kept']).toBe(row['summed']);
    expect(costs.rows[0]!['kept']).toBe(costs.rows[0]!['summed']);
    expect(Number(costs.rows[0]!['kept'])).toBeGreaterThan(0);
  });
});
