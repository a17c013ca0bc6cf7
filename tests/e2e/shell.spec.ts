import type { Browser } from 'playwright-core';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';

describe('the production app shell', () => {
  let app: RunningApp;
  let browser: Browser;

  beforeAll(async () => {
    app = await startAppServer();
    browser = await launchChromium();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  it('should load with our name, no console errors, only local requests, and a controlling service worker', async () => {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    const consoleErrors: string[] = [];
    const requestedHosts = new Set<string>();
    const requestedFonts: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text());
    });
    page.on('pageerror', (error) => consoleErrors.push(error.message));
    context.on('request', (request) => {
      requestedHosts.add(new URL(request.url()).hostname);
      if (request.url().endsWith('.woff2')) requestedFonts.push(request.url());
    });

    await page.goto(app.origin, { waitUntil: 'networkidle' });
    await page.locator('bt-root .wordmark').waitFor();
    const controlled = await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
      if (!navigator.serviceWorker.controller) {
        await new Promise((resolve) =>
          navigator.serviceWorker.addEventListener('controllerchange', resolve, { once: true }),
        );
      }
      return navigator.serviceWorker.controller !== null;
    });
    const fontLoaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].some(
        (face) => face.family.replace(/"/g, '') === 'Source Sans 3' && face.status === 'loaded',
      );
    });
    await page.screenshot({ path: screenshotPath('shell-phone'), fullPage: true });

    expect(await page.locator('bt-root .wordmark').textContent()).toBe('Benchtide');
    expect(await page.title()).toContain('Benchtide');
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBeTrue();
    expect(controlled).toBeTrue();
    expect(fontLoaded).toBeTrue();
    expect(requestedFonts.length).toBeGreaterThan(0);
    expect(consoleErrors).toEqual([]);
    expect([...requestedHosts]).toEqual(['127.0.0.1']);
    await context.close();
  }, 60_000);
});
