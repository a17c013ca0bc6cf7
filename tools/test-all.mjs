// `npm test`: set up like `npm start`, then run every suite and end with one line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { stop as stopPostgres } from './postgres.mjs';
import { main, root, setUp } from './setup.mjs';

const RESULTS = join(root, 'tests', '.results');
const JASMINE = ['--import', 'tsx', 'node_modules/jasmine/bin/jasmine.js'];
const NG = 'node_modules/@angular/cli/bin/ng.js';

/** Each suite is a Node program; counted ones report through BENCHTIDE_SUMMARY_FILE, the rest count as one check. */
const SUITES = [
  { name: 'lint (eslint)', args: ['node_modules/eslint/bin/eslint.js', '.'] },
  { name: 'format (prettier)', args: ['node_modules/prettier/bin/prettier.cjs', '--check', '.'] },
  { name: 'types (server, shared, tests)', args: ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.node.json'] },
  {
    name: 'types (end-to-end specs)',
    args: ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.e2e.json', '--noEmit'],
  },
  { name: 'shared and server specs', args: [...JASMINE, '--config=tests/jasmine.json'], counted: true },
  { name: 'chaos sync', args: [...JASMINE, '--config=tests/chaos/jasmine.json'], counted: true },
  { name: 'app specs (karma)', args: [NG, 'test', '--watch=false', '--no-progress'], counted: true },
  { name: 'production build', args: [NG, 'build'] },
  { name: 'end-to-end specs', args: [...JASMINE, '--config=tests/e2e/jasmine.json'], counted: true, needsBuild: true },
];

function runSuite(suite, env) {
  const summaryFile = join(RESULTS, `${suite.name.replace(/\W+/g, '-')}.json`);
  rmSync(summaryFile, { force: true });
  console.log(`\n=== ${suite.name} ===`);
  const started = Date.now();
  const result = spawnSync(process.execPath, suite.args, {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, ...env, BENCHTIDE_SUMMARY_FILE: summaryFile },
  });
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  const exitedOk = result.status === 0;
  let counts = { passed: exitedOk ? 1 : 0, failed: exitedOk ? 0 : 1 };
  if (suite.counted) {
    counts = existsSync(summaryFile) ? JSON.parse(readFileSync(summaryFile, 'utf8')) : { passed: 0, failed: 1 };
    // A runner that crashed after reporting, or reported nothing, still fails the run.
    if (!exitedOk && counts.failed === 0) counts.failed = 1;
    if (counts.passed + counts.failed === 0) counts.failed = 1;
  }
  console.log(`--- ${suite.name}: ${counts.passed} passed, ${counts.failed} failed (${seconds} s)`);
  return counts;
}

await main(async () => {
  const { databaseUrl, startedPostgres } = await setUp({ forTests: true });
  mkdirSync(RESULTS, { recursive: true });
  const env = {
    TEST_DATABASE_URL: databaseUrl,
    CHROME_BIN: '/usr/bin/chromium',
    LOG_LEVEL: 'silent',
    NG_CLI_ANALYTICS: 'false',
  };
  const totals = { passed: 0, failed: 0 };
  const lines = [];
  let buildFailed = false;
  try {
    for (const suite of SUITES) {
      if (suite.needsBuild && buildFailed) {
        lines.push(`${suite.name}: not run, the production build failed`);
        totals.failed += 1;
        continue;
      }
      const counts = runSuite(suite, env);
      if (suite.name === 'production build' && counts.failed) buildFailed = true;
      totals.passed += counts.passed;
      totals.failed += counts.failed;
      lines.push(`${suite.name}: ${counts.passed} passed, ${counts.failed} failed`);
    }
  } finally {
    if (startedPostgres) stopPostgres();
  }
  console.log(`\n${lines.join('\n')}\n`);
  console.log(`${totals.passed} passed, ${totals.failed} failed`);
  process.exitCode = totals.failed === 0 ? 0 : 1;
});
