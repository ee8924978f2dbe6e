// `npm test`: installs what is missing (MariaDB, Chromium), builds the apps, then runs every
// suite — unit and reference, components, API on MariaDB, browser journeys — and the type
// checks, and ends with one summary line "N passed, N failed".
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { buildApps } from './lib/build';
import { step } from './lib/output';
import { bin, root, varDir } from './lib/project';
import { CHROMIUM, ensureSystemPackages, MARIADB } from './lib/system';

interface Outcome {
  name: string;
  passed: number;
  failed: number;
  skipped: number;
}
const outcomes: Outcome[] = [];
const reports = path.join(varDir, 'test-results');

function vitest(name: string, projects: string[], env: Record<string, string> = {}): void {
  step(`Tests: ${name}`);
  const out = path.join(reports, `${name.replace(/\W+/g, '-')}.json`);
  rmSync(out, { force: true });
  const args = ['run', ...projects.flatMap((p) => ['--project', p]), '--reporter=default', '--reporter=json', `--outputFile.json=${out}`];
  const r = spawnSync(bin('vitest'), args, { cwd: root, stdio: 'inherit', env: { ...process.env, FORCE_COLOR: process.env.CI ? '0' : '1', ...env } });
  if (!existsSync(out)) {
    outcomes.push({ name, passed: 0, failed: 1, skipped: 0 });
    console.error(`✖ ${name}: vitest exited with ${r.status} before writing results`);
    return;
  }
  const json = JSON.parse(readFileSync(out, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number; numFailedTestSuites: number };
  // a suite that fails to load counts as a failure even though none of its tests ran
  const failed = json.numFailedTests + (json.numFailedTests === 0 && r.status !== 0 ? Math.max(1, json.numFailedTestSuites) : 0);
  outcomes.push({ name, passed: json.numPassedTests, failed, skipped: json.numPendingTests + json.numTodoTests });
}

function check(name: string, command: string, args: string[]): void {
  step(`Check: ${name}`);
  const r = spawnSync(command, args, { cwd: root, stdio: 'inherit' });
  outcomes.push({ name, passed: r.status === 0 ? 1 : 0, failed: r.status === 0 ? 0 : 1, skipped: 0 });
}

mkdirSync(reports, { recursive: true });
const only = process.argv.slice(3);
const wants = (s: string) => only.length === 0 || only.includes(s);
let setupFailed = false;
try {
  ensureSystemPackages([MARIADB, ...(wants('e2e') ? [CHROMIUM] : [])]);
  if (wants('e2e')) buildApps();
} catch (err) {
  console.error(`✖ ${(err as Error).message}`);
  setupFailed = true;
}

if (!setupFailed) {
  // the pure code must not depend on the machine's time zone: run it under two very different ones
  if (wants('unit')) vitest('unit', ['unit', 'components'], { TZ: 'UTC' });
  if (wants('unit')) vitest('unit under TZ=Pacific/Auckland', ['unit'], { TZ: 'Pacific/Auckland' });
  if (wants('api')) vitest('api', ['api']);
  if (wants('e2e')) vitest('e2e', ['e2e']);
  if (wants('types')) {
    check('types: API, domain, client, scripts and tests (tsc)', bin('tsc'), ['--noEmit', '-p', 'tsconfig.json']);
    for (const p of ['apps/directory', 'apps/console', 'packages/ui']) check(`types: ${p} (vue-tsc)`, bin('vue-tsc'), ['--noEmit', '-p', `${p}/tsconfig.json`]);
  }
  if (wants('lint')) check('lint: ESLint recommended rules for TypeScript and Vue, no warnings', bin('eslint'), ['.', '--max-warnings', '0']);
  // high and critical advisories in what ships; a registry out of reach only warns
  if (wants('audit')) check('dependencies: npm audit --omit=dev, no unexplained high or critical findings', process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'audit-check.ts')]);
}

const total = outcomes.reduce((a, o) => ({ passed: a.passed + o.passed, failed: a.failed + o.failed, skipped: a.skipped + o.skipped }), { passed: 0, failed: setupFailed ? 1 : 0, skipped: 0 });
console.log('\nSummary');
for (const o of outcomes) console.log(`  ${o.failed ? '✖' : '✔'} ${o.name}: ${o.passed} passed, ${o.failed} failed${o.skipped ? `, ${o.skipped} skipped` : ''}`);
console.log(`\n${total.passed} passed, ${total.failed} failed${total.skipped ? `, ${total.skipped} skipped` : ''}`);
process.exit(total.failed || total.passed === 0 ? 1 : 0);
