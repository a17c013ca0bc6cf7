import pg from 'pg';
import { applyMigrations, openDatabase } from '../../server/db/database.js';
import { startReminderJobs } from '../../server/reminders/reminder-jobs.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { TEST_DATABASE_URL } from '../support/test-database.js';

// Every API process sets the reminder queues up as it starts. On a fresh database, with the
// processes starting together (a first deploy), that used to deadlock inside pg-boss and the
// losing process exited.
describe('reminder queues on a fresh database', () => {
  const ROUNDS = 3;
  let server: TestServer;
  const admin = new pg.Client({ connectionString: TEST_DATABASE_URL });
  const fresh = new URL(TEST_DATABASE_URL);
  fresh.pathname = '/benchtide_test_queue_setup';

  beforeAll(async () => {
    server = await testServer();
    await admin.connect();
  });

  afterAll(async () => {
    await admin.query(`DROP DATABASE IF EXISTS ${fresh.pathname.slice(1)} WITH (FORCE)`);
    await admin.end();
  });

  it(`should let three processes starting at once all start (${ROUNDS} fresh databases)`, async () => {
    for (let round = 0; round < ROUNDS; round += 1) {
      await admin.query(`DROP DATABASE IF EXISTS ${fresh.pathname.slice(1)} WITH (FORCE)`);
      await admin.query(`CREATE DATABASE ${fresh.pathname.slice(1)}`);
      const handles = [0, 1, 2].map(() => openDatabase(fresh.toString()));
      await applyMigrations(handles[0]!.db);
      const config = { ...server.ctx.config, databaseUrl: fresh.toString() };
      const started = await Promise.allSettled(
        handles.map((handle) => startReminderJobs({ ...server.ctx, config, db: handle.db, pool: handle.pool })),
      );
      for (const result of started) if (result.status === 'fulfilled') await result.value.stop();
      for (const handle of handles) await handle.pool.end();
      const failures = started.flatMap((result) => (result.status === 'rejected' ? [String(result.reason)] : []));
      expect(failures)
        .withContext(`round ${round + 1}`)
        .toEqual([]);
    }
  }, 120_000);
});
