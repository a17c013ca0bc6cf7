// Everything `npm start` and `npm test` need before they run: packages, PostgreSQL, Chromium.
// Only Node built-ins here: this runs before `npm ci` has installed anything.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { aptInstall, databaseUrl, ensureDatabase, SetupError, start as startPostgres } from './postgres.mjs';

export const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const CHROMIUM = '/usr/bin/chromium';

function say(message) {
  console.log(`[setup] ${message}`);
}

function packagesAreCurrent() {
  const installed = join(root, 'node_modules', '.package-lock.json');
  if (!existsSync(installed)) return false;
  return statSync(installed).mtimeMs >= statSync(join(root, 'package-lock.json')).mtimeMs;
}

function ensurePackages() {
  if (packagesAreCurrent()) return;
  say('installing npm packages (npm ci)');
  const result = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (result.status !== 0) throw new SetupError('`npm ci` failed; see the output above.');
}

function ensureChromium() {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) {
    throw new SetupError('Chromium is needed for the browser tests: run `sudo apt-get install -y chromium`.');
  }
  aptInstall(['chromium']);
}

/**
 * Makes the machine ready. Returns the database URL to use and whether this call started PostgreSQL
 * (so a test run can stop what it started).
 */
export async function setUp({ forTests = false } = {}) {
  ensurePackages();
  if (forTests) ensureChromium();
  if (forTests && process.env.TEST_DATABASE_URL) {
    return { databaseUrl: process.env.TEST_DATABASE_URL, startedPostgres: false };
  }
  if (!forTests && process.env.DATABASE_URL) {
    return { databaseUrl: process.env.DATABASE_URL, startedPostgres: false };
  }
  const { startedNow } = await startPostgres();
  const database = forTests ? 'benchtide_test' : 'benchtide';
  ensureDatabase(database, { fresh: forTests });
  return { databaseUrl: databaseUrl(database), startedPostgres: startedNow };
}

/** Runs a Node program of ours to completion, failing loudly. */
export function runNode(args, env = {}) {
  const result = spawnSync(process.execPath, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
  if (result.status !== 0) throw new SetupError(`\`node ${args.join(' ')}\` failed; see the output above.`);
}

export async function main(action) {
  try {
    await action();
  } catch (error) {
    if (error instanceof SetupError) {
      console.error(`\n[setup] ${error.message}`);
      process.exit(1);
    }
    throw error;
  }
}

export const MAILBOX_URL = `http://127.0.0.1:${process.env.BENCHTIDE_MAILBOX_PORT ?? 2580}`;

/** The development mail sink and mailbox page, as a child process that ends with ours. */
export function startMailSink() {
  return spawn(process.execPath, ['--import', 'tsx', 'tools/mail-sink.ts'], { cwd: root, stdio: 'inherit' });
}
