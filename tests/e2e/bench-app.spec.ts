import { readFileSync } from 'node:fs';
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { containers, ledgerEntries, pours } from '../../server/db/schema/index.js';
import { seedDemoBench } from '../../server/demo/demo-records.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');
const DESKTOP = { viewport: { width: 1280, height: 800 } };
const SCREENS = [
  ['bench', '/'],
  ['builds', '/builds'],
  ['log-pour', '/log-pour'],
  ['shelf', '/shelf'],
  ['costs', '/costs'],
  ['device', '/device'],
  ['more', '/more'],
  ['workshop', '/workshop'],
  ['pour-planner', '/pour-planner'],
  ['scale-tools', '/scale-tools'],
] as const;

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

/** The demo club's builder and viewer at the bench, on phones, against the production build. */
describe('the bench app on a phone', () => {
  let seed: TestServer;
  let app: RunningApp;
  let browser: Browser;
  let builder: TestAccount;
  let viewer: TestAccount;
  let workshopId: string;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    seed = await testServer();
    const owner = await makeAccount(seed.ctx, 'Wren');
    builder = await makeAccount(seed.ctx, 'Ilse');
    viewer = await makeAccount(seed.ctx, 'Tobin');
    workshopId = (await makeWorkshop(seed.ctx, owner, 'Fernhollow Model Railway Circle')).id;
    await addMember(seed.ctx, workshopId, builder, 'builder');
    await addMember(seed.ctx, workshopId, viewer, 'viewer');
    await seedDemoBench(seed.ctx, owner.id, builder.id, workshopId);
    app = await startAppServer();
    browser = await launchChromium();
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  async function phoneOf(
    account: TestAccount,
    options: object = PHONE,
  ): Promise<{ context: BrowserContext; page: Page }> {
    const context = await browser.newContext(options);
    const page = await context.newPage();
    page.on('pageerror', (error) => pageErrors.push(`${account.displayName}: ${error.message}`));
    await page.goto(`${app.origin}/sign-in`);
    await page.getByLabel('E-mail').fill(account.email);
    await page.getByLabel('Password', { exact: true }).fill(account.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await synced(page);
    return { context, page };
  }

  async function synced(page: Page): Promise<void> {
    await page.goto(`${app.origin}/device`);
    await page.getByRole('button', { name: 'Sync now' }).click();
    await page.getByText('Everything changed on this device has reached the server.').waitFor({ timeout: 30_000 });
    await page.waitForFunction(() => !document.querySelector('mat-progress-bar'), null, { timeout: 30_000 });
  }

  /** The build page's "cost so far", once the device has worked it out. */
  async function costOfBuild(page: Page): Promise<number> {
    const cost = page.locator('[data-field="cost"]');
    await page.waitForFunction(() => document.querySelector('[data-field="cost"]')?.textContent?.includes('€'));
    return euros(await cost.textContent());
  }

  /** Euro amounts in a text, as a number of euros: "€12.40" is 12.4. */
  function euros(text: string | null): number {
    const amounts = [...(text ?? '').matchAll(/€\s?([\d,]+\.\d{2})/g)].map((m) => Number(m[1]!.replace(/,/g, '')));
    return amounts.reduce((sum, amount) => sum + amount, 0);
  }

  function poursOnServer() {
    return seed.ctx.db
      .select()
      .from(pours)
      .where(and(eq(pours.workshopId, workshopId), isNull(pours.deletedAt)))
      .orderBy(desc(pours.startAt));
  }

  /** The pour a repeat copies: the one that starts last. */
  async function lastPourOnServer() {
    return (await poursOnServer())[0]!;
  }

  it('should log a repeat pour in five taps or fewer, start its timer, draw the shelf and add to the cost', async () => {
    const { page } = await phoneOf(builder);
    const repeated = await lastPourOnServer();
    await page.goto(`${app.origin}/builds/${repeated.buildId}`);
    const costBefore = await costOfBuild(page);
    await page.goto(`${app.origin}/shelf`);
    const amountsBefore = await shelfAmounts(page);
    const timersBefore = await timersOnBench(page);

    let taps = 0;
    const tap = async (name: string) => {
      taps += 1;
      await page
        .getByRole(name === 'Log a pour' ? 'link' : 'button', { name })
        .first()
        .click();
    };
    await tap('Log a pour');
    await tap('Repeat the last pour');
    await tap('Start pour');
    await page.waitForURL(`${app.origin}/`);

    expect(taps).toBeLessThanOrEqual(5);
    await page.waitForFunction((count) => document.querySelectorAll('bt-pour-timer').length > count, timersBefore);
    expect(await page.locator('bt-pour-timer [role="timer"]').first().isVisible()).toBeTrue();
    await page.screenshot({ path: screenshotPath('bench-after-repeat-390x844') });

    await synced(page);
    const before = new Set([repeated.id]);
    const added = (await poursOnServer()).filter((pour) => pour.createdAt > repeated.createdAt && !before.has(pour.id));
    expect(added.length).toBe(1);
    const logged = added[0]!;
    expect(logged.buildId).toBe(repeated.buildId);
    expect(logged.request).toEqual(jasmine.objectContaining({ shape: (repeated.request as { shape: unknown }).shape }));
    const uses = await seed.ctx.db.select().from(ledgerEntries).where(eq(ledgerEntries.pourId, logged.id));
    const held = await seed.ctx.db.select().from(containers).where(eq(containers.workshopId, workshopId));
    // The planned grams of each part (the same request as the pour repeated) leave the shelf.
    const plan = logged.plan as { mix: { total: { partAG: number; partBG: number } } };
    const taken = (part: string) =>
      uses
        .filter((use) => held.find((c) => c.id === use.containerId)?.part === part)
        .reduce((sum, use) => sum - Number(use.quantity), 0);
    expect(taken('A')).toBeCloseTo(plan.mix.total.partAG, 6);
    expect(taken('B')).toBeCloseTo(plan.mix.total.partBG, 6);

    await page.goto(`${app.origin}/shelf`);
    const amountsAfter = await shelfAmounts(page);
    for (const use of uses) {
      const drop = amountsBefore[use.containerId]! - amountsAfter[use.containerId]!;
      // Both amounts are shown to 0.1 g, so the drop read off the screen is within 0.1 g of the use.
      expect(Math.abs(drop + Number(use.quantity)))
        .withContext(use.containerId)
        .toBeLessThanOrEqual(0.1 + 1e-9);
    }

    // Each use costs its share of the container's price (worked by hand: amount × price ÷ size), kept exact;
    // the build's cost is rounded to the cent once before and once after, so the rise is within a cent of it.
    const expectedRise = uses.reduce((sum, use) => {
      const container = held.find((c) => c.id === use.containerId)!;
      return sum + (-Number(use.quantity) * container.priceMinor) / Number(container.sizeQty) / 100;
    }, 0);
    await page.goto(`${app.origin}/builds/${logged.buildId}`);
    const costAfter = await costOfBuild(page);
    expect(Math.abs(costAfter - costBefore - expectedRise)).toBeLessThanOrEqual(0.01 + 1e-9);
  }, 180_000);

  it('should show a viewer the log of a build and no edit controls', async () => {
    const { page } = await phoneOf(viewer);
    const build = await lastPourOnServer();
    await page.goto(`${app.origin}/builds/${build.buildId}`);
    await page.getByText('Mill race, top layer').first().waitFor();
    await page.getByText('mixed in all').first().waitFor();

    for (const control of ['Log a step', 'Log a pour', 'Edit']) {
      expect(await page.getByRole('button', { name: control }).count())
        .withContext(control)
        .toBe(0);
      expect(await page.getByRole('link', { name: control }).count())
        .withContext(control)
        .toBe(0);
    }
    await page.screenshot({ path: screenshotPath('build-log-viewer-390x844') });
    await page.goto(`${app.origin}/log-pour`);
    await page.getByText('As a viewer of this workshop').waitFor();
    expect(await page.getByRole('button', { name: 'Start pour' }).count()).toBe(0);
  }, 120_000);

  it('should have no serious or critical accessibility violations on any screen, at phone and desktop widths', async () => {
    const found: string[] = [];
    for (const [size, options] of [
      ['390x844', PHONE],
      ['1280x800', DESKTOP],
    ] as const) {
      // The page's own policy forbids inline scripts; only this check's engine is let in.
      const { page } = await phoneOf(builder, { ...options, bypassCSP: true });
      const build = await lastPourOnServer();
      for (const [name, path] of [...SCREENS, ['build', `/builds/${build.buildId}`] as const]) {
        await page.goto(`${app.origin}${path}`);
        await page.locator('h1').first().waitFor();
        await page.waitForTimeout(600);
        await page.screenshot({ path: screenshotPath(`${name}-${size}`), fullPage: true });
        await page.addScriptTag({ content: AXE });
        const violations = (await page.evaluate(async () => {
          const axe = (window as unknown as { axe: { run(): Promise<{ violations: unknown[] }> } }).axe;
          return (await axe.run()).violations;
        })) as AxeViolation[];
        for (const violation of violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')) {
          found.push(
            `${name} ${size}: ${violation.id} (${violation.impact}) ${violation.help} at ${violation.nodes.map((n) => n.target.join(' ')).join(', ')}`,
          );
        }
      }
    }
    expect(found).toEqual([]);
  }, 300_000);

  it('should have thrown no errors in any page', () => {
    expect(pageErrors).toEqual([]);
  });
});

async function shelfAmounts(page: Page): Promise<Record<string, number>> {
  await page.locator('[data-container]').first().waitFor();
  return page.evaluate(() => {
    const amounts: Record<string, number> = {};
    for (const row of Array.from(document.querySelectorAll('[data-container]'))) {
      const text = row.querySelector('[data-cell="amount"]')?.textContent ?? '';
      amounts[row.getAttribute('data-container')!] = Number(/[\d.]+/.exec(text.replace(/,/g, ''))?.[0]);
    }
    return amounts;
  });
}

async function timersOnBench(page: Page): Promise<number> {
  await page.goto(page.url().replace(/\/[^/]*$/, '/'));
  await page.locator('h1').waitFor();
  await page.waitForTimeout(1000);
  return page.locator('bt-pour-timer').count();
}
