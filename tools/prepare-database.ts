// Brings the database up to date and seeds the demo scenario when it is empty.
import { readConfig } from '../server/config.js';
import { applyMigrations, openDatabase } from '../server/db/database.js';
import { DEMO_MODELLER, seedDemoWhenEmpty } from '../server/demo/demo-seed.js';

const { db, pool } = openDatabase(readConfig().databaseUrl);
try {
  await applyMigrations(db);
  const outcome = await seedDemoWhenEmpty(db);
  console.log(
    outcome === 'seeded'
      ? `[database] migrated; seeded the demo workshop "${DEMO_MODELLER.workshop}"`
      : '[database] migrated; existing data kept',
  );
} finally {
  await pool.end();
}
