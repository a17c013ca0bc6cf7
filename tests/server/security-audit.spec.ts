import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, join } from 'node:path';
import { fileURLToPath } from 'node:url';

interface Explanation {
  advisory: string;
  package: string;
  reason: string;
}
interface AuditResult {
  status: 'clean' | 'advisories' | 'unavailable';
  high: number | null;
  critical: number | null;
  explained: number | null;
  advisories: { advisory: string; package: string; severity: string; reason: string | null }[];
  message: string;
}
/** The parts of the tool the spec calls; the tool is plain JavaScript without declarations. */
interface AuditTool {
  judgeAudit(output: string, explanations: Explanation[]): AuditResult;
  readExplanations(file?: string): Explanation[];
}

const TOOL_URL = new URL('../../tools/audit-production.mjs', import.meta.url);

/** What npm prints when the registry will not take the bulk advisory request. */
const REFUSED = JSON.stringify({
  message: '405 Method Not Allowed - POST https://registry.npmjs.org/-/npm/v1/security/advisories/bulk',
  method: 'POST',
  statusCode: 405,
  body: '',
  error: { summary: '', detail: '' },
});

interface Finding {
  name: string;
  severity: 'low' | 'moderate' | 'high' | 'critical';
  ghsa: string;
  /** Packages that depend on `name` and so carry the advisory too. */
  through?: string[];
}

/** An `npm audit --json` report (format 2) with the findings given, all invented for the spec. */
function auditReport(findings: Finding[]): string {
  const vulnerabilities: Record<string, object> = {};
  for (const { name, severity, ghsa, through = [] } of findings) {
    vulnerabilities[name] = {
      name,
      severity,
      isDirect: false,
      via: [
        {
          source: 1_000_000 + Object.keys(vulnerabilities).length,
          name,
          dependency: name,
          title: `Invented flaw in ${name}`,
          url: `https://github.com/advisories/${ghsa}`,
          severity,
          range: '<9.9.9',
        },
      ],
      effects: through,
      range: '<9.9.9',
      nodes: [`node_modules/${name}`],
      fixAvailable: true,
    };
    for (const parent of through) {
      vulnerabilities[parent] = { name: parent, severity, isDirect: true, via: [name], effects: [], range: '*' };
    }
  }
  const count = (severity: string) =>
    Object.values(vulnerabilities).filter((v) => 'severity' in v && v.severity === severity).length;
  return JSON.stringify({
    auditReportVersion: 2,
    vulnerabilities,
    metadata: {
      vulnerabilities: {
        info: 0,
        low: count('low'),
        moderate: count('moderate'),
        high: count('high'),
        critical: count('critical'),
        total: Object.keys(vulnerabilities).length,
      },
      dependencies: { prod: 120, dev: 0, optional: 0, peer: 0, peerOptional: 0, total: 120 },
    },
  });
}

describe('the production audit (security)', () => {
  let tool: AuditTool;
  let fakeBin: string;

  beforeAll(async () => {
    // Imported by a computed name, so the compiler looks for no declarations the JavaScript tool lacks.
    tool = (await import(TOOL_URL.href)) as AuditTool;
    fakeBin = mkdtempSync(join(tmpdir(), 'benchtide-fake-npm-'));
  });

  afterAll(() => rmSync(fakeBin, { recursive: true, force: true }));

  /** Runs the tool as `npm run audit:production` would, with an npm that prints `printed` and ends with 1. */
  function runTool(printed: string) {
    const answer = join(fakeBin, 'answer.json');
    writeFileSync(answer, printed);
    const npm = join(fakeBin, 'npm');
    writeFileSync(npm, `#!/bin/sh\ncat '${answer}'\nexit 1\n`);
    chmodSync(npm, 0o755);
    const run = spawnSync(process.execPath, [fileURLToPath(TOOL_URL)], {
      encoding: 'utf8',
      env: { ...process.env, PATH: `${fakeBin}${delimiter}${process.env['PATH'] ?? ''}` },
    });
    return { code: run.status, said: run.stdout + run.stderr };
  }

  describe('when the advisory service cannot be asked', () => {
    it('should say audit was not checked and end with 2, never as if it passed', () => {
      for (const printed of [REFUSED, '', '{"error":{"code":"ENOTFOUND","summary":"request to registry failed"}}']) {
        const { code, said } = runTool(printed);

        expect(code).withContext(printed).toBe(2);
        expect(said).withContext(printed).toContain('could not be reached');
        expect(said).withContext(printed).toContain('NOT checked');
        expect(said)
          .withContext(printed)
          .not.toMatch(/No unexplained/);
      }
      expect(runTool(REFUSED).said).toContain('405 Method Not Allowed');
    });

    it("should keep the service's address out of what it says, since reports are committed", () => {
      const refused = tool.judgeAudit(REFUSED, []).message;
      expect(refused).toContain('(405 Method Not Allowed)');
      for (const said of [
        refused,
        tool.judgeAudit('{"error":{"code":"ENOTFOUND","summary":"getaddrinfo ENOTFOUND registry.npmjs.org"}}', [])
          .message,
        tool.judgeAudit('{"message":"connect ECONNREFUSED 10.0.0.7:443"}', []).message,
      ]) {
        expect(said).not.toMatch(/https?:|npmjs|registry\.|10\.0\.0\.7/);
        expect(said).toContain('could not be reached');
      }
    });

    it('should give no counts a report could mistake for none found', () => {
      const result = tool.judgeAudit(REFUSED, []);

      expect(result).toEqual(
        jasmine.objectContaining({ status: 'unavailable', high: null, critical: null, explained: null }),
      );
    });
  });

  describe('when the service answers', () => {
    it('should end with 1 on a high advisory nobody explained, naming the package and where to read about it', () => {
      const { code, said } = runTool(
        auditReport([{ name: 'left-pad-ish', severity: 'high', ghsa: 'GHSA-aaaa-bbbb-cccc' }]),
      );

      expect(code).toBe(1);
      expect(said).toContain('left-pad-ish');
      expect(said).toContain('https://github.com/advisories/GHSA-aaaa-bbbb-cccc');
    });

    it('should end with 0 on a report with nothing high or critical', () => {
      const { code } = runTool(
        auditReport([{ name: 'slow-regex', severity: 'moderate', ghsa: 'GHSA-dddd-eeee-ffff' }]),
      );

      expect(code).toBe(0);
    });

    it('should count each advisory once, by severity, however many packages carry it', () => {
      const result = tool.judgeAudit(
        auditReport([
          { name: 'tar-ish', severity: 'critical', ghsa: 'GHSA-1111-2222-3333', through: ['packer', 'bundler'] },
          { name: 'yaml-ish', severity: 'high', ghsa: 'GHSA-4444-5555-6666' },
          { name: 'ms-ish', severity: 'low', ghsa: 'GHSA-7777-8888-9999' },
        ]),
        [],
      );

      expect([result.status, result.critical, result.high, result.explained]).toEqual(['advisories', 1, 1, 0]);
    });

    it('should pass an advisory explained for its package, carry the reason, and say which explanations are stale', () => {
      const report = auditReport([{ name: 'tar-ish', severity: 'critical', ghsa: 'GHSA-1111-2222-3333' }]);
      const reason = 'Only reads archives the server writes itself.';

      const explained = tool.judgeAudit(report, [
        { advisory: 'GHSA-1111-2222-3333', package: 'tar-ish', reason },
        { advisory: 'GHSA-0000-0000-0000', package: 'gone-ish', reason: 'Removed since.' },
      ]);
      const otherPackage = tool.judgeAudit(report, [{ advisory: 'GHSA-1111-2222-3333', package: 'zip-ish', reason }]);

      expect([explained.status, explained.critical, explained.explained]).toEqual(['clean', 0, 1]);
      expect(explained.advisories.map((advisory) => advisory.reason)).toEqual([reason]);
      expect(explained.message).toContain('GHSA-0000-0000-0000');
      expect([otherPackage.status, otherPackage.critical]).toEqual(['advisories', 1]);
    });
  });

  describe('the list of explanations', () => {
    it('should be a valid list as shipped', () => {
      expect(Array.isArray(tool.readExplanations())).toBeTrue();
    });

    it('should refuse an explanation without a one-line reason', () => {
      const file = join(fakeBin, 'explained.json');
      for (const reason of ['', 'First line.\nSecond line.']) {
        writeFileSync(file, JSON.stringify([{ advisory: 'GHSA-1111-2222-3333', package: 'tar-ish', reason }]));
        expect(() => tool.readExplanations(file))
          .withContext(JSON.stringify(reason))
          .toThrowError(/one-line "reason"/);
      }
    });
  });
});
