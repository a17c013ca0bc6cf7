// Writes this Jasmine run's pass/fail counts where tools/test-all.mjs reads them for the summary line.
import { writeFileSync } from 'node:fs';

const counts = { passed: 0, failed: 0, skipped: 0 };

jasmine.getEnv().addReporter({
  specDone(result) {
    if (result.status === 'passed') counts.passed += 1;
    else if (result.status === 'failed') counts.failed += 1;
    else counts.skipped += 1;
  },
  suiteDone(result) {
    // A failing beforeAll/afterAll fails its suite without failing a spec.
    if (result.status === 'failed') counts.failed += 1;
  },
  jasmineDone(result) {
    if (result.overallStatus === 'failed' && counts.failed === 0) counts.failed = 1;
    const file = process.env['BENCHTIDE_SUMMARY_FILE'];
    if (file) writeFileSync(file, JSON.stringify(counts));
  },
});
