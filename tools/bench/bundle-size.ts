// Sizes of the production build: the JavaScript and CSS a first visit loads (index.html's module
// script and every chunk it imports statically, and its stylesheets), raw and gzipped at level 9 as a server
// would send them, and the lazy chunks loaded later. Target: initial JavaScript at most 150 kB
// gzipped. Run with `npm run bench:bundle` (it builds first).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

const DIR = join('dist', 'benchtide', 'browser');
const TARGET_KB = 150;

const html = readFileSync(join(DIR, 'index.html'), 'utf8');
const named = (pattern: RegExp) => [...html.matchAll(pattern)].map((match) => match[1]!);
/** Files a module imports statically (`import … from "./x.js"`, `export … from`), not with `import()`. */
function staticImports(file: string): string[] {
  const code = readFileSync(join(DIR, file), 'utf8');
  return [...code.matchAll(/(?:import|export)\s*(?:[^"'()]*?from\s*)?["']\.\/([\w.-]+\.js)["']/g)].map((m) => m[1]!);
}
// Everything the entry module reaches through static imports loads before the first render (the
// loop visits what it appends, so it walks the whole graph).
const initialScripts = named(/<script[^>]+src="([^"]+\.js)"/g);
for (const script of initialScripts) {
  for (const file of staticImports(script)) if (!initialScripts.includes(file)) initialScripts.push(file);
}
const initialStyles = named(/<link rel="stylesheet" href="([^"]+\.css)"/g);
const allScripts = readdirSync(DIR).filter(
  (name) => name.endsWith('.js') && !/^(ngsw-worker|safety-worker|worker-basic)/.test(name),
);
const lazyScripts = allScripts.filter((name) => !initialScripts.includes(name));

function sizes(files: readonly string[]) {
  let raw = 0;
  let gzipped = 0;
  for (const file of files) {
    const bytes = readFileSync(join(DIR, file));
    raw += bytes.length;
    gzipped += gzipSync(bytes, { level: 9 }).length;
  }
  return { files: files.length, rawKb: raw / 1000, gzipKb: gzipped / 1000 };
}

const rows = [
  ['initial JavaScript', sizes(initialScripts)],
  ['initial CSS', sizes(initialStyles)],
  ['lazy JavaScript (all routes)', sizes(lazyScripts)],
] as const;
console.log('| part | files | raw kB | gzipped kB |');
console.log('|---|---:|---:|---:|');
for (const [name, size] of rows) {
  console.log(`| ${name} | ${size.files} | ${size.rawKb.toFixed(1)} | ${size.gzipKb.toFixed(1)} |`);
}
const initial = rows[0][1].gzipKb;
const met = initial <= TARGET_KB;
console.log(
  `\nInitial JavaScript ${initial.toFixed(1)} kB gzipped: target ≤ ${TARGET_KB} kB ${met ? 'met' : 'NOT met'}.`,
);
process.exitCode = met ? 0 : 1;
