import { and, eq, isNull } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';
import { containerStock, ledgerEntries, pourLayers, pours, reminders } from '../../server/db/schema/index.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';
import { signIn, untilSynced } from './support/phone.js';

const MIN = 60_000;
// TEST_DATA_SHEET (tests/support/shelf.ts, invented): recoat from 240 min at its 20 °C reference, at most
// 10 mm a layer, so a 30 mm pour is three layers, each may go on 4 h after the one below.
const RECOAT_MS = 240 * MIN;
const LATE_MS = 6 * 60 * MIN;

/** A three-layer pour followed at the bench on a phone, with the page's clock under the spec's control. */
describe('following a pour through its layers on a phone', () => {
  let seed: TestServer;
  let app: RunningApp;
  let browser: Browser;
  let builder: TestAccount;
  let workshopId: string;
  let buildId: string;
  let pourId: string;
  let containerIds: string[];
  let startMs: number;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    seed = await testServer();
    const owner = await makeAccount(seed.ctx, 'Maelle');
    builder = await makeAccount(seed.ctx, 'Corin');
    workshopId = (await makeWorkshop(seed.ctx, owner, 'Weir club')).id;
    await addMember(seed.ctx, workshopId, builder, 'builder');
    const client = api(seed, owner, workshopId);
    buildId = await addBuild(client, { name: 'Weir at Holm' });
    const materialId = await addMaterial(client);
    containerIds = [
      await addContainer(client, materialId, { part: 'A', sizeQty: 1000 }),
      await addContainer(client, materialId, { part: 'B', sizeQty: 1000 }),
    ];
    // Layer 1 went on so long ago that layer 2, due 4 h after it, is now 6 h late.
    startMs = Date.now() - RECOAT_MS - LATE_MS;
    const body = pourBody(buildId, materialId, {
      depthMm: 30,
      note: 'Mill leat',
      startAt: new Date(startMs).toISOString(),
    });
    await client.post('/pours', body).expect(201);
    pourId = body.id;
    app = await startAppServer();
    browser = await launchChromium();
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  async function amountOf(page: Page, selector: string): Promise<number> {
    const text = (await page.locator(selector).first().textContent()) ?? '';
    return Number(/([\d.]+)/.exec(text.replace(/,/g, ''))?.[1]);
  }

  it('should record layer 2 late in one tap, re-time the rest and its reminder, weigh layer 3 and delete the pour', async () => {
    const context = await browser.newContext({ ...PHONE });
    const page = await context.newPage();
    page.on('pageerror', (error) => pageErrors.push(error.message));
    const clockAtMs = Date.now();
    await page.clock.install({ time: clockAtMs });
    await signIn(page, app.origin, builder);
    await page.evaluate((id) => localStorage.setItem('benchtide.current-workshop', id), workshopId);
    await untilSynced(page, app.origin);
    await page.goto(app.origin);
    const card = page.locator(`bt-pour-timer [data-pour="${pourId}"]`);
    await card.getByText('Ready: pour layer 2 of 3 now.').waitFor();

    let taps = 0;
    taps += 1;
    await card.locator('[data-action="layer-poured"]').click();
    await card.getByText('2 of 3 layers on').waitFor();
    expect(taps).toBe(1);
    // Layer 3 now counts from the real time of layer 2, 6 h after the plan: the moments say both.
    const moments = (await card.locator('.moments').textContent()) ?? '';
    expect(moments).toContain('planned');
    await page.screenshot({ path: screenshotPath('bench-layer-2-recorded-390x844') });

    // Weigh layer 3 from the card: this layer's planned part A and part B, as the server planned them.
    const [planned] = await seed.ctx.db.select().from(pours).where(eq(pours.id, pourId));
    const perLayer = (planned!.plan as { mix: { perLayer: { partAG: number; partBG: number } } }).mix.perLayer;
    await card.locator('[data-action="weigh-layer"]').click();
    await page.getByRole('dialog').getByText('Weigh for layer 3 of 3').waitFor();
    expect(Math.abs((await amountOf(page, '[data-weigh="a"] .amount')) - perLayer.partAG)).toBeLessThanOrEqual(0.05);
    expect(Math.abs((await amountOf(page, '[data-weigh="b"] .amount')) - perLayer.partBG)).toBeLessThanOrEqual(0.05);
    await page.screenshot({ path: screenshotPath('weigh-layer-3-390x844') });
    await page.getByRole('button', { name: 'Done weighing' }).click();

    await untilSynced(page, app.origin);
    const [second] = await seed.ctx.db
      .select()
      .from(pourLayers)
      .where(and(eq(pourLayers.pourId, pourId), eq(pourLayers.number, 2), isNull(pourLayers.deletedAt)));
    expect(Math.abs(second!.pouredAt.getTime() - clockAtMs)).toBeLessThan(5 * MIN);
    const held = await seed.ctx.db.select().from(reminders).where(eq(reminders.pourId, pourId));
    const live = (key: string) => held.filter((row) => row.key === key && row.cancelledAt === null);
    // The reminder for layer 3 follows the real layer 2 (same 20 °C room): 4 h after it.
    expect(live('next-layer-due:3').length).toBe(1);
    expect(live('next-layer-due:3')[0]!.dueAt.getTime()).toBe(second!.pouredAt.getTime() + RECOAT_MS);
    // None is left to go out for layer 2, already poured.
    expect(live('next-layer-due:2').filter((row) => row.fannedOutAt === null)).toEqual([]);

    // Delete the pour from the build log: the shelf and the build's cost go back.
    await page.goto(`${app.origin}/builds/${buildId}`);
    const entry = page.locator(`[data-entry="pour"][data-pour="${pourId}"]`);
    await page.waitForFunction(() => document.querySelector('[data-field="cost"]')?.textContent?.includes('€'));
    await entry.locator('[data-action="delete-pour"]').click();
    const confirm = entry.locator('[data-confirm="delete-pour"]');
    await confirm.getByText('The stock it drew goes back to the shelf').waitFor();
    expect(await confirm.textContent()).toContain('leaves the build’s cost');
    await page.screenshot({ path: screenshotPath('delete-pour-390x844') });
    await confirm.getByRole('button', { name: 'Delete the pour' }).click();
    await page.waitForFunction(
      () => document.querySelector('[data-field="cost"]')?.textContent?.trim() === 'no costed pours yet',
    );
    expect(await page.locator(`[data-pour="${pourId}"]`).count()).toBe(0);

    await untilSynced(page, app.origin);
    const [gone] = await seed.ctx.db.select().from(pours).where(eq(pours.id, pourId));
    expect(gone!.deletedAt).not.toBeNull();
    const uses = await seed.ctx.db
      .select()
      .from(ledgerEntries)
      .where(and(eq(ledgerEntries.pourId, pourId), isNull(ledgerEntries.deletedAt)));
    expect(uses).toEqual([]);
    const stock = await seed.ctx.db.select().from(containerStock);
    for (const containerId of containerIds) {
      expect(Number(stock.find((row) => row.containerId === containerId)?.remaining)).toBe(1000);
    }
    const cancelled = await seed.ctx.db.select().from(reminders).where(eq(reminders.pourId, pourId));
    expect(cancelled.filter((row) => row.cancelledAt === null && row.fannedOutAt === null)).toEqual([]);
    await context.close();
  }, 240_000);

  it('should have thrown no errors', () => {
    expect(pageErrors).toEqual([]);
  });
});
