import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { TEST_DATABASE_URL } from '../../support/test-database.js';

export interface RunningApp {
  origin: string;
  port: number;
  /** Ends the process as a deploy would: SIGTERM, in-flight requests finish. */
  stop(): Promise<void>;
  /** Ends the process at once (SIGKILL), as a crash or a lost machine would, mid-request. */
  crash(): Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

async function waitForHealth(origin: string, child: ChildProcess): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}`);
    try {
      const response = await fetch(`${origin}/api/health`);
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error('the server did not answer /api/health within 30 s');
}

/** The real production server as its own process, serving the production build, on a free port or the one given. */
export async function startAppServer(env: Record<string, string> = {}, onPort?: number): Promise<RunningApp> {
  const port = onPort ?? (await freePort());
  const origin = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      PUBLIC_ORIGIN: origin,
      DATABASE_URL: TEST_DATABASE_URL,
      LOG_LEVEL: 'warn',
      ...env,
    },
  });
  await waitForHealth(origin, child);
  const end = (signal: NodeJS.Signals) =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill(signal);
    });
  return { origin, port, stop: () => end('SIGTERM'), crash: () => end('SIGKILL') };
}
