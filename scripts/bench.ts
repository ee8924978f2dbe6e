// `npm run bench`: the benchmarks the issues name: the slot engine, the Directory search against a
// generated network of 10,000 partners (scripts/lib/bench-search.ts), 50 owners racing for 10
// booking starts (scripts/lib/bench-booking.ts), 20 concurrent sign-ins while searches run
// (scripts/lib/bench-sign-in.ts), the idle API's CPU over 60 s (scripts/lib/bench-idle.ts), and a warm `npm start`
// (packages and MariaDB installed, apps built) until /api/health answers 200, median of 5 runs.
import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { benchBooking } from './lib/bench-booking';
import { benchIdle } from './lib/bench-idle';
import { benchSearch } from './lib/bench-search';
import { benchSignIn } from './lib/bench-sign-in';
import { waitForHttp } from './lib/net';
import { step } from './lib/output';
import { root, varDir } from './lib/project';

const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const only = process.argv.slice(3);
const wants = (name: string) => only.length === 0 || only.includes(name);
const port = process.env.PORT ?? '4000';

async function warmStart(): Promise<number> {
  const t0 = performance.now();
  const child = spawn(process.execPath, [path.join(root, 'scripts/launch.mjs'), 'start'], { cwd: root, env: { ...process.env, PORT: port, LOG_LEVEL: 'warn' }, stdio: 'ignore' });
  const status = await waitForHttp(`http://127.0.0.1:${port}/api/health`, 120_000);
  const ms = performance.now() - t0;
  child.kill('SIGTERM');
  await new Promise((resolve) => child.once('exit', resolve));
  if (status !== 200) throw new Error(`npm start did not become healthy (last status ${status})`);
  return ms;
}

if (wants('slots')) {
  step('Slot engine: 20 technicians × 28 days × 1,000 bookings (vitest bench)');
  const r = spawnSync(path.join(root, 'node_modules/.bin/vitest'), ['bench', '--run', 'tests/bench/slots.bench.ts', '--project', 'unit'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exitCode = 1;
}

if (wants('search')) {
  step('Directory search: 10,000 partners, 50,000 offers, 500 searches and 10 s of load');
  await benchSearch();
}

if (wants('sign-in')) {
  step('Sign-in under load: 20 owners at the same moment while searches run');
  await benchSignIn();
}

if (wants('idle')) {
  step('Idle API: CPU of an instance with its scheduler and no requests, 60 s');
  await benchIdle();
}

if (wants('booking')) {
  step('Booking under contention: 50 owners, 10 starts of one technician, at the same moment');
  await benchBooking();
}

if (!wants('start')) process.exit(process.exitCode ?? 0);
step(`Warm start to healthy /api/health, ${RUNS} runs (the first run also builds the apps if they are stale, so it is not counted)`);
await warmStart();
const times: number[] = [];
for (let i = 0; i < RUNS; i++) {
  const ms = await warmStart();
  times.push(ms);
  console.log(`  run ${i + 1}: ${(ms / 1000).toFixed(2)} s`);
}
const sorted = [...times].sort((a, b) => a - b);
const median = sorted[Math.floor(sorted.length / 2)]!;
const machine = `${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.versions.node}`;
console.log(`\nwarm npm start → healthy: median ${(median / 1000).toFixed(2)} s (min ${(sorted[0]! / 1000).toFixed(2)} s, max ${(sorted.at(-1)! / 1000).toFixed(2)} s) on ${machine}`);
mkdirSync(path.join(varDir, 'bench'), { recursive: true });
writeFileSync(path.join(varDir, 'bench', 'warm-start.json'), JSON.stringify({ runs: times, median, machine, at: new Date().toISOString() }, null, 2));
