import { spawn, type ChildProcess } from 'node:child_process';
import { createInterface } from 'node:readline';
import { testPhotoDir } from '../support/test-app.js';
import { TEST_DATABASE_URL } from '../support/test-database.js';

interface LogLine {
  level: number;
  msg: string;
  err?: { type: string; message: string; stack: string };
}

interface ServerProcess {
  child: ChildProcess;
  origin: string;
  /** Every pino line the process wrote so far, parsed. */
  lines: LogLine[];
}

const ERROR = 50;
const FATAL = 60;

/** The real server as its own process, with a preload that makes it fail on SIGUSR2. */
async function startServer(failWith: 'reject' | 'throw'): Promise<ServerProcess> {
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', '--import', './tests/support/fail-on-signal.mjs', 'server/main.ts'],
    {
      stdio: ['ignore', 'pipe', 'inherit'],
      env: {
        ...process.env,
        NODE_ENV: 'production',
        PORT: '0',
        DATABASE_URL: TEST_DATABASE_URL,
        LOG_LEVEL: 'info',
        REMINDER_JOBS: 'off',
        PHOTO_DIR: testPhotoDir(),
        FAIL_ON_SIGNAL: failWith,
      },
    },
  );
  const lines: LogLine[] = [];
  const origin = new Promise<string>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`the server exited with code ${code} before serving`)));
    createInterface({ input: child.stdout! }).on('line', (text) => {
      const line = JSON.parse(text) as LogLine;
      lines.push(line);
      const serving = /serving on (http:\/\/\S+)/.exec(line.msg);
      if (serving) resolve(serving[1]!);
    });
  });
  return { child, origin: await origin, lines };
}

function exited(child: ChildProcess): Promise<number | null> {
  if (child.exitCode !== null) return Promise.resolve(child.exitCode);
  return new Promise((resolve) => child.once('exit', (code) => resolve(code)));
}

async function waitFor(check: () => boolean, what: string): Promise<void> {
  const deadline = Date.now() + 5_000;
  while (!check()) {
    if (Date.now() > deadline) throw new Error(`waited 5 s for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

describe('the server process meeting a failure nothing caught', () => {
  let server: ServerProcess | undefined;

  afterEach(async () => {
    if (server && server.child.exitCode === null && server.child.signalCode === null) {
      const stopped = exited(server.child);
      server.child.kill('SIGTERM');
      await stopped;
    }
    server = undefined;
  });

  it('should log an unhandled rejection once, as one error line with the reason, and keep serving', async () => {
    server = await startServer('reject');
    const failures = () => server!.lines.filter((line) => line.level >= ERROR);

    server.child.kill('SIGUSR2');
    await waitFor(() => failures().length > 0, 'the error line');
    // A second rejection, later, is its own line; and a request still gets its answer after both.
    server.child.kill('SIGUSR2');
    await waitFor(() => failures().length > 1, 'the second error line');
    const health = await fetch(`${server.origin}/api/health`);

    expect(health.status).toBe(200);
    expect(server.child.exitCode).toBeNull();
    expect(failures().length).toBe(2);
    expect(failures()[0]).toEqual(
      jasmine.objectContaining({
        level: ERROR,
        msg: 'a promise was rejected and nothing handled it; the server carries on',
        err: jasmine.objectContaining({ type: 'Error', message: 'a reminder tick was lost' }),
      }),
    );
    expect(failures()[0]!.err!.stack).toContain('fail-on-signal.mjs');
  }, 30_000);

  it('should log an uncaught exception as one fatal line and exit with 1 for its supervisor to restart it', async () => {
    server = await startServer('throw');

    server.child.kill('SIGUSR2');
    const code = await exited(server.child);

    expect(code).toBe(1);
    expect(server.lines.filter((line) => line.level >= ERROR)).toEqual([
      jasmine.objectContaining({
        level: FATAL,
        msg: 'uncaught exception; stopping',
        err: jasmine.objectContaining({ message: 'a reminder tick threw' }),
      }),
    ]);
  }, 30_000);
});
