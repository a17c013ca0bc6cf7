// Loads the API with autocannon on 127.0.0.1 at 100 concurrent connections: the build log (a
// build's steps), the shelf, and logging a pour, each beside GET /api/health (one SELECT 1) measured
// in the same run as the baseline. Prints p50/p95/p99 latency and requests per second per route.
// Run with `npm run bench:api` (BENCH_SECONDS sets each route's duration, 10 by default). It uses a
// database of its own, seeded afresh: one workshop, a build with 200 steps, 10 materials with 5
// containers each (the tests' invented data sheet), and a production server process of its own
// without reminder workers.
import { writeRecords } from '../../server/records/unit-of-work.js';
import autocannon from 'autocannon';
import pg from 'pg';
import { v7 } from 'uuid';
import { createBuild, createStep } from '../../server/builds/build-service.js';
import { readConfig } from '../../server/config.js';
import { createContext } from '../../server/context-factory.js';
import { applyMigrations, openDatabase } from '../../server/db/database.js';
import { users } from '../../server/db/schema/index.js';
import { createContainer, createMaterial } from '../../server/shelf/shelf-service.js';
import { createWorkshop } from '../../server/workshops/workshop-service.js';
import { startAppServer } from '../../tests/e2e/support/app-server.js';
import { TEST_DATA_SHEET } from '../../tests/support/shelf.js';

const SECONDS = Number(process.env['BENCH_SECONDS'] ?? 10);
const CONNECTIONS = 100;

async function seed(url: string) {
  const database = openDatabase(url);
  await applyMigrations(database.db);
  const ctx = createContext({ ...readConfig(), logLevel: 'silent' }, database);
  const [user] = await ctx.db.insert(users).values({ email: 'load@benchtide.test', displayName: 'Load' }).returning();
  const userId = user!.id;
  const workshopId = (await createWorkshop(ctx.db, userId, 'Load bench')).id;
  const buildId = v7();
  await writeRecords(ctx, userId, workshopId, createBuild, {
    id: buildId,
    name: 'Load build',
    scaleRatio: 87.1,
    status: 'building',
    notes: '',
  });
  for (let i = 0; i < 200; i += 1) {
    await writeRecords(ctx, userId, workshopId, createStep, {
      id: v7(),
      buildId,
      kind: 'painting',
      title: `Step ${i}`,
      notes: 'Dry-brushed the rocks, then a wash.',
      happenedAt: new Date(Date.UTC(2026, 10, 1, 9, i)).toISOString(),
    });
  }
  let materialId = '';
  for (let m = 0; m < 10; m += 1) {
    materialId = v7();
    await writeRecords(ctx, userId, workshopId, createMaterial, {
      id: materialId,
      name: `Load resin ${m}`,
      kind: 'two-part-epoxy',
      dataSheet: TEST_DATA_SHEET,
      safetySheet: '',
    } as never);
    for (let c = 0; c < 5; c += 1) {
      await writeRecords(ctx, userId, workshopId, createContainer, {
        id: v7(),
        materialId,
        part: c % 2 === 0 ? 'A' : 'B',
        sizeQty: 10_000_000,
        unit: 'g',
        priceMinor: 4500,
        currency: 'EUR',
        boughtOn: '2026-10-01',
      } as never);
    }
  }
  const { cookie } = await ctx.sessions.create(userId);
  await database.pool.end();
  return { workshopId, buildId, materialId, cookie: cookie.split(';')[0]! };
}

const url = new URL(process.env['DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide');
const admin = new pg.Client({ connectionString: url.toString() });
await admin.connect();
await admin.query('DROP DATABASE IF EXISTS benchtide_bench_api WITH (FORCE)');
await admin.query('CREATE DATABASE benchtide_bench_api');
await admin.end();
url.pathname = '/benchtide_bench_api';
const seeded = await seed(url.toString());

const app = await startAppServer({ DATABASE_URL: url.toString(), LOG_LEVEL: 'silent', REMINDER_JOBS: 'off' });
const { origin } = app;

const w = `/api/workshops/${seeded.workshopId}`;
const headers = { cookie: seeded.cookie, origin, 'content-type': 'application/json' };
const pourBody = () =>
  JSON.stringify({
    id: v7(),
    buildId: seeded.buildId,
    materialId: seeded.materialId,
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    roomTempC: 20,
    startAt: '2026-11-20T18:00:00Z',
  });
const ROUTES: { name: string; method: 'GET' | 'POST'; path: string; body?: () => string; ok: number }[] = [
  { name: 'GET /api/health (baseline)', method: 'GET', path: '/api/health', ok: 200 },
  { name: 'GET build log (200 steps)', method: 'GET', path: `${w}/builds/${seeded.buildId}/steps`, ok: 200 },
  { name: 'GET shelf (10 × 5)', method: 'GET', path: `${w}/shelf`, ok: 200 },
  { name: 'POST pour', method: 'POST', path: `${w}/pours`, body: pourBody, ok: 201 },
];

interface Row {
  name: string;
  p50: number;
  p95: number;
  p99: number;
  rps: number;
  errors: number;
}
const rows: Row[] = [];
try {
  for (const route of ROUTES) {
    let wrong = 0;
    const result = await autocannon({
      url: origin,
      connections: CONNECTIONS,
      duration: SECONDS,
      requests: [
        {
          method: route.method,
          path: route.path,
          headers,
          setupRequest: (request) => (route.body ? { ...request, body: route.body() } : request),
          onResponse: (status) => {
            if (status !== route.ok) wrong += 1;
          },
        },
      ],
    });
    rows.push({
      name: route.name,
      p50: result.latency.p50,
      p95: percentile95(result),
      p99: result.latency.p99,
      rps: result.requests.average,
      errors: wrong + result.errors + result.timeouts,
    });
  }
} finally {
  await app.stop();
}

/** autocannon reports p90 and p97.5; p95 lies between them, taken here by straight-line interpolation. */
function percentile95(result: autocannon.Result): number {
  const { p90, p97_5 } = result.latency;
  return Math.round((p90 + ((p97_5 - p90) * (95 - 90)) / (97.5 - 90)) * 10) / 10;
}

const baseline = rows[0]!;
console.log(
  `API under load: ${CONNECTIONS} connections, ${SECONDS} s a route, 127.0.0.1 (p95 between autocannon's p90 and p97.5)`,
);
console.log('| route | p50 ms | p95 ms (≈) | p99 ms | req/s | × baseline p50 | wrong answers |');
console.log('|---|---:|---:|---:|---:|---:|---:|');
for (const row of rows) {
  const ratio = (row.p50 / Math.max(baseline.p50, 0.1)).toFixed(1);
  console.log(
    `| ${row.name} | ${row.p50} | ${row.p95} | ${row.p99} | ${Math.round(row.rps)} | ${ratio} | ${row.errors} |`,
  );
}
process.exit(rows.some((row) => row.errors > 0) ? 1 : 0);
