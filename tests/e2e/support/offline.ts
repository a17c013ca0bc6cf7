import type { Page } from 'playwright-core';

/** Waits until the service worker controls the page and holds every file the build listed for it. */
export async function waitUntilReadyOffline(page: Page): Promise<void> {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
    if (!navigator.serviceWorker.controller) {
      await new Promise((resolve) =>
        navigator.serviceWorker.addEventListener('controllerchange', resolve, { once: true }),
      );
    }
  });
  await page.waitForFunction(
    async () => {
      const manifest = (await (await fetch('/ngsw.json', { cache: 'no-store' })).json()) as {
        hashTable: Record<string, string>;
      };
      const names = await caches.keys();
      for (const url of Object.keys(manifest.hashTable)) {
        let found = false;
        for (const name of names) {
          if (await (await caches.open(name)).match(url)) {
            found = true;
            break;
          }
        }
        if (!found) return false;
      }
      return true;
    },
    null,
    { polling: 500, timeout: 30_000 },
  );
}
