import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import pg from 'pg';
import { openDatabase, type DatabaseHandle } from '../../server/db/database.js';
import { makeAccount, makeWorkshop } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody } from '../support/shelf.js';
import { testServer } from '../support/test-app.js';
import { TEST_DATABASE_URL } from '../support/test-database.js';

const EXACT_COSTS = '0009_exact_costs';
/** Migrations after it that only add what today's code writes, each safe to run twice. */
const LATER_COLUMNS = ['0010_materials_beyond_pours.sql'];

/** The migrations as they stood before `tag`: a copy of the folder whose journal stops short of it. */
function migrationsBefore(tag: string): string {
  const folder = mkdtempSync(join(tmpdir(), 'benchtide-migrations-'));
  cpSync(resolve('drizzle'), folder, { recursive: true });
  const journalPath = join(folder, 'meta', '_journal.json');
  const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: { tag: string }[] };
  const stop = journal.entries.findIndex((entry) => entry.tag === tag);
  if (stop < 0) throw new Error(`No migration ${tag}`);
  writeFileSync(journalPath, JSON.stringify({ ...journal, entries: journal.entries.slice(0, stop) }));
  return folder;
}

describe('the exact-costs migration', () => {
  const name = `benchtide_migration_${process.pid}`;
  let admin: pg.Client;
  let handle: DatabaseHandle;
  let before: string;

  beforeAll(async () => {
    admin = new pg.Client({ connectionString: TEST_DATABASE_URL });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS ${name}`);
    await admin.query(`CREATE DATABASE ${name}`);
    handle = openDatabase(TEST_DATABASE_URL.replace(/\/[^/]+$/, `/${name}`));
    before = migrationsBefore(EXACT_COSTS);
  });

  afterAll(async () => {
    await handle.pool.end();
    await admin.query(`DROP DATABASE IF EXISTS ${name}`);
    await admin.end();
    rmSync(before, { recursive: true, force: true });
  });

  it('should keep the cost of every entry and total written in whole cents, and take exact ones after', async () => {
    await migrate(handle.db, { migrationsFolder: before });
    // Today's code writes the columns later migrations add (their statements run again harmlessly after).
    for (const later of LATER_COLUMNS) await handle.pool.query(readFileSync(resolve('drizzle', later), 'utf8'));
    const server = await testServer({}, handle);
    const owner = await makeAccount(server.ctx, 'Ines');
    const client = api(server, owner, (await makeWorkshop(server.ctx, owner)).id);
    const buildId = await addBuild(client);
    const materialId = await addMaterial(client);
    // 10 cents a gram, so the 9.9 g of each part cost a whole 99 cents, as the old columns held them
    await addContainer(client, materialId, { part: 'A', sizeQty: 500, priceMinor: 5000 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 500, priceMinor: 5000 });
    await client.post('/pours', pourBody(buildId, materialId)).expect(201);
    const costsBefore = (await client.get('/costs').expect(200)).body;

    await migrate(handle.db, { migrationsFolder: resolve('drizzle') });

    const entries = await handle.pool.query<{ cost: string }>(
      `SELECT cost_minor::text AS cost FROM ledger_entries WHERE kind = 'pour-use' ORDER BY cost_minor`,
    );
    expect(entries.rows.map((row) => Number(row.cost))).toEqual([99, 99]);
    expect((await client.get('/costs').expect(200)).body).toEqual(costsBefore);
    expect(costsBefore.total).toEqual([{ key: 'EUR', label: 'EUR', currency: 'EUR', costMinor: 198 }]);

    // After: a use of part B at 3 cents a gram, 9.9 g x 1500 / 500 = 29.7 cents, kept exact by the trigger
    await addContainer(client, materialId, { part: 'B', sizeQty: 500, priceMinor: 1500, boughtOn: '2020-01-01' });
    await client.post('/pours', pourBody(buildId, materialId)).expect(201);
    const totals = await handle.pool.query<{ cost: string }>(`SELECT sum(cost_minor)::text AS cost FROM cost_totals`);
    // 198 + 99 (part A, 10 cents a gram) + 29.7 (part B from the older, cheaper container)
    expect(Number(totals.rows[0]!.cost)).toBe(326.7);
    expect((await client.get('/costs').expect(200)).body.total[0].costMinor).toBe(327);
  });
});
