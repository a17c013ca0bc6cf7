import type { Browser } from 'playwright-core';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { addBuild, addContainer, addMaterial, api, pourBody } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';
import { waitUntilReadyOffline } from './support/offline.js';
import { signIn, untilSynced } from './support/phone.js';

/** A pour's next layer comes due while the app is open on the phone: a banner and a notification. */
describe('pour alerts in the open app', () => {
  let seed: TestServer;
  let app: RunningApp;
  let browser: Browser;
  let builder: TestAccount;
  let workshopId: string;
  let buildId: string;
  let pourId: string;
  const pageErrors: string[] = [];
  // TEST_DATA_SHEET: the next layer may go on 240 min after the first (at 20 °C, the reference).
  const RECOAT_MS = 240 * 60_000;
  const DUE_IN_MS = 30_000;

  beforeAll(async () => {
    seed = await testServer();
    const owner = await makeAccount(seed.ctx, 'Fionn');
    builder = await makeAccount(seed.ctx, 'Grainne');
    workshopId = (await makeWorkshop(seed.ctx, owner, 'Alert club')).id;
    await addMember(seed.ctx, workshopId, builder, 'builder');
    const client = api(seed, owner, workshopId);
    buildId = await addBuild(client, { name: 'Ford at Carrow' });
    const materialId = await addMaterial(client);
    await addContainer(client, materialId, { part: 'A', sizeQty: 1000 });
    await addContainer(client, materialId, { part: 'B', sizeQty: 1000 });
    app = await startAppServer();
    browser = await launchChromium();
    // 15 mm deep at most 10 mm a layer: two layers; the first went on long enough ago that the second is due soon.
    const body = pourBody(buildId, materialId, {
      depthMm: 15,
      note: 'Ford shallows',
      startAt: new Date(Date.now() - RECOAT_MS + DUE_IN_MS).toISOString(),
    });
    await client.post('/pours', body).expect(201);
    pourId = body.id;
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  it('should show a banner and a service worker notification that leads to the pour', async () => {
    const context = await browser.newContext({ ...PHONE });
    await context.grantPermissions(['notifications'], { origin: app.origin });
    const page = await context.newPage();
    page.on('pageerror', (error) => pageErrors.push(error.message));
    await signIn(page, app.origin, builder);
    await page.evaluate((id) => localStorage.setItem('benchtide.current-workshop', id), workshopId);
    await waitUntilReadyOffline(page);
    await untilSynced(page, app.origin);
    await page.goto(app.origin);
    await page.getByRole('heading', { name: 'Ford at Carrow' }).first().waitFor();

    const banner = page.getByRole('alert').filter({ hasText: 'Layer 2 of 2 can go on' });
    await banner.waitFor({ timeout: DUE_IN_MS + 30_000 });
    await page.screenshot({ path: screenshotPath('pour-alert-390x844') });
    const shown = await page.evaluate(async () => {
      const registration = await navigator.serviceWorker.getRegistration();
      return (await registration!.getNotifications()).map((n) => ({
        title: n.title,
        body: n.body,
        tag: n.tag,
        data: n.data,
      }));
    });
    expect(shown.length).toBe(1);
    expect(shown[0]!.title).toBe('Layer 2 of 2 can go on');
    expect(shown[0]!.body).toContain('Ford shallows on Ford at Carrow');
    expect(shown[0]!.tag).toBe(`pour:${pourId}:next-layer-due:2`);
    expect(shown[0]!.data.onActionClick.default).toEqual({
      operation: 'navigateLastFocusedOrOpen',
      url: `/builds/${buildId}?pour=${pourId}`,
    });

    await banner.getByRole('link', { name: 'Open the pour' }).click();
    await page.waitForURL(`${app.origin}/builds/${buildId}?pour=${pourId}`);
    await page.locator(`[data-pour="${pourId}"].highlighted`).waitFor();
    await context.close();
  }, 180_000);

  it('should have thrown no errors', () => {
    expect(pageErrors).toEqual([]);
  });
});
