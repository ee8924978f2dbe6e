// `npm run bench -- sign-in`: 20 owners signing in at the same moment while searches run, on the
// search bench's network. Measures sign-in p50/p95 and errors, and the p95 of /api/health and of
// the search idle and during the sign-ins (targets: sign-in p95 < 300 ms, no errors, the other
// routes' p95 at most 2× idle). Writes var/bench/sign-in.json.
import type { ChildProcess } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { hashPassword } from '../../apps/api/src/lib/password-hash';
import { openBenchNetwork, searchPaths, startServer } from './bench-search';
import { ok, step } from './output';
import { varDir } from './project';

const SIGN_INS = 20;
const ROUNDS = Number(process.env.BENCH_SIGN_IN_ROUNDS ?? 3);
const IDLE_S = Number(process.env.BENCH_SIGN_IN_IDLE ?? 5);
/** Clients searching back to back, and one asking /api/health every HEALTH_PAUSE_MS, idle and during the sign-ins. */
const SEARCH_CLIENTS = 2;
const HEALTH_PAUSE_MS = 20;
const PASSWORD = 'bench-owner-password';

const percentile = (values: number[], p: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]! : NaN;
};
const round = (v: number, digits = 1) => Math.round(v * 10 ** digits) / 10 ** digits;

interface Samples {
  search: number[];
  health: number[];
  errors: number;
}

/** Searches and health checks in a loop until stopped; each request's round trip is kept. */
function backgroundLoad(base: string, paths: string[]): { stop(): Promise<Samples> } {
  const samples: Samples = { search: [], health: [], errors: 0 };
  let running = true;
  let next = 0;
  const loop = async (kind: 'search' | 'health', url: () => string, pauseMs: number) => {
    while (running) {
      const t0 = performance.now();
      try {
        const res = await fetch(base + url());
        await res.arrayBuffer();
        if (!res.ok) samples.errors++;
      } catch {
        samples.errors++;
      }
      samples[kind].push(performance.now() - t0);
      if (pauseMs) await sleep(pauseMs);
    }
  };
  const loops = [
    ...Array.from({ length: SEARCH_CLIENTS }, () => loop('search', () => paths[next++ % paths.length]!, 0)),
    loop('health', () => '/api/health', HEALTH_PAUSE_MS),
  ];
  return {
    stop: async () => {
      running = false;
      await Promise.all(loops);
      return samples;
    },
  };
}

async function signIn(base: string, email: string): Promise<{ ms: number; status: number }> {
  const t0 = performance.now();
  try {
    const res = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: PASSWORD }) });
    await res.arrayBuffer();
    return { ms: performance.now() - t0, status: res.status };
  } catch {
    return { ms: performance.now() - t0, status: 0 };
  }
}

export async function benchSignIn(): Promise<void> {
  const { db, config, env, serviceTypes } = await openBenchNetwork();
  let server: ChildProcess | undefined;
  try {
    // the owners' hashes are made as the API makes them, at the cost it is configured with
    const apiConfig = loadConfig(env);
    const ds = await createDataSource(config).initialize();
    const hash = await hashPassword(PASSWORD, apiConfig.PASSWORD_HASH_COST);
    const hashKind = `${hash.split('$').slice(0, 3).join('$')}$`;
    const owners = Array.from({ length: SIGN_INS }, (_, i) => `bench-owner-${i}@bench.example`);
    for (const [i, email] of owners.entries()) {
      await ds.query(
        `INSERT INTO user_account (id, email, name, password_hash, is_owner, email_verified_at) VALUES (UUID(), ?, ?, ?, 1, NOW(3))
         ON DUPLICATE KEY UPDATE password_hash = VALUES(password_hash), locked_until = NULL`,
        [email, `Bench owner ${i}`, hash],
      );
    }
    await ds.destroy();
    ok(`${SIGN_INS} owner accounts with a password hash of the configured kind (${hashKind}…)`);

    const port = Number(process.env.BENCH_PORT ?? 4010);
    server = await startServer(env, port);
    const base = `http://127.0.0.1:${port}`;
    const paths = searchPaths(200, serviceTypes, 4242);
    // loads the search index and warms the connections
    for (const p of paths.slice(0, 20)) await fetch(base + p).then((r) => r.arrayBuffer());
    await signIn(base, owners[0]!);

    step(`Idle: ${SEARCH_CLIENTS} clients searching and one asking /api/health every ${HEALTH_PAUSE_MS} ms, ${IDLE_S} s`);
    const idleLoad = backgroundLoad(base, paths);
    await sleep(IDLE_S * 1000);
    const idle = await idleLoad.stop();

    step(`During: ${SIGN_INS} owners sign in at the same moment while the same searches and health checks run, ${ROUNDS} rounds`);
    const signIns: { ms: number; status: number }[] = [];
    const during: Samples = { search: [], health: [], errors: 0 };
    for (let r = 0; r < ROUNDS; r++) {
      const load = backgroundLoad(base, paths);
      const batch = await Promise.all(owners.map((email) => signIn(base, email)));
      const s = await load.stop();
      signIns.push(...batch);
      during.search.push(...s.search);
      during.health.push(...s.health);
      during.errors += s.errors;
      console.log(`  round ${r + 1}: slowest sign-in ${Math.round(Math.max(...batch.map((x) => x.ms)))} ms`);
      await sleep(1000);
    }

    const signInMs = signIns.map((s) => s.ms);
    const cores = os.availableParallelism();
    const report = {
      hashKind,
      signIn: {
        concurrent: SIGN_INS,
        rounds: ROUNDS,
        p50Ms: round(percentile(signInMs, 50)),
        p95Ms: round(percentile(signInMs, 95)),
        maxMs: round(Math.max(...signInMs)),
        errors: signIns.filter((s) => s.status !== 200).length,
        statuses: [...new Set(signIns.map((s) => s.status))],
        targetP95Ms: 300,
      },
      health: { idleP95Ms: round(percentile(idle.health, 95), 2), duringP95Ms: round(percentile(during.health, 95), 2), idleCount: idle.health.length, duringCount: during.health.length },
      search: { idleP95Ms: round(percentile(idle.search, 95), 2), duringP95Ms: round(percentile(during.search, 95), 2), idleCount: idle.search.length, duringCount: during.search.length },
      backgroundErrors: idle.errors + during.errors,
      targetRatio: 2,
      cores,
      machine: `${cores} cores (${os.cpus()[0]?.model ?? 'cpu'}), ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.versions.node}, libuv pool ${process.env.UV_THREADPOOL_SIZE ?? 4}, ${os.loadavg()[0]!.toFixed(1)} load`,
      at: new Date().toISOString(),
    };
    const s = report.signIn;
    const ratio = (r: { idleP95Ms: number; duringP95Ms: number }) => round(r.duringP95Ms / r.idleP95Ms, 2);
    console.log(`
  cores ${cores} | ${SIGN_INS} concurrent sign-ins × ${ROUNDS} rounds (${report.hashKind}): p50 ${s.p50Ms} ms, p95 ${s.p95Ms} ms (target < ${s.targetP95Ms} ms), max ${s.maxMs} ms, errors ${s.errors}${s.errors ? ` (statuses ${s.statuses.join(', ')})` : ''}
  p95                idle        during sign-ins   during ÷ idle (target ≤ ${report.targetRatio})
  /api/health   ${String(report.health.idleP95Ms).padStart(8)} ms   ${String(report.health.duringP95Ms).padStart(8)} ms        ${ratio(report.health)}
  search        ${String(report.search.idleP95Ms).padStart(8)} ms   ${String(report.search.duringP95Ms).padStart(8)} ms        ${ratio(report.search)}
  background errors ${report.backgroundErrors}; on ${report.machine}`);
    mkdirSync(path.join(varDir, 'bench'), { recursive: true });
    writeFileSync(path.join(varDir, 'bench', 'sign-in.json'), JSON.stringify(report, null, 2) + '\n');
    if (s.p95Ms >= s.targetP95Ms || s.errors || report.backgroundErrors || ratio(report.health) > report.targetRatio || ratio(report.search) > report.targetRatio) process.exitCode = 1;
  } finally {
    if (server && server.exitCode === null) {
      server.kill('SIGTERM');
      await new Promise((resolve) => server!.once('exit', resolve));
    }
    if (db.startedHere) await db.stop();
  }
}
