import type { Logger } from 'pino';
import type { Role } from '../shared/account-schemas.js';
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
  /**
   * Set while a sync push applies a batch: the caller's role, checked once, and the change
   * number the whole batch shares (it commits as one). Writes then run in the batch's
   * transaction instead of opening their own. Work that must wait for the commit (removing a
   * deleted photo's files) is queued in afterCommit.
   */
  batch?: { role: Role; changeNumber: number; afterCommit: (() => Promise<void>)[] };
}
