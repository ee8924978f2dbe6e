// `npm run bench -- idle`: the CPU an idle API instance uses (scheduler on, no requests) over 60 s,
// as % of one core, read from /proc/<pid>/stat (every thread of the process, workers included).
// The server runs as `npm start` runs it, on a database of its own on the bench MariaDB with the
// demo data. Target: under 1 %. Writes var/bench/idle.json.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { loadConfig } from '../../apps/api/src/config';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { ensureDatabase, startMariaDb } from './mariadb';
import { waitForHttp } from './net';
import { ok, step } from './output';
import { benchDatabase, dbEnv, root, varDir } from './project';

const MEASURE_S = Number(process.env.BENCH_IDLE_SECONDS ?? 60);
/** Start-up work (place and search index, the first mail and insurance runs) is over by then. */
const SETTLE_S = Number(process.env.BENCH_IDLE_SETTLE ?? 15);
const TARGET_PERCENT = 1;

/** CPU time (user + system) the process has used so far, every thread included, ms. */
function cpuMsOf(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  // utime and stime, in clock ticks of 10 ms on Linux
  return (Number(fields[11]) + Number(fields[12])) * 10;
}

export async function benchIdle(): Promise<void> {
  const settings = { ...benchDatabase(), name: 'emberline_bench_idle' };
  step(`Bench MariaDB on 127.0.0.1:${settings.port} (data in ${path.relative(root, settings.dir)}/), database ${settings.name}, recreated with the demo data`);
  const db = await startMariaDb(settings.dir, settings.port);
  let server: ChildProcess | undefined;
  try {
    ensureDatabase(db, { ...settings, recreate: true });
    const port = Number(process.env.BENCH_IDLE_PORT ?? 4012);
    const env = { ...process.env, ...dbEnv(settings), NODE_ENV: 'development', LOG_LEVEL: 'warn', PORT: String(port), SERVE_APPS: 'false', RUN_SCHEDULER: 'true', PUBLIC_URL: `http://127.0.0.1:${port}` };
    await migrateAndSeed({ ...loadConfig(env), DB_POOL_SIZE: 2 }, { demo: true });

    // as `npm start` runs it
    server = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'apps/api/src/server.ts')], { cwd: root, env, stdio: ['ignore', 'ignore', 'inherit'] });
    const status = await waitForHttp(`http://127.0.0.1:${port}/api/health`, 60_000);
    if (status !== 200) throw new Error(`The API did not become healthy (last status ${status})`);
    step(`Idle API with its scheduler: ${SETTLE_S} s to settle, then ${MEASURE_S} s without requests`);
    await sleep(SETTLE_S * 1000);
    if (!existsSync(`/proc/${server.pid}/stat`)) {
      ok('No /proc here: idle CPU not measured');
      return;
    }
    const before = cpuMsOf(server.pid!);
    await sleep(MEASURE_S * 1000);
    const used = cpuMsOf(server.pid!) - before;
    const cores = os.availableParallelism();
    const report = {
      seconds: MEASURE_S,
      cpuMs: used,
      percentOfOneCore: Math.round((used / (MEASURE_S * 1000)) * 1000) / 10,
      targetPercent: TARGET_PERCENT,
      cores,
      machine: `${cores} cores (${os.cpus()[0]?.model ?? 'cpu'}), Node ${process.versions.node}, ${os.loadavg()[0]!.toFixed(1)} load`,
      at: new Date().toISOString(),
    };
    console.log(`\n  idle API CPU over ${MEASURE_S} s, % of one core: ${report.percentOfOneCore} % (${used} ms CPU; target < ${TARGET_PERCENT} %) on ${report.machine}`);
    mkdirSync(path.join(varDir, 'bench'), { recursive: true });
    writeFileSync(path.join(varDir, 'bench', 'idle.json'), JSON.stringify(report, null, 2) + '\n');
    if (report.percentOfOneCore >= TARGET_PERCENT) process.exitCode = 1;
  } finally {
    if (server && server.exitCode === null) {
      server.kill('SIGTERM');
      await new Promise((resolve) => server!.once('exit', resolve));
    }
    if (db.startedHere) await db.stop();
  }
}
