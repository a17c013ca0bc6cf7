// `npm run bench`: builds the app once, runs every benchmark in turn (each as its own program, with
// its output shown as it goes) and writes one Markdown report with the date, the machine and every
// figure: tools/bench/reports/<date>.md. Each benchmark states its own target; the report says
// which were met. The benchmarks use databases of their own, so the demo and test data are untouched.
import { execFileSync, spawn } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, release, totalmem, type } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';

interface Benchmark {
  title: string;
  what: string;
  args: string[];
  /** Figures to read beside the baseline in the same run, with no target of their own. */
  noTarget?: boolean;
}

const TSX = ['--import', 'tsx'];
const BENCHMARKS: Benchmark[] = [
  {
    title: 'API under load',
    what: 'autocannon, 100 connections on 127.0.0.1, each route beside GET /api/health in the same run',
    args: [...TSX, 'tools/bench/api-load.ts'],
    noTarget: true,
  },
  {
    title: 'Sync against raw inserts',
    what: 'push of 1,000 queued changes and pull of 10,000 through the sync services, beside plain SQL',
    args: [...TSX, 'tools/bench/sync.ts'],
  },
  {
    title: 'Cost report over 100,000 pours',
    what: 'the cost report and the shelf query on a workshop filled with 100,000 pours',
    args: [...TSX, 'tools/bench/cost-report.ts'],
  },
  {
    title: 'Bundle sizes',
    what: 'the production build: what a first visit loads, raw and gzipped',
    args: [...TSX, 'tools/bench/bundle-size.ts'],
  },
  {
    title: 'Lighthouse',
    what: 'Lighthouse 12.2.3 mobile preset in Debian Chromium on Bench, Builds and Log a pour',
    args: [...TSX, 'tools/bench/lighthouse.ts'],
  },
  {
    title: 'Advisories in production packages',
    what: '`npm audit --omit=dev`, high and critical advisories not explained in tools/audit-explained.json',
    args: ['tools/audit-production.mjs'],
  },
];

const OUTCOME: Record<number, string> = { 0: 'target met', 1: 'target NOT met', 2: 'not measured' };

function quietly(command: string, args: string[]): string {
  try {
    return execFileSync(command, args, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
  } catch {
    return 'unknown';
  }
}

async function postgresVersion(): Promise<string> {
  const client = new pg.Client({
    connectionString: process.env['DATABASE_URL'] ?? 'postgres://benchtide@127.0.0.1:54329/benchtide',
  });
  try {
    await client.connect();
    const { rows } = await client.query<{ server_version: string }>('SHOW server_version');
    return `PostgreSQL ${rows[0]!.server_version}`;
  } catch {
    return 'PostgreSQL version unknown';
  } finally {
    await client.end().catch(() => undefined);
  }
}

async function machine(): Promise<string[]> {
  const cores = cpus();
  const dirty = quietly('git', ['status', '--porcelain']) === '' ? '' : ' (with uncommitted changes)';
  return [
    `- Commit: ${quietly('git', ['rev-parse', '--short', 'HEAD'])}${dirty}`,
    `- CPU: ${cores.length} × ${cores[0]?.model.trim() ?? 'unknown'}`,
    `- Memory: ${(totalmem() / 2 ** 30).toFixed(1)} GiB`,
    `- System: ${type()} ${release()}`,
    `- Node.js ${process.version}; ${await postgresVersion()}; ${quietly('/usr/bin/chromium', ['--version'])}`,
  ];
}

/** Runs one benchmark, echoing its output, and gives back what it printed and how it ended. */
function run(benchmark: Benchmark): Promise<{ output: string; code: number; seconds: number }> {
  const started = Date.now();
  return new Promise((resolve) => {
    const child = spawn(process.execPath, benchmark.args, { stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    const take = (chunk: Buffer, to: NodeJS.WriteStream) => {
      output += chunk.toString();
      to.write(chunk);
    };
    child.stdout.on('data', (chunk: Buffer) => take(chunk, process.stdout));
    child.stderr.on('data', (chunk: Buffer) => take(chunk, process.stderr));
    child.once('exit', (code) => resolve({ output, code: code ?? 1, seconds: (Date.now() - started) / 1000 }));
  });
}

const startedAt = new Date();
console.log('[bench] building the production app once for the bundle and Lighthouse figures…');
execFileSync(process.execPath, ['node_modules/@angular/cli/bin/ng.js', 'build'], {
  stdio: 'inherit',
  env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
});

const sections: string[] = [];
const summary: string[] = [];
for (const [i, benchmark] of BENCHMARKS.entries()) {
  console.log(`\n[bench] ${i + 1} of ${BENCHMARKS.length}: ${benchmark.title}`);
  const { output, code, seconds } = await run(benchmark);
  const outcome = code === 0 && benchmark.noTarget ? 'measured' : (OUTCOME[code] ?? `failed (exit ${code})`);
  summary.push(`| ${benchmark.title} | ${outcome} | ${seconds.toFixed(0)} s |`);
  // Tables the benchmarks print are Markdown already; everything else goes in a plain block.
  const isTable = (line: string) => line.startsWith('|');
  const lines = output
    .trimEnd()
    .split('\n')
    .filter((line, at, all) => line.trim() !== '' || (at > 0 && !isTable(all[at - 1]!)));
  const body: string[] = [];
  for (const [at, line] of lines.entries()) {
    const opensBlock = !isTable(line) && (at === 0 || isTable(lines[at - 1]!));
    const closesBlock = !isTable(line) && (at === lines.length - 1 || isTable(lines[at + 1]!));
    if (opensBlock) body.push('', '```text');
    body.push(line);
    if (closesBlock) body.push('```', '');
  }
  const text = body
    .join('\n')
    .replace(/\n{3,}/g, '\n\n')
    .trim();
  const what = benchmark.what[0]!.toUpperCase() + benchmark.what.slice(1);
  sections.push(`## ${benchmark.title}\n\n${what}. Outcome: **${outcome}**.\n\n${text}\n`);
}

const report = [
  `# Benchtide benchmarks, ${startedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`,
  '',
  ...(await machine()),
  `- Whole run: ${((Date.now() - startedAt.getTime()) / 60_000).toFixed(1)} min`,
  '',
  '| benchmark | outcome | time |',
  '|---|---|---:|',
  ...summary,
  '',
  ...sections,
].join('\n');
const dir = join('tools', 'bench', 'reports');
mkdirSync(dir, { recursive: true });
const file = join(dir, `${startedAt.toISOString().slice(0, 10)}.md`);
writeFileSync(file, report);
// Laid out as the repository's formatter wants it, so a report can be committed as it is.
execFileSync(process.execPath, ['node_modules/prettier/bin/prettier.cjs', '--write', file], { stdio: 'ignore' });
console.log(`\n[bench] report written to ${file}`);
