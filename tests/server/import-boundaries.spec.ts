import { ESLint } from 'eslint';
import { rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** Lints files written into the app for the length of one check, with the repository's own config. */
async function lintProbe(files: Readonly<Record<string, string>>): Promise<string[]> {
  const paths = Object.keys(files).map((name) => join(ROOT, 'src/app', name));
  try {
    for (const [index, path] of paths.entries()) writeFileSync(path, Object.values(files)[index]!);
    const results = await new ESLint({ cwd: ROOT }).lintFiles(paths);
    return results.flatMap((result) => result.messages.map((message) => message.ruleId ?? message.message));
  } finally {
    for (const path of paths) rmSync(path, { force: true });
  }
}

describe('the lint of import boundaries', () => {
  it('should refuse core/ importing a feature', async () => {
    const rules = await lintProbe({ 'core/boundary-probe.ts': "export { LogPour } from '../pours/log-pour';\n" });
    expect(rules).toContain('no-restricted-imports');
  });

  it('should refuse sync/ importing a feature', async () => {
    const rules = await lintProbe({ 'sync/boundary-probe.ts': "export { BuildLog } from '../builds/build-log';\n" });
    expect(rules).toContain('no-restricted-imports');
  });

  it('should refuse a feature importing one that may import it back', async () => {
    const rules = await lintProbe({ 'pours/boundary-probe.ts': "export { BuildLog } from '../builds/build-log';\n" });
    expect(rules).toContain('no-restricted-imports');
  });

  it('should refuse two files importing each other', async () => {
    const rules = await lintProbe({
      'core/cycle-probe-a.ts': "import { b } from './cycle-probe-b';\nexport const a = (): number => b() + 1;\n",
      'core/cycle-probe-b.ts': "import { a } from './cycle-probe-a';\nexport const b = (): number => a() - 1;\n",
    });
    expect(rules).toContain('import-x/no-cycle');
  });

  it('should let a feature import core/, sync/ and shared/', async () => {
    const rules = await lintProbe({
      'builds/boundary-probe.ts':
        "export { AccountSession } from '../core/account-session';\nexport { BenchDb } from '../sync/bench-db';\nexport { planPour } from '@benchtide/shared';\n",
    });
    expect(rules).toEqual([]);
  });
});
