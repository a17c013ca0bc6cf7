// Owns the project's local PostgreSQL cluster: Debian's package, our own data folder, loopback only.
// Usage: node tools/postgres.mjs start|stop|status|url
// Only Node built-ins here: this runs before `npm ci` has installed anything.
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync, chmodSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createConnection } from 'node:net';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const PG_PORT = Number(process.env.BENCHTIDE_PG_PORT ?? 54329);
export const PG_USER = 'benchtide';
const isRoot = process.getuid?.() === 0;

export class SetupError extends Error {}

function say(message) {
  console.log(`[postgres] ${message}`);
}

export function postgresBinDir() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(join(base, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? join(base, versions[0], 'bin') : null;
}

/** Installs Debian's postgresql package when its binaries are missing. */
export function ensurePostgresInstalled() {
  if (postgresBinDir()) return;
  if (!isRoot) {
    throw new SetupError(
      'PostgreSQL is not installed and this is not root. Run `sudo apt-get install -y postgresql`, ' +
        'or set DATABASE_URL to a PostgreSQL you already have.',
    );
  }
  aptInstall(['postgresql']);
  if (!postgresBinDir()) throw new SetupError('apt-get finished but no PostgreSQL binaries were found.');
}

let aptUpdated = false;
export function aptInstall(packages) {
  say(`installing ${packages.join(', ')} with apt-get (this takes a minute)`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const run = (args) => spawnSync('apt-get', args, { stdio: 'inherit', env });
  if (!aptUpdated) {
    const update = run(['update']);
    if (update.error || update.status !== 0) {
      throw new SetupError('`apt-get update` failed: is the Debian package mirror reachable?');
    }
    aptUpdated = true;
  }
  const install = run(['install', '-y', '--no-install-recommends', ...packages]);
  if (install.error || install.status !== 0) {
    throw new SetupError(`\`apt-get install ${packages.join(' ')}\` failed; see the output above.`);
  }
}

/** The system user that owns and runs the cluster: pg_ctl refuses to run as root. */
function clusterUser() {
  return isRoot ? 'postgres' : null;
}

function asClusterUser(command, args, options = {}) {
  const user = clusterUser();
  const [cmd, argv] = user ? ['runuser', ['-u', user, '--', command, ...args]] : [command, args];
  return spawnSync(cmd, argv, { encoding: 'utf8', ...options });
}

/**
 * Where the cluster lives: `.data/postgres` in the checkout, unless the cluster user cannot
 * reach it (a clone under /root, say); then a folder of its own under /var/lib, keyed by checkout.
 */
export function dataDir() {
  if (process.env.BENCHTIDE_PG_DATA) return resolve(process.env.BENCHTIDE_PG_DATA);
  const inCheckout = join(root, '.data', 'postgres');
  if (!isRoot) return inCheckout;
  mkdirSync(join(root, '.data'), { recursive: true });
  const reachable = asClusterUser('test', ['-w', join(root, '.data')]).status === 0;
  if (reachable) return inCheckout;
  const key = createHash('sha256').update(root).digest('hex').slice(0, 12);
  return join('/var/lib/benchtide', key, 'postgres');
}

function prepareDataDir(dir) {
  mkdirSync(dir, { recursive: true });
  if (isRoot) execFileSync('chown', ['-R', 'postgres:postgres', dir]);
  if (isRoot) execFileSync('chown', ['postgres:postgres', dirname(dir)]);
  chmodSync(dir, 0o700);
}

function socketDir(dir) {
  return join(dir, 'run');
}

function pgCtl(bin, args) {
  return asClusterUser(join(bin, 'pg_ctl'), args);
}

function isRunning(bin, dir) {
  return existsSync(join(dir, 'PG_VERSION')) && pgCtl(bin, ['status', '-D', dir]).status === 0;
}

/** A postmaster.pid left by a crash whose process is gone (or is now some other program). */
function removeStalePidFile(dir) {
  const pidFile = join(dir, 'postmaster.pid');
  if (!existsSync(pidFile)) return;
  const pid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
  let alive;
  try {
    alive = readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('postgres');
  } catch {
    alive = false;
  }
  if (!alive) {
    say(`removing a stale postmaster.pid (process ${pid} is gone)`);
    rmSync(pidFile);
  }
}

function portTaken(port) {
  return new Promise((done) => {
    const socket = createConnection({ host: '127.0.0.1', port });
    socket.once('connect', () => {
      socket.destroy();
      done(true);
    });
    socket.once('error', () => done(false));
  });
}

export function databaseUrl(database = 'benchtide') {
  return `postgres://${PG_USER}@127.0.0.1:${PG_PORT}/${database}`;
}

export async function start() {
  ensurePostgresInstalled();
  const bin = postgresBinDir();
  const dir = dataDir();
  if (isRunning(bin, dir)) {
    say(`already running on 127.0.0.1:${PG_PORT} (data in ${dir})`);
    return { startedNow: false, dir };
  }
  if (!existsSync(join(dir, 'PG_VERSION'))) {
    prepareDataDir(dir);
    say(`creating a new cluster in ${dir}`);
    const init = asClusterUser(join(bin, 'initdb'), [
      '-D',
      dir,
      '-U',
      PG_USER,
      '--auth=trust',
      '--encoding=UTF8',
      '--locale=C.UTF-8',
    ]);
    if (init.status !== 0) throw new SetupError(`initdb failed:\n${init.stderr || init.stdout}`);
  }
  removeStalePidFile(dir);
  if (await portTaken(PG_PORT)) {
    throw new SetupError(
      `port ${PG_PORT} on 127.0.0.1 is already taken by another program. ` +
        'Stop it, or choose another port with BENCHTIDE_PG_PORT=NNNNN.',
    );
  }
  mkdirSync(socketDir(dir), { recursive: true });
  if (isRoot) execFileSync('chown', ['postgres:postgres', socketDir(dir)]);
  const options = `-p ${PG_PORT} -c listen_addresses=127.0.0.1 -k ${socketDir(dir)} -c fsync=${process.env.CI ? 'off' : 'on'}`;
  const started = pgCtl(bin, ['start', '-w', '-t', '60', '-D', dir, '-l', join(dir, 'server.log'), '-o', options]);
  if (started.status !== 0) {
    const log = existsSync(join(dir, 'server.log')) ? readFileSync(join(dir, 'server.log'), 'utf8').slice(-2000) : '';
    throw new SetupError(`PostgreSQL did not start:\n${started.stderr || started.stdout}\n${log}`);
  }
  writeFileSync(join(root, '.data', 'postgres-location'), `${dir}\n`);
  say(`running on 127.0.0.1:${PG_PORT} (data in ${dir})`);
  return { startedNow: true, dir };
}

export function stop() {
  const bin = postgresBinDir();
  const dir = dataDir();
  if (!bin || !isRunning(bin, dir)) {
    say('not running');
    return;
  }
  const stopped = pgCtl(bin, ['stop', '-w', '-m', 'fast', '-D', dir]);
  if (stopped.status !== 0) throw new SetupError(`pg_ctl stop failed:\n${stopped.stderr}`);
  say('stopped');
}

/** Restarts the running cluster with the options it was started with, dropping every connection (fast mode). */
export function restart() {
  const bin = postgresBinDir();
  const dir = dataDir();
  if (!bin || !isRunning(bin, dir)) throw new SetupError('not running, so not restarted');
  const restarted = pgCtl(bin, ['restart', '-w', '-t', '60', '-m', 'fast', '-D', dir, '-l', join(dir, 'server.log')]);
  if (restarted.status !== 0) throw new SetupError(`pg_ctl restart failed:\n${restarted.stderr || restarted.stdout}`);
  say('restarted');
}

export function status() {
  const bin = postgresBinDir();
  const dir = dataDir();
  if (!bin) return say('not installed (npm start installs it)');
  say(isRunning(bin, dir) ? `running on 127.0.0.1:${PG_PORT} (data in ${dir})` : `stopped (data in ${dir})`);
}

/** Creates a database when missing; with `fresh`, drops it first. */
export function ensureDatabase(name, { fresh = false } = {}) {
  const bin = postgresBinDir();
  const psql = (sql) =>
    spawnSync(
      join(bin, 'psql'),
      ['-h', '127.0.0.1', '-p', String(PG_PORT), '-U', PG_USER, '-d', 'postgres', '-tAc', sql],
      {
        encoding: 'utf8',
      },
    );
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new SetupError(`bad database name ${name}`);
  if (fresh) psql(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  const exists = psql(`SELECT 1 FROM pg_database WHERE datname = '${name}'`);
  if (exists.status !== 0) throw new SetupError(`cannot reach PostgreSQL: ${exists.stderr}`);
  if (exists.stdout.trim() !== '1') {
    const created = psql(`CREATE DATABASE ${name}`);
    if (created.status !== 0) throw new SetupError(`CREATE DATABASE ${name} failed: ${created.stderr}`);
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const command = process.argv[2];
  const actions = { start, stop, restart, status, url: () => console.log(databaseUrl()) };
  if (!actions[command]) {
    console.error('usage: node tools/postgres.mjs start|stop|restart|status|url');
    process.exit(2);
  }
  try {
    await actions[command]();
  } catch (error) {
    console.error(`[postgres] ${error.message}`);
    process.exit(1);
  }
}
