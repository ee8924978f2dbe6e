// The npm audit check's reading of npm's JSON: which findings fail `npm test`, and when the registry only earns a warning.
import { describe, expect, it } from 'vitest';
import { judge, readAllowList, readAudit } from '../../../scripts/lib/audit';

const advisory = (id: string, name: string, severity: string) => ({
  source: 1_100_000 + id.length,
  name,
  dependency: name,
  title: `A flaw in ${name}`,
  url: `https://github.com/advisories/${id}`,
  severity,
  cwe: ['CWE-400'],
  cvss: { score: 7.5, vectorString: null },
  range: '<2.0.3',
});

/** npm audit --json (report version 2): a direct package with its own advisories, and one affected only through it. */
const report = JSON.stringify({
  auditReportVersion: 2,
  vulnerabilities: {
    'mail-thing': {
      name: 'mail-thing',
      severity: 'critical',
      isDirect: false,
      via: [advisory('GHSA-aaaa-bbbb-cccc', 'mail-thing', 'critical'), advisory('GHSA-dddd-eeee-ffff', 'mail-thing', 'moderate')],
      effects: ['parser-kit'],
      range: '<2.0.3',
      nodes: ['node_modules/mail-thing'],
      fixAvailable: true,
    },
    'parser-kit': { name: 'parser-kit', severity: 'critical', isDirect: true, via: ['mail-thing'], effects: [], range: '1.0.0 - 1.4.0', nodes: ['node_modules/parser-kit'], fixAvailable: true },
    'upload-kit': {
      name: 'upload-kit',
      severity: 'high',
      isDirect: true,
      via: [advisory('GHSA-gggg-hhhh-jjjj', 'upload-kit', 'high')],
      effects: [],
      range: '<5.1.0',
      nodes: ['node_modules/upload-kit'],
      fixAvailable: false,
    },
  },
  metadata: { vulnerabilities: { info: 0, low: 0, moderate: 1, high: 1, critical: 2, total: 4 }, dependencies: { prod: 300, dev: 0, optional: 0, peer: 0, peerOptional: 0, total: 300 } },
});

const EXPLAINED = { id: 'GHSA-gggg-hhhh-jjjj', package: 'upload-kit', reason: 'Only reachable through an option Emberline never turns on.' };

describe('the npm audit check', () => {
  it('fails on each high or critical advisory once, moderate ones and packages affected only through another aside', () => {
    const outcome = readAudit(report);
    expect(outcome.kind).toBe('report');
    if (outcome.kind !== 'report') return;
    expect(outcome.findings.map((f) => [f.id, f.package, f.severity])).toEqual([
      ['GHSA-aaaa-bbbb-cccc', 'mail-thing', 'critical'],
      ['GHSA-gggg-hhhh-jjjj', 'upload-kit', 'high'],
    ]);
    const verdict = judge(outcome.findings, [EXPLAINED]);
    expect(verdict.unexplained.map((f) => f.id)).toEqual(['GHSA-aaaa-bbbb-cccc']);
    expect(verdict.explained.map((f) => f.id)).toEqual(['GHSA-gggg-hhhh-jjjj']);
    expect(verdict.stale).toEqual([]);
  });

  it('passes a clean report and names allow-list entries nothing needs any more', () => {
    const outcome = readAudit(JSON.stringify({ auditReportVersion: 2, vulnerabilities: {}, metadata: {} }));
    expect(outcome).toEqual({ kind: 'report', findings: [] });
    expect(judge([], [EXPLAINED])).toEqual({ unexplained: [], explained: [], stale: [EXPLAINED] });
  });

  it('only warns when the registry or its audit service cannot be reached', () => {
    const refused = { message: 'request to http://127.0.0.1:9/-/npm/v1/security/advisories/bulk failed, reason: connect ECONNREFUSED 127.0.0.1:9', error: { summary: '', detail: '' } };
    const notAllowed = { message: '405 Method Not Allowed - POST https://registry.npmjs.org/-/npm/v1/security/advisories/bulk', statusCode: 405, error: { summary: '', detail: '' } };
    const offline = { error: { code: 'ENOTFOUND', summary: 'request to https://registry.npmjs.org failed, reason: getaddrinfo ENOTFOUND registry.npmjs.org', detail: '' } };
    for (const answer of [refused, notAllowed, offline]) expect(readAudit(JSON.stringify(answer)).kind).toBe('unavailable');
  });

  it('fails when npm itself fails for another reason', () => {
    expect(() => readAudit(JSON.stringify({ error: { code: 'ENOLOCK', summary: 'This command requires an existing lockfile.', detail: '' } }))).toThrow(/ENOLOCK/);
    expect(() => readAudit('npm ERR! something else')).toThrow(/did not answer JSON/);
  });

  it('wants a reason for every allow-list entry', () => {
    expect(readAllowList(JSON.stringify({ advisories: [EXPLAINED] }))).toEqual([EXPLAINED]);
    expect(() => readAllowList(JSON.stringify({ advisories: [{ id: 'GHSA-gggg-hhhh-jjjj', package: 'upload-kit', reason: '' }] }))).toThrow(/reason/);
    expect(() => readAllowList('{}')).toThrow(/advisories/);
  });
});
