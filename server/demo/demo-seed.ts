import { sql } from 'drizzle-orm';
import type { Database } from '../db/database.js';
import { users } from '../db/schema/index.js';

/** The invented demo modeller of the invented "Fernhollow Model Railway Circle". */
export const DEMO_MODELLER = {
  email: 'demo@benchtide.test',
  displayName: 'Wren Halloway',
  workshop: 'Fernhollow Model Railway Circle',
} as const;

/** Fills an empty database with the demo scenario; leaves a database with any account alone. */
export async function seedDemoWhenEmpty(db: Database): Promise<'seeded' | 'kept'> {
  const [row] = await db.select({ count: sql<number>`count(*)::int` }).from(users);
  if ((row?.count ?? 0) > 0) return 'kept';
  await db.insert(users).values({ email: DEMO_MODELLER.email, displayName: DEMO_MODELLER.displayName });
  return 'seeded';
}
