// Fills a workshop with 100,000 pours and times the cost report and the shelf query.
// Run with `npm run bench:costs` (PostgreSQL must be running: `npm run db:start`).
// It uses a database of its own, made afresh each run, and prints the median of several runs.
import { writeRecords } from '../../server/records/unit-of-work.js';
import { sql } from 'drizzle-orm';
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { v7 } from 'uuid';
import { planPour } from '../../shared/pour-plan.js';
import { findMaterialPreset } from '../../shared/material-presets.js';
import { readConfig } from '../../server/config.js';
import { createContext } from '../../server/context-factory.js';
import { costReport } from '../../server/costs/cost-service.js';
import { applyMigrations, openDatabase } from '../../server/db/database.js';
import { users } from '../../server/db/schema/index.js';
import { createBuild } from '../../server/builds/build-service.js';
import { createContainer, createMaterial } from '../../server/shelf/shelf-service.js';
import { shelfOf } from '../../server/shelf/shelf-view.js';
import { createWorkshop } from '../../server/workshops/workshop-service.js';

const POURS = Number(process.env['BENCH_POURS'] ?? 100_000);
const RUNS = Number(process.env['BENCH_RUNS'] ?? 7);
const BUILDS = 40;
const TARGET_MS = 100;

const baseUrl = new URL(process.env['DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide');
const admin = new pg.Client({ connectionString: baseUrl.toString() });
await admin.connect();
await admin.query('DROP DATABASE IF EXISTS benchtide_bench WITH (FORCE)');
await admin.query('CREATE DATABASE benchtide_bench');
await admin.end();
baseUrl.pathname = '/benchtide_bench';

const database = openDatabase(baseUrl.toString());
await applyMigrations(database.db);
const ctx = createContext({ ...readConfig(), logLevel: 'silent' }, database);
const [user] = await ctx.db.insert(users).values({ email: 'bench@benchtide.test', displayName: 'Bench' }).returning();
const workshop = await createWorkshop(ctx.db, user!.id, 'Benchmark workshop');
const dataSheet = findMaterialPreset('coating-epoxy')!.dataSheet;
const materialId = v7();
await writeRecords(ctx, user!.id, workshop.id, createMaterial, {
  id: materialId,
  name: 'Bench resin',
  kind: 'two-part-epoxy',
  dataSheet,
  measure: null,
  safetySheet: '',
});
const containerIds = { A: v7(), B: v7() };
for (const part of ['A', 'B'] as const) {
  await writeRecords(ctx, user!.id, workshop.id, createContainer, {
    id: containerIds[part],
    materialId,
    part,
    sizeQty: 10_000_000,
    unit: 'g',
    priceMinor: 5_000_000,
    currency: 'EUR',
    boughtOn: '2024-01-01',
  });
}
const buildIds: string[] = [];
for (let i = 0; i < BUILDS; i += 1) {
  const id = v7();
  buildIds.push(id);
  await writeRecords(ctx, user!.id, workshop.id, createBuild, {
    id,
    name: `Build ${i + 1}`,
    scaleRatio: 87.1,
    status: 'building',
    notes: '',
  });
}

const planned = planPour({
  shape: { kind: 'rectangle', lengthMm: 120, widthMm: 45 },
  depthMm: 3,
  material: dataSheet,
  roomTempC: 20,
  startAtMs: 0,
  scaleResolutionG: 0.1,
});
if (!planned.ok) throw new Error('the benchmark pour does not plan');
const { request, ...plan } = planned.plan;
console.log(`filling: ${POURS} pours with two stock uses each…`);
const filled = performance.now();
// Set-based inserts: the point is to time the reports, not to wait for 100,000 round trips.
await ctx.db.execute(sql`
  INSERT INTO pours (id, workshop_id, build_id, material_id, start_at, request, plan, change_number)
  SELECT gen_random_uuid(), ${workshop.id}, (${sql.raw(`ARRAY['${buildIds.join("','")}']::uuid[]`)})[1 + n % ${BUILDS}], ${materialId},
         now() - (n || ' minutes')::interval, ${JSON.stringify(request)}::jsonb, ${JSON.stringify(plan)}::jsonb, 1000 + n
  FROM generate_series(1, ${POURS}) AS n`);
// The per-row triggers that keep the running sums are paused for the bulk load, and the sums
// are rebuilt set-based afterwards; the rebuilt sums are checked against the ledger below.
await ctx.db.execute(sql`ALTER TABLE ledger_entries DISABLE TRIGGER ledger_entries_rollup`);
await ctx.db.execute(sql`
  INSERT INTO ledger_entries (id, workshop_id, container_id, kind, quantity, cost_minor, at, pour_id, change_number)
  SELECT gen_random_uuid(), p.workshop_id, c.id, 'pour-use', -8.1, 4, p.start_at, p.id, p.change_number
  FROM pours p CROSS JOIN (VALUES (${containerIds.A}::uuid), (${containerIds.B}::uuid)) AS c(id)
  WHERE p.workshop_id = ${workshop.id}`);
await ctx.db.execute(sql`ALTER TABLE ledger_entries ENABLE TRIGGER ledger_entries_rollup`);
await ctx.db.execute(sql`DELETE FROM container_stock WHERE workshop_id = ${workshop.id}`);
await ctx.db.execute(sql`DELETE FROM cost_totals WHERE workshop_id = ${workshop.id}`);
await ctx.db.execute(sql`
  INSERT INTO container_stock (container_id, workshop_id, remaining)
  SELECT container_id, workshop_id, sum(quantity) FROM ledger_entries
  WHERE workshop_id = ${workshop.id} AND deleted_at IS NULL GROUP BY container_id, workshop_id`);
await ctx.db.execute(sql`
  INSERT INTO cost_totals (workshop_id, build_id, material_id, month, currency, cost_minor)
  SELECT l.workshop_id, p.build_id, c.material_id, date_trunc('month', l.at AT TIME ZONE 'UTC')::date, c.currency, sum(l.cost_minor)
  FROM ledger_entries l JOIN pours p ON p.id = l.pour_id JOIN containers c ON c.id = l.container_id
  WHERE l.workshop_id = ${workshop.id} AND l.deleted_at IS NULL AND l.kind = 'pour-use'
  GROUP BY 1, 2, 3, 4, 5`);
await ctx.db.execute(sql`ANALYZE`);
console.log(`filled in ${((performance.now() - filled) / 1000).toFixed(1)} s`);

async function median(label: string, run: () => Promise<unknown>): Promise<number> {
  await run(); // warm the caches once; the figure is for a workshop in daily use
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const started = performance.now();
    await run();
    times.push(performance.now() - started);
  }
  times.sort((a, b) => a - b);
  const middle = times[Math.floor(times.length / 2)]!;
  console.log(
    `${label}: median ${middle.toFixed(1)} ms over ${RUNS} runs (min ${times[0]!.toFixed(1)}, max ${times.at(-1)!.toFixed(1)}) ${middle < TARGET_MS ? 'within' : 'OVER'} the ${TARGET_MS} ms target`,
  );
  return middle;
}

const expectedCost = 4 * 2 * POURS;
const reported = await costReport(ctx, user!.id, workshop.id);
if (reported.total[0]?.costMinor !== expectedCost)
  throw new Error(`the cost report says ${reported.total[0]?.costMinor}, not ${expectedCost}`);
const report = await median('cost report', () => costReport(ctx, user!.id, workshop.id));
const shelf = await median('shelf query', () => shelfOf(ctx, user!.id, workshop.id));
await database.pool.end();
process.exitCode = report < TARGET_MS && shelf < TARGET_MS ? 0 : 1;
