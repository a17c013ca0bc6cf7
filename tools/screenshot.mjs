// Takes a full-page screenshot of a running Benchtide page in Debian's Chromium, for looking at
// what we build. Usage: node tools/screenshot.mjs URL OUT.png [width=390] [height=844] [dark]
import { chromium } from 'playwright-core';

const [url, out, width = '390', height = '844', scheme = 'light'] = process.argv.slice(2);
if (!url || !out) {
  console.error('usage: node tools/screenshot.mjs URL OUT.png [width] [height] [light|dark]');
  process.exit(2);
}
const browser = await chromium.launch({
  executablePath: '/usr/bin/chromium',
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
const page = await browser.newPage({ viewport: { width: Number(width), height: Number(height) }, colorScheme: scheme });
page.on('console', (message) => console.log(`console ${message.type()}: ${message.text()}`));
await page.goto(url, { waitUntil: 'networkidle' });
await page.screenshot({ path: out, fullPage: true });
await browser.close();
console.log(`wrote ${out}`);
