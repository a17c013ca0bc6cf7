// `npm start`: set up what is missing, migrate and seed, build the app when its sources changed, serve.
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { main, root, runNode, setUp, startMailSink, MAILBOX_URL } from './setup.mjs';

const APP_INDEX = join(root, 'dist', 'benchtide', 'browser', 'index.html');
const APP_SOURCES = [
  'src',
  'shared',
  'public',
  'angular.json',
  'ngsw-config.json',
  'package-lock.json',
  'tsconfig.json',
  'tsconfig.app.json',
];

function newestChange(path) {
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return Math.max(stat.mtimeMs, ...readdirSync(path).map((name) => newestChange(join(path, name))));
}

export function appBuildIsStale() {
  if (!existsSync(APP_INDEX)) return true;
  const built = statSync(APP_INDEX).mtimeMs;
  return APP_SOURCES.some((source) => existsSync(join(root, source)) && newestChange(join(root, source)) > built);
}

await main(async () => {
  const { databaseUrl } = await setUp();
  runNode(['--import', 'tsx', 'tools/prepare-database.ts'], { DATABASE_URL: databaseUrl });
  if (appBuildIsStale()) {
    console.log('[start] building the app for production');
    runNode(['node_modules/@angular/cli/bin/ng.js', 'build']);
  }
  const port = process.env.PORT ?? '3000';
  const children = [];
  if (!process.env.SMTP_URL) children.push(startMailSink());
  const server = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, NODE_ENV: 'production', DATABASE_URL: databaseUrl, PORT: port },
  });
  children.push(server);
  console.log(`\nBenchtide: http://127.0.0.1:${port}`);
  if (!process.env.SMTP_URL) console.log(`Mailbox (every e-mail the app sends): ${MAILBOX_URL}`);
  console.log('Stop with Ctrl+C; PostgreSQL keeps running until `npm run db:stop`.\n');
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => children.forEach((child) => child.kill(signal)));
  server.on('exit', (code) => {
    children.forEach((child) => child.kill('SIGTERM'));
    process.exit(code ?? 0);
  });
});
