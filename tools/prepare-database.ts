// Brings the database up to date and seeds the demo scenario when it is empty.
import { readConfig } from '../server/config.js';
import { createContext } from '../server/context-factory.js';
import { applyMigrations, openDatabase } from '../server/db/database.js';
import { eq } from 'drizzle-orm';
import { users } from '../server/db/schema/index.js';
import { DEMO_MEMBERS, DEMO_WORKSHOP, seedDemoWhenEmpty } from '../server/demo/demo-seed.js';

const config = readConfig();
const database = openDatabase(config.databaseUrl);
const { db, pool } = database;
try {
  await applyMigrations(db);
  const outcome = await seedDemoWhenEmpty(createContext(config, database));
  console.log(
    outcome === 'seeded'
      ? `[database] migrated; seeded the demo workshop "${DEMO_WORKSHOP}"`
      : '[database] migrated; existing data kept',
  );
  const [demoOwner] = await db.select().from(users).where(eq(users.email, DEMO_MEMBERS[0]!.email));
  if (demoOwner) {
    console.log(`Demo sign-ins (workshop "${DEMO_WORKSHOP}"):`);
    for (const member of DEMO_MEMBERS) {
      console.log(`  ${member.role.padEnd(8)} ${member.email.padEnd(24)} ${member.password}`);
    }
  }
} finally {
  await pool.end();
}
