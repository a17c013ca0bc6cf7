// `npm run audit:production`: asks npm's advisory service about the packages a production install
// holds, and fails on any high or critical advisory that tools/audit-explained.json does not explain.
// An explanation there reads { "advisory": "GHSA-…", "package": "name", "reason": "one line on why it cannot reach us" }.
// Exit codes: 0 clean, 1 advisories to deal with, 2 not checked (the service could not be asked).
// Only Node built-ins here, so it runs wherever npm does.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const EXPLAINED_FILE = join(root, 'tools', 'audit-explained.json');
const FAILING = ['high', 'critical'];
export const EXIT_CODES = { clean: 0, advisories: 1, unavailable: 2 };

/**
 * @typedef {{ advisory: string, package: string, reason: string }} Explanation
 * @typedef {{ advisory: string, package: string, severity: string, title: string, url: string, reason: string | null }} Advisory
 * @typedef {{
 *   status: 'clean' | 'advisories' | 'unavailable',
 *   high: number | null,
 *   critical: number | null,
 *   explained: number | null,
 *   advisories: Advisory[],
 *   message: string,
 * }} AuditResult
 * `high` and `critical` count the advisories nobody explained; all three counts are null when nothing was checked.
 */

/** Runs `npm audit` on the production packages and judges what it says. */
export async function auditProduction({ cwd = root, explainedFile = EXPLAINED_FILE } = {}) {
  const explanations = readExplanations(explainedFile);
  const { output, failure } = await npmAuditJson(cwd);
  if (failure) return unavailable(failure);
  return judgeAudit(output, explanations);
}

/**
 * @param {string} output what `npm audit --json` printed
 * @param {Explanation[]} explanations
 * @returns {AuditResult}
 */
export function judgeAudit(output, explanations) {
  let report;
  try {
    report = JSON.parse(output);
  } catch {
    return unavailable('npm audit printed no JSON');
  }
  // npm prints its own failures as JSON too (the request it made, the status it got): never a report.
  if (!isReport(report)) return unavailable(failureOf(report));

  const advisories = [...advisoriesIn(report).values()]
    .filter((advisory) => FAILING.includes(advisory.severity))
    .map((advisory) => ({ ...advisory, reason: explanationFor(advisory, explanations)?.reason ?? null }));
  const open = advisories.filter((advisory) => advisory.reason === null);
  const high = open.filter((advisory) => advisory.severity === 'high').length;
  const critical = open.filter((advisory) => advisory.severity === 'critical').length;
  const explained = advisories.length - open.length;
  const unused = explanations.filter((explanation) => !advisories.some((a) => matches(a, explanation)));

  const lines = [];
  if (open.length === 0) {
    lines.push(`No unexplained high or critical advisory in the production packages (${explained} explained).`);
  } else {
    lines.push(`${critical} critical and ${high} high advisories in the production packages, unexplained:`);
    for (const advisory of open) {
      lines.push(`  ${advisory.severity} ${advisory.package}: ${advisory.title} (${advisory.url})`);
    }
    lines.push(`Update the package, or explain the advisory in one line in ${EXPLAINED_FILE}.`);
  }
  for (const explanation of unused) {
    lines.push(`No longer needed in the explanations: ${explanation.advisory} (${explanation.package}).`);
  }
  return {
    status: open.length === 0 ? 'clean' : 'advisories',
    high,
    critical,
    explained,
    advisories,
    message: lines.join('\n'),
  };
}

/** @returns {Explanation[]} */
export function readExplanations(file = EXPLAINED_FILE) {
  const list = JSON.parse(readFileSync(file, 'utf8'));
  if (!Array.isArray(list)) throw new Error(`${file} must hold a list`);
  for (const entry of list) {
    const { advisory, package: name, reason } = entry ?? {};
    const oneLine = typeof reason === 'string' && reason.trim() !== '' && !/[\r\n]/.test(reason);
    if (typeof advisory !== 'string' || typeof name !== 'string' || !oneLine) {
      throw new Error(
        `${file}: each entry needs "advisory" (its GHSA id), "package" and a one-line "reason", not ${JSON.stringify(entry)}`,
      );
    }
  }
  return list;
}

/** @returns {Promise<{ output: string, failure?: string }>} */
function npmAuditJson(cwd) {
  return new Promise((done) => {
    let output = '';
    const npm = spawn('npm', ['audit', '--omit=dev', '--json'], { cwd, stdio: ['ignore', 'pipe', 'ignore'] });
    npm.stdout.setEncoding('utf8').on('data', (chunk) => (output += chunk));
    npm.on('error', (error) => done({ output: '', failure: `npm could not be run (${error.message})` }));
    // npm audit ends with 1 whenever it finds anything, so only what it printed tells.
    npm.on('close', () => done({ output }));
  });
}

function isReport(report) {
  return (
    typeof report?.vulnerabilities === 'object' &&
    report.vulnerabilities !== null &&
    typeof report.metadata?.vulnerabilities === 'object'
  );
}

function failureOf(printed) {
  const said = printed?.message ?? printed?.error?.summary ?? printed?.error?.code;
  return typeof said === 'string' && said.trim() !== '' ? said.trim() : 'npm audit printed no report';
}

/**
 * What npm said, without the addresses it named: reports are committed, and a service's address in
 * them says nothing a reader can act on. "405 Method Not Allowed - POST https://…" is "405 Method Not Allowed".
 */
export function withoutAddresses(said) {
  return said
    .replace(/\s*-?\s*\b(?:GET|POST|PUT|HEAD)\s+[a-z][a-z0-9+.-]*:\/\/\S+/gi, '')
    .replace(/\b[a-z][a-z0-9+.-]*:\/\/\S+/gi, 'the service')
    .replace(/\b(?:[a-z0-9-]+\.)+(?:org|com|net|io|dev|app)\b/gi, 'the service')
    .replace(/\b\d{1,3}(?:\.\d{1,3}){3}(?::\d+)?\b/g, 'the service')
    .trim();
}

/** @returns {AuditResult} */
function unavailable(said) {
  const why = withoutAddresses(said) || 'no answer';
  return {
    status: 'unavailable',
    high: null,
    critical: null,
    explained: null,
    advisories: [],
    message: `The advisory service could not be reached (${why}): the production packages were NOT checked for advisories.`,
  };
}

/** Each advisory once, however many packages it reaches through. */
function advisoriesIn(report) {
  const found = new Map();
  for (const vulnerability of Object.values(report.vulnerabilities)) {
    // A string names another package the advisory comes through; that package lists it itself.
    for (const via of vulnerability.via ?? []) {
      if (typeof via !== 'object' || via === null) continue;
      const url = String(via.url ?? '');
      const advisory = /(GHSA(?:-[0-9a-z]{4}){3})/i.exec(url)?.[1] ?? String(via.source);
      const name = String(via.name ?? vulnerability.name);
      found.set(`${advisory} ${name}`, {
        advisory,
        package: name,
        severity: String(via.severity ?? vulnerability.severity),
        title: String(via.title ?? ''),
        url,
      });
    }
  }
  return found;
}

function matches(advisory, explanation) {
  return (
    advisory.advisory.toLowerCase() === explanation.advisory.toLowerCase() && advisory.package === explanation.package
  );
}

function explanationFor(advisory, explanations) {
  return explanations.find((explanation) => matches(advisory, explanation));
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  try {
    const result = await auditProduction();
    console.log(`[audit] ${result.message.replaceAll('\n', '\n[audit] ')}`);
    process.exitCode = EXIT_CODES[result.status];
  } catch (error) {
    console.error(`[audit] ${error.message}`);
    process.exitCode = 1;
  }
}
