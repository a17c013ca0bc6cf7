import { applyMigrations, openDatabase, type DatabaseHandle } from '../../server/db/database.js';

export const TEST_DATABASE_URL =
  process.env['TEST_DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide_test';

let handle: Promise<DatabaseHandle> | undefined;

/** The run's own database, migrated once; `npm test` creates it fresh for every run. */
export function testDatabase(): Promise<DatabaseHandle> {
  handle ??= (async () => {
    const opened = openDatabase(TEST_DATABASE_URL);
    await applyMigrations(opened.db);
    return opened;
  })();
  return handle;
}

export async function closeTestDatabase(): Promise<void> {
  if (!handle) return;
  const opened = await handle;
  handle = undefined;
  await opened.pool.end();
}
