import { readdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { photos } from '../../server/db/schema/index.js';
import { addMember, makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { benchJpeg } from '../support/photos.js';
import { addBuild, api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';
import { waitUntilReadyOffline } from './support/offline.js';
import { signIn, untilSynced } from './support/phone.js';

/** Every file under a folder, however deep. */
function filesUnder(folder: string): string[] {
  return readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => join(entry.parentPath, entry.name));
}

/** A photo taken at the bench with no connection reaches the server once and shows on another phone. */
describe('bench photos across two phones', () => {
  let seed: TestServer;
  let app: RunningApp;
  let browser: Browser;
  let photoDir: string;
  let builder: TestAccount;
  let owner: TestAccount;
  let workshopId: string;
  let buildId: string;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    seed = await testServer();
    owner = await makeAccount(seed.ctx, 'Saoirse');
    builder = await makeAccount(seed.ctx, 'Declan');
    workshopId = (await makeWorkshop(seed.ctx, owner, 'Photo club')).id;
    await addMember(seed.ctx, workshopId, builder, 'builder');
    buildId = await addBuild(api(seed, owner, workshopId), { name: 'Quay at Fennick' });
    photoDir = mkdtempSync(join(tmpdir(), 'benchtide-e2e-photos-'));
    app = await startAppServer({ PHOTO_DIR: photoDir });
    browser = await launchChromium();
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    rmSync(photoDir, { recursive: true, force: true });
  });

  async function phoneOf(account: TestAccount, name: string): Promise<{ context: BrowserContext; page: Page }> {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    page.on('pageerror', (error) => pageErrors.push(`${name}: ${error.message}`));
    await signIn(page, app.origin, account);
    await page.evaluate((id) => localStorage.setItem('benchtide.current-workshop', id), workshopId);
    await waitUntilReadyOffline(page);
    await untilSynced(page, app.origin);
    return { context, page };
  }

  async function photosOnServer() {
    return seed.ctx.db
      .select()
      .from(photos)
      .where(and(eq(photos.workshopId, workshopId), eq(photos.buildId, buildId)));
  }

  it('should keep a photo taken offline, upload it once on reconnecting, and show it on a second phone', async () => {
    const one = await phoneOf(builder, 'builder');
    await one.context.setOffline(true);
    await one.page.goto(`${app.origin}/builds/${buildId}`);
    await one.page.getByRole('heading', { name: 'Photos' }).waitFor();
    const bytes = await benchJpeg({ width: 800, height: 600 });
    await one.page
      .locator('[data-field="library"]')
      .setInputFiles({ name: 'quay-first-layer.jpg', mimeType: 'image/jpeg', buffer: bytes });

    // At once, from the phone's own store, waiting for a connection.
    const tile = one.page.locator('[data-upload-state="waiting"]').first();
    await tile.waitFor();
    await one.page.waitForFunction(() => {
      const image = document.querySelector<HTMLImageElement>('[data-upload-state] img');
      return image !== null && image.complete && image.naturalWidth > 0;
    });
    await one.page.screenshot({ path: screenshotPath('photo-offline-390x844') });
    expect(await photosOnServer()).toEqual([]);

    await one.context.setOffline(false);
    await untilSynced(one.page, app.origin);
    const deadline = Date.now() + 30_000;
    while ((await photosOnServer()).length === 0 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
    // A second round must not send it again.
    await untilSynced(one.page, app.origin);
    const kept = await photosOnServer();
    expect(kept.length).toBe(1);
    // Exactly the two copies of that one photo: its display copy and its thumbnail.
    expect(filesUnder(photoDir).length).toBe(2);

    const two = await phoneOf(owner, 'owner');
    await two.page.goto(`${app.origin}/builds/${buildId}`);
    await two.page.locator(`[data-photo="${kept[0]!.id}"] img`).waitFor();
    await two.page.waitForFunction(
      (id) => {
        const image = document.querySelector<HTMLImageElement>(`[data-photo="${id}"] img`);
        return image !== null && image.complete && image.naturalWidth > 0 && image.src.includes('/photos/');
      },
      kept[0]!.id,
      { timeout: 15_000 },
    );
    await two.page.screenshot({ path: screenshotPath('photo-second-phone-390x844') });
  }, 240_000);

  it('should have thrown no errors in either page', () => {
    expect(pageErrors).toEqual([]);
  });
});
