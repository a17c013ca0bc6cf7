import type { Browser, BrowserContext, Page } from 'playwright-core';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';
import { waitUntilReadyOffline } from './support/offline.js';

describe('planning with no account and no network, on a phone', () => {
  let app: RunningApp;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  const pageErrors: string[] = [];

  beforeAll(async () => {
    app = await startAppServer();
    browser = await launchChromium();
    context = await browser.newContext(PHONE);
    page = await context.newPage();
    page.on('pageerror', (error) => pageErrors.push(error.message));
    await page.goto(app.origin, { waitUntil: 'networkidle' });
    await waitUntilReadyOffline(page);
    await context.setOffline(true);
  }, 90_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  async function type(field: string, value: string): Promise<void> {
    await page.locator(`[data-field="${field}"]`).fill(value);
  }

  it('should plan a pour offline and show the amounts worked out on the device', async () => {
    await page.goto(`${app.origin}/pour-planner`);
    await page.locator('[data-result="to-mix"]').waitFor();

    await type('length', '200');
    await type('width', '80');
    await type('depth', '9');
    await type('waste', '10');
    await type('roomTemp', '25');

    // Worked by hand (1 mL = 1000 mm³, NIST SP 811): 200 × 80 × 9 mm = 144 mL, plus 10 % = 158.4 mL, shown to 3 figures.
    // The preset's typical 2:1 by volume: part A 105.6 mL × 1.12 g/mL = 118.3 g, part B 52.8 mL × 0.98 g/mL = 51.7 g.
    expect(await page.locator('[data-result="to-mix"] .value').textContent()).toBe('158 mL');
    expect(await page.locator('[data-result="part-a"] .amount').textContent()).toBe('118.3 g');
    expect(await page.locator('[data-result="part-b"] .amount').textContent()).toBe('51.7 g');
    // At the data sheet's own 25 °C the 10-degree rule (common practice) changes nothing.
    expect((await page.locator('[data-result="cure-basis"]').textContent())?.trim()).toMatch(/× 1$/);
    expect(await page.getByRole('status').filter({ hasText: 'Offline' }).isVisible()).toBeTrue();
    await page.screenshot({ path: screenshotPath('pour-planner-offline-390x844') });
  }, 60_000);

  it('should refuse an impossible depth offline with a plain message and no numbers', async () => {
    await page.goto(`${app.origin}/pour-planner`);
    await type('depth', '-3');

    expect(await page.getByText('Depth must be more than 0 mm').first().isVisible()).toBeTrue();
    expect(await page.locator('[data-result="to-mix"]').count()).toBe(0);
    await type('depth', '6');
  }, 60_000);

  it('should compare bases across scales offline', async () => {
    await page.goto(`${app.origin}/scale-tools`);
    await page.locator('[data-scale="n"]').waitFor();

    // 40 m × 12 m at N 1:160 (NMRA S-1.2): 250 mm × 75 mm; at HO 1:87.1: 459 mm × 138 mm.
    expect(await page.locator('[data-scale="n"] .size').textContent()).toBe('250 mm × 75 mm');
    expect(await page.locator('[data-scale="ho"] .size').textContent()).toBe('459 mm × 138 mm');
    expect(await page.locator('svg.drawing rect').count()).toBe(4);
    await page.screenshot({ path: screenshotPath('scale-tools-offline-390x844') });
  }, 60_000);

  it('should have thrown no errors in the page while offline', () => {
    expect(pageErrors).toEqual([]);
  });
});
