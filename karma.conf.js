// Karma runs the Angular specs (beside their components in src/) in Debian's headless Chromium.
import { writeFileSync } from 'node:fs';
import karmaJasmine from 'karma-jasmine';
import karmaChromeLauncher from 'karma-chrome-launcher';

process.env.CHROME_BIN ??= '/usr/bin/chromium';

/** Writes the pass/fail counts where tools/test-all.mjs reads them for the summary line. */
function SummaryFileReporter(baseReporterDecorator) {
  baseReporterDecorator(this);
  const counts = { passed: 0, failed: 0, skipped: 0 };
  this.onSpecComplete = (_browser, result) => {
    if (result.skipped || result.pending) counts.skipped += 1;
    else if (result.success) counts.passed += 1;
    else counts.failed += 1;
  };
  this.onRunComplete = (_browsers, results) => {
    if (results.error && counts.failed === 0) counts.failed = 1;
    if (process.env.BENCHTIDE_SUMMARY_FILE) writeFileSync(process.env.BENCHTIDE_SUMMARY_FILE, JSON.stringify(counts));
  };
}
SummaryFileReporter.$inject = ['baseReporterDecorator'];

/** Says which random order the specs ran in, so a failure that needed it can be run again in the same one. */
function SeedReporter() {
  this.onBrowserComplete = (_browser, result) => {
    const seed = result?.order?.seed;
    if (seed) process.stdout.write(`\nRandom order, seed ${seed} (again: BENCHTIDE_KARMA_SEED=${seed})\n`);
  };
}

export default function (config) {
  config.set({
    basePath: '',
    frameworks: ['jasmine'],
    plugins: [
      karmaJasmine,
      karmaChromeLauncher,
      { 'reporter:summary-file': ['type', SummaryFileReporter] },
      { 'reporter:seed': ['type', SeedReporter] },
    ],
    client: { jasmine: { random: true, seed: process.env.BENCHTIDE_KARMA_SEED }, clearContext: true },
    reporters: ['dots', 'summary-file', 'seed'],
    browsers: ['ChromiumHeadlessBench'],
    customLaunchers: {
      ChromiumHeadlessBench: {
        base: 'ChromeHeadless',
        flags: [
          '--no-sandbox',
          '--disable-gpu',
          '--disable-dev-shm-usage',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
          '--no-first-run',
        ],
      },
    },
    browserNoActivityTimeout: 120000,
    singleRun: true,
    restartOnFileChange: false,
  });
}
