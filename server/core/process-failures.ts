import type { Logger } from 'pino';

/**
 * How the process meets a failure nothing caught. A rejected promise nobody awaited is one lost piece of
 * work (a reminder tick, a mail): it is logged and the process keeps serving. An uncaught exception may
 * have left any state half changed, so it is logged and the process exits for its supervisor to start a
 * fresh one.
 */
export function logProcessFailures(log: Logger, target: NodeJS.Process = process): void {
  target.on('unhandledRejection', (reason) => {
    log.error({ err: reason }, 'a promise was rejected and nothing handled it; the server carries on');
  });
  target.on('uncaughtException', (error) => {
    log.fatal({ err: error }, 'uncaught exception; stopping');
    target.exit(1);
  });
}
