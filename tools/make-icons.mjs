// Renders the app icons for the manifest and the browser tab from public/logo.svg.
// Run after changing the logo: node tools/make-icons.mjs
import sharp from 'sharp';
import { readFileSync } from 'node:fs';

const logo = readFileSync(new URL('../public/logo.svg', import.meta.url));
const out = (name) => new URL(`../public/icons/${name}`, import.meta.url).pathname;
const BACKGROUND = '#17606B';

for (const size of [32, 180, 192, 512]) {
  await sharp(logo, { density: 72 * (size / 64) })
    .resize(size, size)
    .png()
    .toFile(out(`icon-${size}.png`));
}
// A maskable icon keeps its mark inside the central 80 % safe zone on a full-bleed background.
const inner = await sharp(logo, { density: 72 * (384 / 64) })
  .resize(384, 384)
  .png()
  .toBuffer();
await sharp({ create: { width: 512, height: 512, channels: 4, background: BACKGROUND } })
  .composite([{ input: inner, gravity: 'center' }])
  .png()
  .toFile(out('maskable-512.png'));
console.log('wrote public/icons/*.png');
