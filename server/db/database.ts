import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { resolve } from 'node:path';
import pg from 'pg';
import * as schema from './schema/index.js';

export type Database = NodePgDatabase<typeof schema>;

export interface DatabaseHandle {
  db: Database;
  pool: pg.Pool;
}

export function openDatabase(url: string): DatabaseHandle {
  const pool = new pg.Pool({ connectionString: url, max: 10, connectionTimeoutMillis: 5000 });
  // A client losing its connection (a database restart) must not crash the process: idle ones
  // report on the pool, and one checked out between queries (inside a transaction) reports on
  // itself. Its query fails, the request answers 503, and the pool opens a new connection.
  pool.on('error', () => undefined);
  pool.on('connect', (client) => client.on('error', () => undefined));
  return { pool, db: drizzle(pool, { schema }) };
}

export async function applyMigrations(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder: resolve('drizzle') });
}

export async function isDatabaseReachable(pool: pg.Pool): Promise<boolean> {
  try {
    await pool.query('SELECT 1');
    return true;
  } catch {
    return false;
  }
}
