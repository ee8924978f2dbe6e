// A MariaDB server private to the project: data directory inside var/, listening on
// 127.0.0.1 only, started and stopped by PID.
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { portInUse } from './net';

export interface MariaDbInstance {
  dir: string;
  port: number;
  socket: string;
  pid: number;
  /** False when a server from an earlier run was already up and is being reused. */
  startedHere: boolean;
  stop(): Promise<void>;
}

export class MariaDbError extends Error {}

/** Whether a process with this pid still runs (signal 0 only checks). */
export const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

function tail(file: string, lines = 25): string {
  if (!existsSync(file)) return '(no error log written)';
  return readFileSync(file, 'utf8').trimEnd().split('\n').slice(-lines).join('\n');
}

function ping(socket: string): boolean {
  const r = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socket}`, '-uroot', '--connect-timeout=2', 'ping'], { stdio: 'ignore' });
  return r.status === 0;
}

export function paths(dir: string) {
  return {
    data: path.join(dir, 'data'),
    socket: path.join(dir, 'mariadb.sock'),
    pidFile: path.join(dir, 'mariadb.pid'),
    errorLog: path.join(dir, 'mariadb.err'),
  };
}

function readPid(pidFile: string): number | null {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

async function waitFor(check: () => boolean, ms: number, interval = 100): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (check()) return true;
    await new Promise((r) => setTimeout(r, interval));
  }
  return check();
}

function instance(dir: string, port: number, pid: number, startedHere: boolean): MariaDbInstance {
  const p = paths(dir);
  return {
    dir,
    port,
    socket: p.socket,
    pid,
    startedHere,
    async stop() {
      // the server may have been restarted since (the fault tests do): stop whatever this
      // data directory's pid file names now
      const current = readPid(p.pidFile) ?? pid;
      if (!alive(current)) return;
      process.kill(current, 'SIGTERM');
      if (!(await waitFor(() => !alive(current), 30_000))) {
        process.kill(current, 'SIGKILL');
        await waitFor(() => !alive(current), 5_000);
      }
    },
  };
}

/** Starts the server for `dir` (creating its data directory on first use) or reuses a running one. */
export async function startMariaDb(dir: string, port: number, o: { extraArgs?: string[] } = {}): Promise<MariaDbInstance> {
  const p = paths(dir);
  mkdirSync(dir, { recursive: true });

  const existing = readPid(p.pidFile);
  if (existing && alive(existing) && ping(p.socket)) return instance(dir, port, existing, false);
  if (existing && !alive(existing)) {
    rmSync(p.pidFile, { force: true });
    rmSync(p.socket, { force: true });
  }

  if (!existsSync(path.join(p.data, 'mysql'))) {
    const init = spawnSync(
      'mariadb-install-db',
      ['--no-defaults', `--datadir=${p.data}`, '--user=root', '--auth-root-authentication-method=normal', '--skip-test-db'],
      { encoding: 'utf8' },
    );
    if (init.status !== 0) {
      rmSync(p.data, { recursive: true, force: true });
      throw new MariaDbError(`mariadb-install-db failed:\n${init.stderr || init.stdout}`);
    }
  }

  if (await portInUse('127.0.0.1', port)) {
    throw new MariaDbError(`Port ${port} on 127.0.0.1 is already in use, so MariaDB cannot listen there. Stop that program or set DB_PORT.`);
  }

  rmSync(p.errorLog, { force: true });
  const log = openSync(p.errorLog, 'a');
  const child = spawn(
    'mariadbd',
    [
      '--no-defaults',
      `--datadir=${p.data}`,
      `--socket=${p.socket}`,
      `--pid-file=${p.pidFile}`,
      `--port=${port}`,
      '--bind-address=127.0.0.1',
      '--user=root',
      `--log-error=${p.errorLog}`,
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--default-time-zone=+00:00',
      '--skip-name-resolve',
      '--innodb-buffer-pool-size=128M',
      ...(o.extraArgs ?? []),
    ],
    { detached: true, stdio: ['ignore', log, log] },
  );
  closeSync(log);
  child.unref();
  let exited: number | null = null;
  child.on('exit', (code) => (exited = code ?? -1));

  await waitFor(() => exited !== null || ping(p.socket), 30_000, 150);
  const ready = exited === null && ping(p.socket);
  if (!ready) {
    if (child.pid && alive(child.pid)) process.kill(child.pid, 'SIGKILL');
    throw new MariaDbError(`MariaDB did not start${exited !== null ? ` (exit code ${exited})` : ' within 30 s'}. The end of its error log (${p.errorLog}):\n${tail(p.errorLog)}`);
  }
  return instance(dir, port, child.pid!, true);
}

function sqlString(s: string): string {
  return `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

/** Runs SQL as the local root account through the socket. */
export function rootSql(instanceOrSocket: MariaDbInstance | string, sql: string): string {
  const socket = typeof instanceOrSocket === 'string' ? instanceOrSocket : instanceOrSocket.socket;
  const r = spawnSync('mariadb', ['--no-defaults', `--socket=${socket}`, '-uroot', '--batch', '--skip-column-names'], { input: sql, encoding: 'utf8' });
  if (r.status !== 0) throw new MariaDbError(`SQL failed: ${r.stderr.trim()}`);
  return r.stdout;
}

/** Creates the database (optionally from scratch) and an application user granted on it only. */
export function ensureDatabase(db: MariaDbInstance, o: { name: string; user: string; password: string; recreate?: boolean }): void {
  if (!/^\w+$/.test(o.name) || !/^\w+$/.test(o.user)) throw new MariaDbError('Database and user names must be letters, digits and _.');
  const statements = [
    o.recreate ? `DROP DATABASE IF EXISTS \`${o.name}\`;` : '',
    `CREATE DATABASE IF NOT EXISTS \`${o.name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
    ...['127.0.0.1', 'localhost'].flatMap((host) => [
      `CREATE USER IF NOT EXISTS '${o.user}'@'${host}' IDENTIFIED BY ${sqlString(o.password)};`,
      `ALTER USER '${o.user}'@'${host}' IDENTIFIED BY ${sqlString(o.password)};`,
      `GRANT ALL PRIVILEGES ON \`${o.name}\`.* TO '${o.user}'@'${host}';`,
    ]),
    'FLUSH PRIVILEGES;',
  ];
  rootSql(db, statements.join('\n'));
}

export type SupervisorEvent =
  | { type: 'died'; pid: number; uptimeMs: number }
  | { type: 'restarting'; attempt: number; delayMs: number }
  | { type: 'restarted'; pid: number; downMs: number }
  | { type: 'restart-failed'; attempt: number; error: Error }
  | { type: 'gave-up'; failures: number; error: Error | null };

export interface SupervisorOptions {
  /** The pid this supervisor watches first: the server the caller started. */
  pid: number;
  /** Starts the server again; resolves with the new pid (rejects when it cannot start). */
  restart(): Promise<number>;
  isAlive?(pid: number): boolean;
  /** Waits before each restart, growing with the failures in a row; the last entry repeats. */
  backoffMs?: readonly number[];
  checkEveryMs?: number;
  /** A server that stays up this long resets the backoff; one that dies sooner counts as a failure. */
  stableMs?: number;
  /** Failures in a row (failed starts or quick deaths) after which the supervisor gives up. */
  maxFailures?: number;
  onEvent?(event: SupervisorEvent): void;
  now?(): number;
}

export interface Supervisor {
  /** The pid watched now (changes with each restart). */
  readonly pid: number;
  readonly restarts: number;
  /** Resolves when the supervisor stops: `stop()` or giving up. */
  readonly done: Promise<'stopped' | 'gave-up'>;
  /** Stops watching (before the caller stops the server itself, so it is not started again). */
  stop(): Promise<void>;
}

export const SUPERVISOR_BACKOFF_MS = [500, 1000, 2000, 5000, 10_000, 30_000] as const;

/**
 * Watches a process by its pid and starts it again when it dies, waiting longer after each failure
 * in a row. It never signals anything itself: it only checks the pid it was given or started.
 */
export function superviseProcess(o: SupervisorOptions): Supervisor {
  const isAlive = o.isAlive ?? alive;
  const backoff = o.backoffMs ?? SUPERVISOR_BACKOFF_MS;
  const checkEvery = o.checkEveryMs ?? 1000;
  const stableMs = o.stableMs ?? 60_000;
  const maxFailures = o.maxFailures ?? 6;
  const now = o.now ?? Date.now;
  const emit = (e: SupervisorEvent) => o.onEvent?.(e);
  let pid = o.pid;
  let restarts = 0;
  let stopped = false;
  let wake: (() => void) | null = null;
  const sleep = (ms: number) =>
    new Promise<void>((resolve) => {
      const timer = setTimeout(() => {
        wake = null;
        resolve();
      }, ms);
      wake = () => {
        clearTimeout(timer);
        wake = null;
        resolve();
      };
    });

  async function loop(): Promise<'stopped' | 'gave-up'> {
    let failures = 0;
    let upSince = now();
    while (!stopped) {
      await sleep(checkEvery);
      if (stopped) break;
      if (isAlive(pid)) {
        if (now() - upSince >= stableMs) failures = 0;
        continue;
      }
      const diedAt = now();
      emit({ type: 'died', pid, uptimeMs: diedAt - upSince });
      // a server that keeps dying soon after its start is failing, not just unlucky
      if (diedAt - upSince < stableMs && restarts > 0) failures += 1;
      let lastError: Error | null = null;
      while (!stopped) {
        if (failures >= maxFailures) {
          emit({ type: 'gave-up', failures, error: lastError });
          return 'gave-up';
        }
        const delayMs = backoff[Math.min(failures, backoff.length - 1)]!;
        emit({ type: 'restarting', attempt: failures + 1, delayMs });
        await sleep(delayMs);
        if (stopped) break;
        try {
          pid = await o.restart();
          restarts += 1;
          upSince = now();
          emit({ type: 'restarted', pid, downMs: upSince - diedAt });
          break;
        } catch (err) {
          lastError = err as Error;
          failures += 1;
          emit({ type: 'restart-failed', attempt: failures, error: lastError });
        }
      }
    }
    return 'stopped';
  }

  const done = loop();
  return {
    get pid() {
      return pid;
    },
    get restarts() {
      return restarts;
    },
    done,
    async stop() {
      stopped = true;
      wake?.();
      await done;
    },
  };
}

/** Keeps the project's MariaDB for `dir` running: started again on the same data directory and port. */
export function superviseMariaDb(db: MariaDbInstance, o: Omit<SupervisorOptions, 'pid' | 'restart'> & { onRestart?(db: MariaDbInstance): void } = {}): Supervisor {
  return superviseProcess({
    ...o,
    pid: db.pid,
    restart: async () => {
      const next = await startMariaDb(db.dir, db.port);
      o.onRestart?.(next);
      return next.pid;
    },
  });
}
