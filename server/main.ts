import type { Server } from 'node:http';
import { createApp } from './app.js';
import { readConfig } from './config.js';
import { createContext } from './context-factory.js';
import { applyMigrations, openDatabase } from './db/database.js';
import { pino } from 'pino';
import { logProcessFailures } from './core/process-failures.js';
import { startReminderJobs } from './reminders/reminder-jobs.js';

const config = readConfig();
const log = pino({ level: config.logLevel });
logProcessFailures(log);
const database = openDatabase(config.databaseUrl);

try {
  await applyMigrations(database.db);
} catch (error) {
  log.fatal({ err: error }, `cannot migrate the database at ${redactUrl(config.databaseUrl)}`);
  await database.pool.end();
  process.exit(1);
}

const ctx = createContext(config, database);
const app = createApp(ctx);
// Every API process runs the reminder workers; pg-boss and row locks keep them from sending twice.
const reminders = process.env['REMINDER_JOBS'] === 'off' ? null : await startReminderJobs(ctx);
const server: Server = app.listen(config.port, config.host, () => {
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  log.info(`Benchtide is serving on http://${config.host}:${port}`);
});
server.on('error', (error) => {
  log.fatal({ err: error }, 'cannot listen');
  process.exit(1);
});

let stopping = false;
function shutDown(signal: string): void {
  if (stopping) return;
  stopping = true;
  log.info(`${signal}: finishing requests, then stopping`);
  // Requests in flight finish; idle keep-alive sockets are closed so the process can exit.
  server.close(async () => {
    await reminders?.stop();
    await database.pool.end();
    log.info('stopped');
    process.exit(0);
  });
  server.closeIdleConnections();
  setTimeout(() => {
    log.warn('requests still open after 10 s; stopping anyway');
    process.exit(1);
  }, 10_000).unref();
}
process.on('SIGTERM', () => shutDown('SIGTERM'));
process.on('SIGINT', () => shutDown('SIGINT'));

function redactUrl(url: string): string {
  return url.replace(/\/\/([^:@/]+):[^@/]+@/, '//$1:***@');
}
