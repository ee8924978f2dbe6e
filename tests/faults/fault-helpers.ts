// Shared pieces of the fault tests: the test MariaDB killed and started again by its pid, waiting
// for a condition, and the figures each fault test prints.
import { existsSync, readFileSync } from 'node:fs';
import { inject } from 'vitest';
import { alive, paths, startMariaDb } from '../../scripts/lib/mariadb';

type TestDb = ReturnType<typeof inject<'db'>>;

/**
 * The pid of the test MariaDB now: an earlier fault test may have restarted it, so the pid the
 * global setup handed over can be stale; the data directory's pid file names the live one.
 */
export function currentDbPid(db: TestDb = inject('db')): number {
  const file = paths(db.dir).pidFile;
  const pid = existsSync(file) ? Number(readFileSync(file, 'utf8').trim()) : NaN;
  return Number.isInteger(pid) && pid > 0 ? pid : db.pid;
}

/** Kills the test MariaDB by its pid and waits until the process is gone. */
export async function killDb(signal: NodeJS.Signals, db: TestDb = inject('db')): Promise<number> {
  const pid = currentDbPid(db);
  process.kill(pid, signal);
  if (!(await eventually(async () => !alive(pid), 30_000, 50))) throw new Error(`MariaDB (pid ${pid}) did not stop after ${signal}`);
  return pid;
}

/** Starts the test MariaDB again the way the global setup does (same data directory and port). */
export async function restartDb(db: TestDb = inject('db')) {
  return startMariaDb(db.dir, db.port);
}

export async function eventually(check: () => Promise<boolean>, ms: number, interval = 250): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, interval));
  }
  return check();
}

/** Prints a fault test's figures in the test output, one line each, so a run records them. */
export function printFigures(title: string, figures: Record<string, string | number>): void {
  const width = Math.max(...Object.keys(figures).map((k) => k.length));
  const lines = Object.entries(figures).map(([k, v]) => `  ${k.padEnd(width)}  ${v}`);
  console.log(`\n[fault figures] ${title}\n${lines.join('\n')}\n`);
}
