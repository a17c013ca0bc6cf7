import { and, eq, isNull } from 'drizzle-orm';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { ledgerEntries, pours } from '../../server/db/schema/index.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';
import { waitUntilReadyOffline } from './support/offline.js';
import { signIn, untilSynced } from './support/phone.js';

interface Phone {
  name: string;
  account: TestAccount;
  context: BrowserContext;
  page: Page;
}

/** Two builders of one workshop log pours on their phones with no connection at all, then reconnect. */
describe('two phones logging pours offline', () => {
  let seed: TestServer;
  let app: RunningApp;
  let browser: Browser;
  let phones: Phone[];
  let workshopId: string;
  let containerIds: string[];
  const pageErrors: string[] = [];

  beforeAll(async () => {
    seed = await testServer();
    const owner = await makeAccount(seed.ctx, 'Maren');
    const second = await makeAccount(seed.ctx, 'Odile');
    workshopId = (await makeWorkshop(seed.ctx, owner, 'Two-phone club')).id;
    await addMember(seed.ctx, workshopId, second, 'builder');
    const client = api(seed, owner, workshopId);
    await addBuild(client, { name: 'Weir at Thornmoss' });
    const materialId = await addMaterial(client, { name: 'Club clear resin' });
    containerIds = [
      await addContainer(client, materialId, { part: 'A', sizeQty: 500, unit: 'g' }),
      await addContainer(client, materialId, { part: 'B', sizeQty: 500, unit: 'g' }),
    ];

    app = await startAppServer();
    browser = await launchChromium();
    phones = [];
    for (const [name, account] of [
      ['one', owner],
      ['two', second],
    ] as const) {
      const context = await browser.newContext(PHONE);
      const page = await context.newPage();
      page.on('pageerror', (error) => pageErrors.push(`${name}: ${error.message}`));
      await signIn(page, app.origin, account);
      await waitUntilReadyOffline(page);
      phones.push({ name, account, context, page });
    }
    // Both phones hold the workshop's build and shelf before the connection goes.
    for (const phone of phones) await untilSynced(phone.page, app.origin);
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  async function logPour(page: Page, feature: string, lengthMm: string): Promise<void> {
    await page.goto(`${app.origin}/log-pour`);
    await page.locator('[data-field="length"]').waitFor();
    await page.locator('[data-field="note"]').fill(feature);
    await page.locator('[data-field="length"]').fill(lengthMm);
    await page.locator('[data-field="width"]').fill('50');
    await page.locator('[data-field="depth"]').fill('4');
    await page.locator('[data-field="waste"]').fill('0');
    await page.getByRole('button', { name: 'Start pour' }).click();
    await page.waitForURL(`${app.origin}/`);
    await page.getByRole('heading', { name: 'Weir at Thornmoss' }).first().waitFor();
  }

  /** Remaining stock per container by this phone's own stock book. */
  function stockOnPhone(page: Page): Promise<Record<string, number>> {
    return page.evaluate(async () => {
      const request = indexedDB.open('benchtide');
      const db = await new Promise<IDBDatabase>((resolve, reject) => {
        request.onsuccess = () => resolve(request.result);
        request.onerror = () => reject(request.error);
      });
      const entries = await new Promise<{ containerId: string; quantity: number; deletedAt: string | null }[]>(
        (resolve) => {
          const all = db.transaction('ledgerEntries').objectStore('ledgerEntries').getAll();
          all.onsuccess = () => resolve(all.result);
        },
      );
      db.close();
      const sums: Record<string, number> = {};
      for (const entry of entries) {
        if (entry.deletedAt !== null) continue;
        sums[entry.containerId] = Math.round(((sums[entry.containerId] ?? 0) + entry.quantity) * 1000) / 1000;
      }
      return sums;
    });
  }

  async function stockOnServer(): Promise<Record<string, number>> {
    const rows = await seed.ctx.db
      .select()
      .from(ledgerEntries)
      .where(and(eq(ledgerEntries.workshopId, workshopId), isNull(ledgerEntries.deletedAt)));
    const sums: Record<string, number> = {};
    for (const row of rows) {
      sums[row.containerId] = Math.round(((sums[row.containerId] ?? 0) + Number(row.quantity)) * 1000) / 1000;
    }
    return sums;
  }

  it('should keep both pours through a reload with no network, then hold exactly their union everywhere', async () => {
    const port = app.port;
    // No network at all: the server is gone (so the service worker's own fetches fail too) and the phones say offline.
    await app.stop();
    for (const phone of phones) await phone.context.setOffline(true);

    await logPour(phones[0]!.page, 'Upper pool, phone one', '100');
    await logPour(phones[1]!.page, 'Lower pool, phone two', '150');

    for (const phone of phones) {
      await phone.page.reload();
      // The shell comes from the service worker; the pour and its timer from the phone's own store.
      await phone.page.getByRole('heading', { name: 'Weir at Thornmoss' }).first().waitFor();
      // The sync chip loads once the browser is idle; it then counts this phone's waiting pour.
      await phone.page.getByText('Offline · 1 waiting').waitFor({ timeout: 15_000 });
      await phone.page.screenshot({ path: screenshotPath(`two-phones-offline-${phone.name}-390x844`) });
    }

    app = await startAppServer({}, port);
    for (const phone of phones) await phone.context.setOffline(false);
    // Phone one may have pulled before phone two pushed: a second round brings everything to both.
    for (const phone of phones) await untilSynced(phone.page, app.origin);
    for (const phone of phones) await untilSynced(phone.page, app.origin);

    const onServer = await seed.ctx.db
      .select()
      .from(pours)
      .where(and(eq(pours.workshopId, workshopId), isNull(pours.deletedAt)));
    expect(onServer.map((pour) => pour.note).sort()).toEqual(['Lower pool, phone two', 'Upper pool, phone one']);

    // 100 × 50 × 4 mm = 20 mL and 150 × 50 × 4 mm = 30 mL (1 mL = 1000 mm³, NIST SP 811); 1:1 by weight at
    // 1.1 and 0.9 g/mL gives 19.8 g and 29.7 g in all (worked example), half of each from each part.
    const serverStock = await stockOnServer();
    expect(serverStock[containerIds[0]!]).toBeCloseTo(500 - 9.9 - 14.85, 0);
    expect(serverStock[containerIds[1]!]).toBeCloseTo(500 - 9.9 - 14.85, 0);
    for (const phone of phones) {
      expect(await stockOnPhone(phone.page))
        .withContext(phone.name)
        .toEqual(serverStock);
    }
    await phones[0]!.page.goto(app.origin);
    await phones[0]!.page.getByRole('heading', { name: 'Weir at Thornmoss' }).nth(1).waitFor();
    await phones[0]!.page.screenshot({ path: screenshotPath('two-phones-after-sync-390x844') });
  }, 240_000);

  it('should have thrown no errors in either page', () => {
    expect(pageErrors).toEqual([]);
  });
});
