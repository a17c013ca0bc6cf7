import type { Logger } from 'pino';
import type pg from 'pg';
import type { SessionStore } from './auth/session-store.js';
import type { ServerConfig } from './config.js';
import type { Clock } from './core/clock.js';
import type { Database } from './db/database.js';
import type { Mailer } from './mail/mailer.js';
import type { PhotoStore } from './photos/photo-store.js';

/** Everything a service needs, made once at start-up (or by a test) and passed down. */
export interface ServerContext {
  config: ServerConfig;
  db: Database;
  pool: pg.Pool;
  mailer: Mailer;
  clock: Clock;
  sessions: SessionStore;
  photos: PhotoStore;
  log: Logger;
}
