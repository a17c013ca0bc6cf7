import type { Express } from 'express';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createApp } from '../../server/app.js';
import { readConfig, type ServerConfig } from '../../server/config.js';
import { createContext } from '../../server/context-factory.js';
import type { ServerContext } from '../../server/context.js';
import type { Clock } from '../../server/core/clock.js';
import type { DatabaseHandle } from '../../server/db/database.js';
import { smtpMailer } from '../../server/mail/mailer.js';
import { MailSink } from '../../server/mail/mail-sink.js';
import { testDatabase } from './test-database.js';

let serversMade = 0;

/**
 * The clock tests move forward instead of waiting. Each test server starts a day later than the
 * one before, so rate-limit windows and token lifetimes of one spec never reach into another's.
 */
export class TestClock implements Clock {
  private offsetMs = ++serversMade * 24 * 3_600_000;

  now(): Date {
    return new Date(Date.now() + this.offsetMs);
  }

  advanceMinutes(minutes: number): void {
    this.offsetMs += minutes * 60_000;
  }
}

let sink: Promise<MailSink> | undefined;

/** One local mail sink for the whole run, as `npm start` has one. */
export function testMailSink(): Promise<MailSink> {
  sink ??= (async () => {
    const started = new MailSink();
    await started.listen(0);
    return started;
  })();
  return sink;
}

export async function closeTestMailSink(): Promise<void> {
  if (sink) await (await sink).close();
  sink = undefined;
}

let photoDir: string | undefined;

/** The run's own photo folder, outside the project, so tests never touch .data; removed when the run ends. */
export function testPhotoDir(): string {
  photoDir ??= mkdtempSync(join(tmpdir(), 'benchtide-photos-'));
  return photoDir;
}

export function removeTestPhotoDir(): void {
  if (photoDir) rmSync(photoDir, { recursive: true, force: true });
  photoDir = undefined;
}

export const TEST_ORIGIN = 'http://127.0.0.1:3999';

export interface TestServer {
  app: Express;
  ctx: ServerContext;
  clock: TestClock;
  mail: MailSink;
}

/** The real app in-process on the test database, sending mail to the local sink, quiet unless LOG_LEVEL says otherwise. */
export async function testServer(
  overrides: Partial<ServerConfig> = {},
  database?: DatabaseHandle,
): Promise<TestServer> {
  const mail = await testMailSink();
  const config = {
    ...readConfig({
      LOG_LEVEL: process.env['LOG_LEVEL'] ?? 'silent',
      PUBLIC_ORIGIN: TEST_ORIGIN,
      PHOTO_DIR: testPhotoDir(),
    }),
    ...overrides,
  };
  const clock = new TestClock();
  const ctx = createContext(config, database ?? (await testDatabase()), {
    clock,
    mailer: smtpMailer(`smtp://127.0.0.1:${mail.port}`, config.mailFrom),
  });
  return { app: createApp(ctx), ctx, clock, mail };
}

export async function testApp(overrides: Partial<ServerConfig> = {}, database?: DatabaseHandle): Promise<Express> {
  return (await testServer(overrides, database)).app;
}
