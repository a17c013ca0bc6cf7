// Scores Bench, Builds and Log a pour with Lighthouse (mobile preset: an emulated mid-range phone on a
// throttled connection) against the production build served by the real server, signed in as the demo
// builder, in Debian's Chromium. Run with `npm run bench:lighthouse`; it builds the app when needed and
// uses a database of its own, seeded afresh with the demo workshop. Target: 95 or more for performance
// and accessibility on each page. Prints the scores and exits 1 when one falls short. With
// LIGHTHOUSE_DETAILS=1 it also writes each page's report and its trace to /tmp/lighthouse-<page>.json and
// .trace.json (open the trace in Chromium's performance panel to see what the long tasks do).
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { navigation } from 'lighthouse';
import pg from 'pg';
import puppeteer, { type Page } from 'puppeteer-core';
import { readConfig } from '../../server/config.js';
import { createContext } from '../../server/context-factory.js';
import { applyMigrations, openDatabase } from '../../server/db/database.js';
import { DEMO_MEMBERS, seedDemoWhenEmpty } from '../../server/demo/demo-seed.js';

const TARGET = 95;
const PAGES = [
  { name: 'Bench', path: '/' },
  { name: 'Builds', path: '/builds' },
  { name: 'Log a pour', path: '/log-pour' },
];
const CHROMIUM = process.env['CHROME_BIN'] ?? '/usr/bin/chromium';

async function freshDatabase(): Promise<string> {
  const url = new URL(process.env['DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide');
  const admin = new pg.Client({ connectionString: url.toString() });
  await admin.connect();
  await admin.query('DROP DATABASE IF EXISTS benchtide_lighthouse WITH (FORCE)');
  await admin.query('CREATE DATABASE benchtide_lighthouse');
  await admin.end();
  url.pathname = '/benchtide_lighthouse';
  const database = openDatabase(url.toString());
  await applyMigrations(database.db);
  await seedDemoWhenEmpty(createContext({ ...readConfig(), logLevel: 'silent' }, database));
  await database.pool.end();
  return url.toString();
}

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

async function serve(databaseUrl: string): Promise<{ origin: string; child: ChildProcess }> {
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      PUBLIC_ORIGIN: origin,
      DATABASE_URL: databaseUrl,
    },
  });
  for (let tries = 0; tries < 150; tries += 1) {
    try {
      if ((await fetch(`${origin}/api/health`)).ok) return { origin, child };
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  child.kill();
  throw new Error('The server did not answer /api/health within 30 s.');
}

async function signIn(page: Page, origin: string): Promise<void> {
  const builder = DEMO_MEMBERS.find((member) => member.role === 'builder')!;
  await page.goto(`${origin}/sign-in`, { waitUntil: 'networkidle0' });
  await page.type('input[type="email"]', builder.email);
  await page.type('input[autocomplete="current-password"]', builder.password);
  await Promise.all([page.waitForNavigation({ waitUntil: 'networkidle0' }), page.click('button[type="submit"]')]);
  // The demo club, not the builder's own bench, is the workshop to look at.
  // Run in the page (the string keeps this Node file free of DOM types).
  await page.evaluate(`(() => {
    const session = JSON.parse(localStorage.getItem('benchtide.session') ?? '{}');
    const club = (session.workshops ?? []).find((workshop) => !workshop.personal);
    if (club) localStorage.setItem('benchtide.current-workshop', club.id);
  })()`);
  // Let the first sync fill the device store, as it would have on a phone in use.
  await page.goto(`${origin}/device`, { waitUntil: 'networkidle0' });
  try {
    await page.waitForFunction(
      `document.body.textContent.includes('Last synced: ') && !document.body.textContent.includes('not yet on this device')`,
      { timeout: 30_000 },
    );
  } catch (error) {
    const shown = await page.evaluate('document.body.innerText');
    throw new Error(`The first sync did not finish within 30 s. The device page read:\n${String(shown)}`, {
      cause: error,
    });
  }
}

const databaseUrl = await freshDatabase();
const { origin, child } = await serve(databaseUrl);
const browser = await puppeteer.launch({
  executablePath: CHROMIUM,
  headless: true,
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-dev-shm-usage',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
  ],
});
let shortfall = false;
try {
  const page = await browser.newPage();
  await signIn(page, origin);
  console.log(`Lighthouse 12.2.3, mobile preset, ${CHROMIUM}, signed in as the demo builder`);
  console.log('page        performance  accessibility  best practices');
  for (const { name, path } of PAGES) {
    const result = await navigation(page, `${origin}${path}`, {
      flags: { disableStorageReset: true, onlyCategories: ['performance', 'accessibility', 'best-practices'] },
    });
    const categories = result!.lhr.categories;
    const score = (id: string) => Math.round((categories[id]?.score ?? 0) * 100);
    const [performance, accessibility, practices] = [
      score('performance'),
      score('accessibility'),
      score('best-practices'),
    ];
    if (performance < TARGET || accessibility < TARGET) shortfall = true;
    console.log(
      `${name.padEnd(12)}${String(performance).padStart(11)}  ${String(accessibility).padStart(13)}  ${String(practices).padStart(14)}`,
    );
    if (process.env['LIGHTHOUSE_DETAILS']) {
      const { writeFileSync } = await import('node:fs');
      writeFileSync(`/tmp/lighthouse-${name.replace(/\W+/g, '-')}.json`, JSON.stringify(result!.lhr));
      writeFileSync(`/tmp/lighthouse-${name.replace(/\W+/g, '-')}.trace.json`, JSON.stringify(result!.artifacts.Trace));
    }
    for (const audit of Object.values(result!.lhr.audits)) {
      if (
        audit.score !== null &&
        audit.score < 0.9 &&
        audit.scoreDisplayMode !== 'informative' &&
        audit.scoreDisplayMode !== 'manual'
      ) {
        console.log(`    ${audit.id}: ${audit.displayValue ?? ''} ${audit.title}`);
      }
    }
  }
} finally {
  await browser.close();
  child.kill('SIGTERM');
}
console.log(shortfall ? `A page scored under ${TARGET}.` : `Every page scored ${TARGET} or more.`);
process.exit(shortfall ? 1 : 0);
