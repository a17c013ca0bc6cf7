// Times a push of 1,000 queued mutations and a pull of 10,000 changes through the real sync
// services, beside inserting the same rows straight into PostgreSQL, and prints the ratios.
// Run with `npm run bench:sync`. It uses a database of its own, made afresh each run.
import { changeType } from '../../shared/record-kinds.js';
import { sql } from 'drizzle-orm';
import { performance } from 'node:perf_hooks';
import pg from 'pg';
import { v7 } from 'uuid';
import { MAX_PUSH } from '../../shared/sync-schemas.js';
import { readConfig } from '../../server/config.js';
import { createContext } from '../../server/context-factory.js';
import { applyMigrations, openDatabase } from '../../server/db/database.js';
import { users } from '../../server/db/schema/index.js';
import { pull } from '../../server/sync/pull-service.js';
import { push } from '../../server/sync/push-service.js';
import { createWorkshop } from '../../server/workshops/workshop-service.js';

const PUSHED = 1_000;
const PULLED = 10_000;
const PUSH_TARGET_RATIO = 2.5;
const ROUNDS = 3;

const url = new URL(process.env['DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide');
const admin = new pg.Client({ connectionString: url.toString() });
await admin.connect();
await admin.query('DROP DATABASE IF EXISTS benchtide_bench_sync WITH (FORCE)');
await admin.query('CREATE DATABASE benchtide_bench_sync');
await admin.end();
url.pathname = '/benchtide_bench_sync';
const database = openDatabase(url.toString());
await applyMigrations(database.db);
const ctx = createContext({ ...readConfig(), logLevel: 'silent' }, database);
const [user] = await ctx.db.insert(users).values({ email: 'sync@benchtide.test', displayName: 'Sync' }).returning();

const build = (name: string) => ({ id: v7(), name, scaleRatio: 87.1, status: 'building' as const, notes: '' });

async function timed(run: () => Promise<unknown>): Promise<number> {
  const started = performance.now();
  await run();
  return performance.now() - started;
}

// Push and raw inserts take turns, ROUNDS times, each on a workshop of its own; the medians are
// compared, so one slow round (a checkpoint, the machine busy) does not decide the ratio.
async function pushOnce(round: number): Promise<number> {
  const pushWorkshop = await createWorkshop(ctx.db, user!.id, `Push bench ${round}`);
  const mutations = Array.from({ length: PUSHED }, (_, i) => ({
    type: changeType('build', 'create'),
    mutationId: v7(),
    data: build(`Pushed ${i}`),
  }));
  return timed(async () => {
    for (let i = 0; i < mutations.length; i += MAX_PUSH) {
      const answer = await push(ctx, user!.id, pushWorkshop.id, mutations.slice(i, i + MAX_PUSH));
      if (answer.results.some((result) => result.status !== 'applied'))
        throw new Error('a benchmark change was refused');
    }
  });
}

// Raw inserts of the same rows a push writes (each record and the record of its change), in the
// same batches, one transaction each.
async function rawOnce(round: number): Promise<number> {
  const rawWorkshop = await createWorkshop(ctx.db, user!.id, `Raw bench ${round}`);
  const rows = Array.from({ length: PUSHED }, (_, i) => build(`Raw ${i}`));
  return timed(async () => {
    for (let i = 0; i < rows.length; i += MAX_PUSH) {
      await ctx.db.transaction(async (tx) => {
        for (const row of rows.slice(i, i + MAX_PUSH)) {
          await tx.execute(sql`INSERT INTO builds (id, workshop_id, name, scale_ratio, status, notes, change_number)
            VALUES (${row.id}, ${rawWorkshop.id}, ${row.name}, ${row.scaleRatio}, ${row.status}, '', ${i + 1})`);
          await tx.execute(sql`INSERT INTO pushed_mutations (mutation_id, workshop_id, user_id, result)
            VALUES (${v7()}, ${rawWorkshop.id}, ${user!.id}, ${JSON.stringify({ status: 'applied' })}::jsonb)`);
        }
      });
    }
  });
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
const pushRounds: number[] = [];
const rawRounds: number[] = [];
for (let round = 0; round < ROUNDS; round += 1) {
  rawRounds.push(await rawOnce(round));
  pushRounds.push(await pushOnce(round));
}
const pushMs = median(pushRounds);
const rawMs = median(rawRounds);

// Pull: 10,000 changes in pages of 1,000, beside a plain select of the same rows.
const pullWorkshop = await createWorkshop(ctx.db, user!.id, 'Pull bench');
await ctx.db.execute(sql`
  INSERT INTO builds (id, workshop_id, name, scale_ratio, status, notes, change_number)
  SELECT gen_random_uuid(), ${pullWorkshop.id}, 'Pulled ' || n, 87.1, 'building', '', n FROM generate_series(1, ${PULLED}) AS n`);
await ctx.db.execute(sql`UPDATE workshops SET change_counter = ${PULLED} WHERE id = ${pullWorkshop.id}`);
await ctx.db.execute(sql`ANALYZE`);
let pulledCount = 0;
const pullMs = await timed(async () => {
  let cursor = 0;
  for (;;) {
    const page = await pull(ctx, user!.id, pullWorkshop.id, cursor, 1000);
    if (page.startOver) throw new Error('the benchmark pull was told to start over');
    pulledCount += page.changes.length;
    cursor = page.cursor;
    if (!page.more) break;
  }
});
if (pulledCount !== PULLED) throw new Error(`pulled ${pulledCount} changes, not ${PULLED}`);
const selectMs = await timed(() =>
  ctx.db.execute(sql`SELECT * FROM builds WHERE workshop_id = ${pullWorkshop.id} ORDER BY change_number`),
);

await database.pool.end();
const pushRatio = pushMs / rawMs;
console.log(
  `push ${PUSHED} mutations: ${pushMs.toFixed(0)} ms; raw inserts of the same rows: ${rawMs.toFixed(0)} ms (medians of ${ROUNDS}); ratio ${pushRatio.toFixed(2)} (target within ${PUSH_TARGET_RATIO}x)`,
);
console.log(
  `pull ${PULLED} changes: ${pullMs.toFixed(0)} ms; one plain select of the same rows: ${selectMs.toFixed(0)} ms; ratio ${(pullMs / selectMs).toFixed(2)}`,
);
process.exitCode = pushRatio <= PUSH_TARGET_RATIO ? 0 : 1;
