// Reads `npm audit --json` output: the high and critical advisories, and which of them the allow-list explains.

/** One advisory as npm audit reports it inside a vulnerable package's `via`. */
interface Advisory {
  source: number | string;
  name: string;
  title: string;
  url: string;
  severity: string;
  range: string;
}

interface AuditReport {
  auditReportVersion: number;
  vulnerabilities: Record<string, { name: string; via: (string | Advisory)[] }>;
}

export interface Finding {
  /** The GitHub advisory id (GHSA-…), or npm's number when the advisory has none. */
  id: string;
  package: string;
  severity: 'high' | 'critical';
  title: string;
  url: string;
  range: string;
}

export interface AllowEntry {
  id: string;
  package: string;
  /** Why it does not affect Emberline, or what stands in for the fix; repeated in the README. */
  reason: string;
}

export type AuditOutcome =
  | { kind: 'report'; findings: Finding[] }
  /** npm produced no report: the registry or its audit service could not be reached. */
  | { kind: 'unavailable'; why: string };

const BLOCKING = new Set(['high', 'critical']);
/** Errors of the network or of the audit service, not of the project. */
const UNREACHABLE = /E(NOTFOUND|AI_AGAIN|CONNREFUSED|CONNRESET|TIMEDOUT|NETUNREACH|HOSTUNREACH)|ETIMEDOUT|socket hang up|network|fetch failed|audit endpoint|\b(405|408|429|5\d\d)\b/i;

/** Interprets npm audit's JSON output; throws when it is neither a report nor an unreachable registry. */
export function readAudit(stdout: string): AuditOutcome {
  let parsed: unknown;
  try {
    parsed = JSON.parse(stdout);
  } catch {
    throw new Error(`npm audit did not answer JSON: ${stdout.slice(0, 300) || '(nothing)'}`);
  }
  const report = parsed as Partial<AuditReport> & { message?: string; statusCode?: number; error?: { code?: string; summary?: string; detail?: string } };
  if (report.auditReportVersion === 2 && report.vulnerabilities) return { kind: 'report', findings: findings(report as AuditReport) };
  const why = [report.error?.code, report.statusCode, report.message, report.error?.summary, report.error?.detail].filter(Boolean).join(': ') || JSON.stringify(parsed).slice(0, 300);
  if (UNREACHABLE.test(why)) return { kind: 'unavailable', why };
  throw new Error(`npm audit failed: ${why}`);
}

/** Every high or critical advisory once, whichever packages pull it in. */
export function findings(report: AuditReport): Finding[] {
  const byId = new Map<string, Finding>();
  for (const v of Object.values(report.vulnerabilities)) {
    for (const via of v.via) {
      if (typeof via === 'string' || !BLOCKING.has(via.severity)) continue;
      const id = /GHSA(-[0-9a-z]{4}){3}/i.exec(via.url)?.[0] ?? String(via.source);
      byId.set(id, { id, package: via.name, severity: via.severity as Finding['severity'], title: via.title, url: via.url, range: via.range });
    }
  }
  return [...byId.values()].sort((x, y) => x.id.localeCompare(y.id));
}

/** Checks the allow-list's shape: each entry names an advisory and a package and says why. */
export function readAllowList(json: string): AllowEntry[] {
  const list = (JSON.parse(json) as { advisories?: unknown }).advisories;
  if (!Array.isArray(list)) throw new Error('The audit allow-list needs an "advisories" array.');
  return list.map((e: Partial<AllowEntry>, i) => {
    if (typeof e.id !== 'string' || typeof e.package !== 'string' || typeof e.reason !== 'string' || e.reason.trim().length < 20) {
      throw new Error(`Audit allow-list entry ${i + 1} needs "id", "package" and a "reason" of a sentence or more.`);
    }
    return { id: e.id, package: e.package, reason: e.reason.trim() };
  });
}

/** The findings nobody explained (these fail the check), the explained ones, and entries no finding needs any more. */
export function judge(found: Finding[], allow: AllowEntry[]) {
  const allowed = new Set(allow.map((e) => e.id.toLowerCase()));
  const present = new Set(found.map((f) => f.id.toLowerCase()));
  return {
    unexplained: found.filter((f) => !allowed.has(f.id.toLowerCase())),
    explained: found.filter((f) => allowed.has(f.id.toLowerCase())),
    stale: allow.filter((e) => !present.has(e.id.toLowerCase())),
  };
}
