// Part of `npm test`: fails on high or critical `npm audit --omit=dev` findings that scripts/audit-allowlist.json does not explain; warns when the registry cannot be reached.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { judge, readAllowList, readAudit } from './lib/audit';
import { ok, warn } from './lib/output';
import { root } from './lib/project';

const ALLOW_LIST = path.join(root, 'scripts', 'audit-allowlist.json');

try {
  const allow = readAllowList(readFileSync(ALLOW_LIST, 'utf8'));
  // bounded, so an unreachable registry costs a minute at most rather than npm's long retries
  const r = spawnSync('npm', ['audit', '--omit=dev', '--json', '--fetch-retries=1', '--fetch-timeout=30000'], { cwd: root, encoding: 'utf8', timeout: 150_000, maxBuffer: 64 * 1024 * 1024 });
  const outcome = r.error ? { kind: 'unavailable' as const, why: r.error.message } : readAudit(r.stdout);
  if (outcome.kind === 'unavailable') {
    warn(`npm audit could not be run (${outcome.why}); the check is skipped here. CI runs it with the registry reachable.`);
    process.exit(0);
  }
  const { unexplained, explained, stale } = judge(outcome.findings, allow);
  for (const f of explained) ok(`${f.severity} ${f.id} in ${f.package} (${f.title}): explained in ${path.relative(root, ALLOW_LIST)}`);
  for (const e of stale) warn(`${e.id} (${e.package}) is in ${path.relative(root, ALLOW_LIST)} but npm audit no longer reports it: remove the entry and its README line.`);
  if (unexplained.length) {
    console.error(`✖ npm audit --omit=dev: ${unexplained.length} high or critical finding(s) nobody explained:`);
    for (const f of unexplained) console.error(`  ${f.severity} ${f.id} in ${f.package} ${f.range}: ${f.title} (${f.url})`);
    console.error(`Pin a patched version (exact, Node 20), or explain it in ${path.relative(root, ALLOW_LIST)} and the README's "Dependency audit".`);
    process.exit(1);
  }
  ok(`npm audit --omit=dev: no unexplained high or critical findings (${outcome.findings.length} high/critical in all, ${explained.length} explained)`);
} catch (err) {
  console.error(`✖ ${(err as Error).message}`);
  process.exit(1);
}
