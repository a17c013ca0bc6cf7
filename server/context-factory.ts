import { pino } from 'pino';
import { luciaSessionStore } from './auth/lucia-session-store.js';
import type { ServerConfig } from './config.js';
import type { ServerContext } from './context.js';
import { systemClock, type Clock } from './core/clock.js';
import type { DatabaseHandle } from './db/database.js';
import { smtpMailer, type Mailer } from './mail/mailer.js';
import { createPhotoStore, type PhotoStore } from './photos/photo-store.js';

/** Wires the real parts together; tests pass their own clock, mailer or photo store. */
export function createContext(
  config: ServerConfig,
  database: DatabaseHandle,
  parts: { clock?: Clock; mailer?: Mailer; photos?: PhotoStore } = {},
): ServerContext {
  return {
    config,
    db: database.db,
    pool: database.pool,
    clock: parts.clock ?? systemClock,
    mailer: parts.mailer ?? smtpMailer(config.smtpUrl, config.mailFrom),
    sessions: luciaSessionStore(database.db, config.secureCookies),
    photos: parts.photos ?? createPhotoStore(config.photoStore),
    log: pino({ level: config.logLevel }),
  };
}
