// `npm run bench -- search`: the Directory search against 10,000 partners and 50,000 offers in
// a bench database of its own (its own MariaDB port and data directory). Measures the handler
// time of 500 searches at random European places (Server-Timing, p50/p95; target p95 < 50 ms),
// then 10 s of autocannon on the search and 10 s on /api/health, taken in turns (target: search at
// least 40 % of the health check's requests per second). Writes var/bench/search.json.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon, { type Result } from 'autocannon';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { EUROPE, generateNetwork, random, randomPlace, type BenchNetwork } from '../../tests/bench/search-data';
import { ensureDatabase, startMariaDb } from './mariadb';
import { waitForHttp } from './net';
import { ok, step } from './output';
import { benchDatabase, dbEnv, root, varDir } from './project';

const PARTNERS = 10_000;
const OFFERS_PER_PARTNER = 5;
const SEARCHES = Number(process.env.BENCH_SEARCHES ?? 500);
const DURATION_S = Number(process.env.BENCH_DURATION ?? 10);
const CONNECTIONS = 10;

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
const round = (v: number, digits = 1) => Math.round(v * 10 ** digits) / 10 ** digits;

/** Random searches: any service type at a random place, some with vehicle details, most sorted by best match. */
export function searchPaths(count: number, serviceTypes: string[], seed: number): string[] {
  const rnd = random(seed);
  const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)]!;
  return Array.from({ length: count }, () => {
    const place = randomPlace(rnd);
    const q: Record<string, string> = { serviceType: pick(serviceTypes), lat: place.lat.toFixed(4), lng: place.lng.toFixed(4) };
    if (rnd() < 0.3) Object.assign(q, { factoryHeater: pick(['coolant_auxiliary', 'coolant_parking', 'none']), electricalSystemV: pick(['12', '24']), climateControl: pick(['automatic', 'manual']) });
    const sort = rnd();
    if (sort > 0.7) q.sort = sort > 0.9 ? 'soonest' : sort > 0.8 ? 'price' : 'distance';
    return `/api/search?${new URLSearchParams(q).toString()}`;
  });
}

export async function startServer(env: NodeJS.ProcessEnv, port: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, [...(process.env.BENCH_CPU_PROF ? ['--cpu-prof', '--cpu-prof-dir', path.join(root, 'var/bench/prof')] : []), '--import', 'tsx', path.join(root, 'tests/bench/search-server.ts')], { cwd: root, env: { ...env, PORT: String(port) }, stdio: ['ignore', 'ignore', 'inherit'] });
  const status = await waitForHttp(`http://127.0.0.1:${port}/api/health`, 60_000);
  if (status !== 200) {
    child.kill('SIGTERM');
    throw new Error(`The bench server did not become healthy (last status ${status})`);
  }
  return child;
}

async function cannon(url: string, paths: string[], durationS: number): Promise<Result> {
  let i = 0;
  return autocannon({
    url,
    connections: CONNECTIONS,
    duration: durationS,
    requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: paths[i++ % paths.length] }) }],
  });
}

/** Slices each load run is cut into, taken in turns (search, health, search, …), so a change in the machine's other load falls on both alike. */
const SLICES = 4;

interface LoadTotals {
  requests: number;
  seconds: number;
  non2xx: number;
  errors: number;
  latencyP50: number[];
  latencyP99: number[];
  /** CPU time of the API process and of MariaDB while the requests ran, ms (Linux only, else 0). */
  cpuMs: number;
  /** The API process's part of cpuMs. */
  apiCpuMs: number;
}

/** CPU time (user + system) a process has used so far, ms; 0 where /proc is not there. */
export function cpuMsOf(pid: number | undefined): number {
  if (!pid || !existsSync(`/proc/${pid}/stat`)) return 0;
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  // utime and stime, in clock ticks of 10 ms on Linux
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

async function loadInTurns(url: string, runs: Record<'search' | 'health', string[]>, pids: (number | undefined)[]): Promise<Record<'search' | 'health', LoadTotals>> {
  const empty = (): LoadTotals => ({ requests: 0, seconds: 0, non2xx: 0, errors: 0, latencyP50: [], latencyP99: [], cpuMs: 0, apiCpuMs: 0 });
  const totals = { search: empty(), health: empty() };
  const cpu = (): number => pids.reduce<number>((sum, pid) => sum + cpuMsOf(pid), 0);
  for (let slice = 0; slice < SLICES; slice++) {
    // BENCH_ONLY=search (or health) loads one of the two, for a CPU profile of it alone
    for (const name of (['search', 'health'] as const).filter((n) => !process.env.BENCH_ONLY || n === process.env.BENCH_ONLY)) {
      const cpu0 = cpu();
      const api0 = cpuMsOf(pids[0]);
      const r = await cannon(url, runs[name], DURATION_S / SLICES);
      const t = totals[name];
      t.cpuMs += cpu() - cpu0;
      t.apiCpuMs += cpuMsOf(pids[0]) - api0;
      t.requests += r.requests.total;
      t.seconds += r.duration;
      t.non2xx += r.non2xx;
      t.errors += r.errors;
      t.latencyP50.push(r.latency.p50);
      t.latencyP99.push(r.latency.p99);
    }
  }
  return totals;
}

export interface BenchNetworkDb {
  db: Awaited<ReturnType<typeof startMariaDb>>;
  /** The bench database's connection settings, for createDataSource and migrateAndSeed. */
  config: { DB_HOST: string; DB_PORT: number; DB_NAME: string; DB_USER: string; DB_PASSWORD: string; DB_POOL_SIZE: number };
  /** What the bench server process gets. */
  env: NodeJS.ProcessEnv;
  generated: BenchNetwork | null;
  serviceTypes: string[];
}

/** Starts the bench MariaDB and makes sure it holds the complete generated network (stop `db` when done). */
export async function openBenchNetwork(): Promise<BenchNetworkDb> {
  const settings = benchDatabase();
  step(`Bench MariaDB on 127.0.0.1:${settings.port} (data in ${path.relative(root, settings.dir)}/), database ${settings.name}`);
  const db = await startMariaDb(settings.dir, settings.port);
  const env = { ...process.env, ...dbEnv(settings), DB_POOL_SIZE: '10', LOG_LEVEL: 'warn', RUN_SCHEDULER: 'false', SERVE_APPS: 'false', NODE_ENV: 'development', PUBLIC_URL: 'http://127.0.0.1' };
  try {
    // reuse the generated network when it is complete; otherwise start from an empty database
    const config = { DB_HOST: '127.0.0.1', DB_PORT: settings.port, DB_NAME: settings.name, DB_USER: settings.user, DB_PASSWORD: settings.password, DB_POOL_SIZE: 4 };
    ensureDatabase(db, settings);
    let ds = await createDataSource(config).initialize();
    const existing = await ds
      .query("SELECT (SELECT COUNT(*) FROM organisation WHERE name LIKE 'Bench partner %') AS partners, (SELECT COUNT(*) FROM offer) AS offers")
      .catch(() => [{ partners: 0, offers: 0 }]);
    await ds.destroy();
    let generated: { partners: number; offers: number; ms: number } | null = null;
    if (Number(existing[0].partners) !== PARTNERS || Number(existing[0].offers) !== PARTNERS * OFFERS_PER_PARTNER || process.env.BENCH_REGENERATE === '1') {
      step(`Generating ${PARTNERS.toLocaleString('en')} partners with ${OFFERS_PER_PARTNER} offers each…`);
      ensureDatabase(db, { ...settings, recreate: true });
      await migrateAndSeed(config, { demo: false });
      ds = await createDataSource(config).initialize();
      generated = await generateNetwork(ds, { partners: PARTNERS, offersPerPartner: OFFERS_PER_PARTNER });
      await ds.destroy();
      ok(`Generated ${generated.partners.toLocaleString('en')} partners and ${generated.offers.toLocaleString('en')} offers in ${(generated.ms / 1000).toFixed(1)} s`);
    } else {
      await migrateAndSeed(config, { demo: false });
      ok('Reusing the generated network (BENCH_REGENERATE=1 builds it again)');
    }
    ds = await createDataSource(config).initialize();
    await ds.query('DELETE FROM coverage_gap_search');
    const serviceTypes = ((await ds.query('SELECT code FROM service_type WHERE retired = 0 ORDER BY code')) as { code: string }[]).map((r) => r.code);
    await ds.destroy();
    return { db, config, env, generated, serviceTypes };
  } catch (error) {
    if (db.startedHere) await db.stop();
    throw error;
  }
}

export async function benchSearch(): Promise<void> {
  const { db, env, generated, serviceTypes } = await openBenchNetwork();
  let server: ChildProcess | undefined;
  try {
    const port = Number(process.env.BENCH_PORT ?? 4010);
    server = await startServer(env, port);
    const base = `http://127.0.0.1:${port}`;

    step(`Handler time of ${SEARCHES} searches at random places in Europe (${EUROPE.south}–${EUROPE.north}° N, ${EUROPE.west}–${EUROPE.east}° E), one at a time`);
    // the first search loads the search index (every approved partner) into the API's memory
    const warmUp = searchPaths(30, serviceTypes, 7);
    const firstAt = performance.now();
    await fetch(base + warmUp[0]).then((r) => r.arrayBuffer());
    const firstSearchMs = performance.now() - firstAt;
    for (const p of warmUp.slice(1)) await fetch(base + p).then((r) => r.arrayBuffer());
    const handler: number[] = [];
    const roundTrip: number[] = [];
    let results = 0;
    let empty = 0;
    for (const p of searchPaths(SEARCHES, serviceTypes, 20260602)) {
      const t0 = performance.now();
      const res = await fetch(base + p);
      const body = (await res.json()) as { data: unknown[]; meta: { total: number } };
      roundTrip.push(performance.now() - t0);
      if (res.status !== 200) throw new Error(`GET ${p} answered ${res.status}: ${JSON.stringify(body)}`);
      handler.push(Number(/dur=([\d.]+)/.exec(res.headers.get('server-timing') ?? '')?.[1]));
      results += body.meta.total;
      if (!body.data.length) empty++;
    }
    handler.sort((a, b) => a - b);
    roundTrip.sort((a, b) => a - b);

    step(`autocannon, ${CONNECTIONS} connections, ${DURATION_S} s each on the search (rotating over 200 searches) and on /api/health, in ${SLICES} turns`);
    const load = await loadInTurns(base, { search: searchPaths(200, serviceTypes, 99), health: ['/api/health'] }, [server.pid, db.pid]);
    const cpuPerRequest = (t: LoadTotals) => (t.requests ? t.cpuMs / t.requests : 0);
    const rps = (t: LoadTotals) => t.requests / t.seconds;
    const median = (list: number[]) => [...list].sort((a, b) => a - b)[Math.floor(list.length / 2)]!;

    const machine = `${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.versions.node}, ${os.loadavg()[0]!.toFixed(1)} load`;
    const report = {
      network: { partners: PARTNERS, offers: PARTNERS * OFFERS_PER_PARTNER, generatedMs: generated ? Math.round(generated.ms) : null },
      handler: {
        firstSearchMs: round(firstSearchMs),
        searches: SEARCHES,
        p50Ms: round(percentile(handler, 50), 2),
        p95Ms: round(percentile(handler, 95), 2),
        maxMs: round(handler.at(-1)!, 2),
        roundTripP50Ms: round(percentile(roundTrip, 50), 2),
        roundTripP95Ms: round(percentile(roundTrip, 95), 2),
        averageMatches: round(results / SEARCHES),
        emptyShare: round(empty / SEARCHES, 3),
        targetP95Ms: 50,
      },
      load: {
        connections: CONNECTIONS,
        durationS: DURATION_S,
        turns: SLICES,
        searchRps: round(rps(load.search)),
        searchLatencyP50Ms: median(load.search.latencyP50),
        searchLatencyP99Ms: median(load.search.latencyP99),
        searchNon2xx: load.search.non2xx,
        searchErrors: load.search.errors,
        healthRps: round(rps(load.health)),
        healthNon2xx: load.health.non2xx + load.health.errors,
        ratio: round(rps(load.search) / rps(load.health), 3),
        // the machine's other load moves requests per second; the CPU each request costs moves less
        searchCpuMsPerRequest: round(cpuPerRequest(load.search), 2),
        searchApiCpuMsPerRequest: round(load.search.requests ? load.search.apiCpuMs / load.search.requests : 0, 2),
        healthCpuMsPerRequest: round(cpuPerRequest(load.health), 2),
        healthApiCpuMsPerRequest: round(load.health.requests ? load.health.apiCpuMs / load.health.requests : 0, 2),
        cpuRatio: cpuPerRequest(load.search) ? round(cpuPerRequest(load.health) / cpuPerRequest(load.search), 3) : null,
        targetRatio: 0.4,
      },
      machine,
      at: new Date().toISOString(),
    };
    const h = report.handler;
    const l = report.load;
    console.log(`
  first search after start (loads the search index): ${h.firstSearchMs} ms
  search handler time over ${h.searches} searches: p50 ${h.p50Ms} ms, p95 ${h.p95Ms} ms (target < ${h.targetP95Ms} ms), max ${h.maxMs} ms; round trip p50 ${h.roundTripP50Ms} ms, p95 ${h.roundTripP95Ms} ms
  ${h.averageMatches} matching partners per search on average; ${(h.emptyShare * 100).toFixed(1)} % of searches found nobody
  autocannon ${l.durationS} s × ${l.connections} connections each, in ${l.turns} turns: search ${l.searchRps} req/s (p50 ${l.searchLatencyP50Ms} ms, p99 ${l.searchLatencyP99Ms} ms, non-2xx ${l.searchNon2xx}), health ${l.healthRps} req/s
  search ÷ health = ${(l.ratio * 100).toFixed(1)} % (target ≥ ${l.targetRatio * 100} %)
  CPU per request (API process + MariaDB): search ${l.searchCpuMsPerRequest} ms (API ${l.searchApiCpuMsPerRequest} ms), health ${l.healthCpuMsPerRequest} ms (API ${l.healthApiCpuMsPerRequest} ms)${l.cpuRatio === null ? '' : ` (health ÷ search ${(l.cpuRatio * 100).toFixed(1)} %)`}
  on ${machine}`);
    mkdirSync(path.join(varDir, 'bench'), { recursive: true });
    writeFileSync(path.join(varDir, 'bench', 'search.json'), JSON.stringify(report, null, 2) + '\n');
    if (h.p95Ms >= h.targetP95Ms || l.ratio < l.targetRatio || l.searchNon2xx || l.healthNon2xx) process.exitCode = 1;
  } finally {
    if (server && server.exitCode === null) {
      server.kill('SIGTERM');
      await new Promise((resolve) => server!.once('exit', resolve));
    }
    if (db.startedHere) await db.stop();
  }
}
