// Backs a MariaDB database up to a gzipped SQL file with mariadb-dump, and restores one with mariadb.
import { spawn } from 'node:child_process';
import { createReadStream, createWriteStream, mkdirSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';

/** How to reach the server: the local root account through a socket, or an account over TCP. */
export type Connection = { socket: string } | { host: string; port: number; user: string; password: string };

export class BackupError extends Error {}

/** mariadb-dump writes this as its last line; a file without it was cut short. */
const COMPLETE = /^-- Dump completed/m;
const NAME = /^\w+$/;

function clientArgs(c: Connection): { args: string[]; env: NodeJS.ProcessEnv } {
  // --no-defaults: a ~/.my.cnf must not point a backup at another server
  if ('socket' in c) return { args: ['--no-defaults', `--socket=${c.socket}`, '-uroot'], env: process.env };
  // the password goes through the environment, where `ps` does not show it
  return { args: ['--no-defaults', '--protocol=TCP', `--host=${c.host}`, `--port=${c.port}`, `--user=${c.user}`], env: { ...process.env, MYSQL_PWD: c.password } };
}

/**
 * Drops DEFINER clauses from the dump's triggers, routines and views, so they restore on a server
 * where the account that created them does not exist (they then run as the restoring account).
 * Only schema lines are touched: row data never changes.
 */
function withoutDefiners(): Transform {
  let rest = '';
  const clean = (line: string) =>
    line.startsWith('INSERT INTO') ? line : line.replace(/\/\*!5001[37] DEFINER=`[^`]*`@`[^`]*`[^*]*\*\/ ?/g, '').replace(/ DEFINER=`[^`]*`@`[^`]*`/g, '');
  return new Transform({
    transform(chunk: Buffer, _encoding, done) {
      const lines = (rest + chunk.toString('utf8')).split('\n');
      rest = lines.pop()!;
      done(null, lines.map((l) => `${clean(l)}\n`).join(''));
    },
    flush(done) {
      done(null, rest ? clean(rest) : '');
    },
  });
}

function finished(child: ReturnType<typeof spawn>, what: string, stderr: () => string): Promise<void> {
  return new Promise((resolve, reject) => {
    child.once('error', (err) => reject(new BackupError(`${what} could not start: ${err.message}`)));
    child.once('close', (code) => (code === 0 ? resolve() : reject(new BackupError(`${what} failed (exit code ${code}): ${stderr().trim() || 'no message'}`))));
  });
}

/** Waits for the stream and the client both; the client's own message explains a failure best. */
async function both(streaming: Promise<void>, client: Promise<void>): Promise<void> {
  const [s, c] = await Promise.allSettled([streaming, client]);
  if (c.status === 'rejected') throw c.reason;
  if (s.status === 'rejected') throw s.reason;
}

function collect(stream: Readable | null): () => string {
  let text = '';
  stream?.on('data', (d: Buffer) => (text = (text + d.toString('utf8')).slice(-4000)));
  return () => text;
}

/** The default file of a backup: var/backups/<UTC timestamp>.sql.gz under `dir`. */
export function backupFileName(dir: string, now = new Date()): string {
  return path.join(dir, `${now.toISOString().replace(/[:.]/g, '-')}.sql.gz`);
}

/**
 * Dumps `database` to `file` (gzipped): one consistent snapshot (--single-transaction, so the API
 * keeps writing meanwhile), with triggers (the search index's change log depends on them),
 * routines and events. Writes to a temporary name first, so a failed dump never leaves a file
 * that looks like a backup.
 */
export async function backupDatabase(c: Connection, database: string, file: string): Promise<{ file: string; bytes: number }> {
  if (!NAME.test(database)) throw new BackupError('Database names must be letters, digits and _.');
  mkdirSync(path.dirname(file), { recursive: true });
  const partial = `${file}.partial`;
  const { args, env } = clientArgs(c);
  const dump = spawn(
    'mariadb-dump',
    [...args, '--single-transaction', '--quick', '--routines', '--triggers', '--events', '--hex-blob', '--default-character-set=utf8mb4', '--tz-utc', database],
    { env, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  const done = finished(dump, 'mariadb-dump', collect(dump.stderr));
  try {
    await both(pipeline(dump.stdout!, withoutDefiners(), createGzip(), createWriteStream(partial)), done);
    renameSync(partial, file);
  } catch (err) {
    dump.kill();
    rmSync(partial, { force: true });
    throw err;
  }
  return { file, bytes: statSync(file).size };
}

/** Reads the whole file once: a restore must not drop the database for a corrupt or truncated backup. */
export async function checkBackup(file: string): Promise<void> {
  let tail = '';
  const tracker = new Transform({
    transform(chunk: Buffer, _encoding, done) {
      tail = (tail + chunk.toString('utf8')).slice(-500);
      done();
    },
  });
  try {
    await pipeline(createReadStream(file), createGunzip(), tracker);
  } catch (err) {
    throw new BackupError(`${file} is not a readable gzipped backup: ${(err as Error).message}`);
  }
  if (!COMPLETE.test(tail)) throw new BackupError(`${file} does not end with mariadb-dump's "Dump completed" line: the backup was cut short.`);
}

/** Runs SQL through the mariadb client. */
export async function runSql(c: Connection, sql: string): Promise<void> {
  const { args, env } = clientArgs(c);
  const client = spawn('mariadb', [...args, '--batch'], { env, stdio: ['pipe', 'ignore', 'pipe'] });
  const done = finished(client, 'mariadb', collect(client.stderr));
  client.stdin!.end(sql);
  await done;
}

/**
 * Replaces `database` with the backup's content: checks the file, drops and recreates the
 * database (grants on it survive), then loads the dump. Everything in the database that is not
 * in the backup is gone afterwards.
 */
export async function restoreDatabase(c: Connection, database: string, file: string): Promise<void> {
  if (!NAME.test(database)) throw new BackupError('Database names must be letters, digits and _.');
  await checkBackup(file);
  await runSql(c, `DROP DATABASE IF EXISTS \`${database}\`;\nCREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`);
  const { args, env } = clientArgs(c);
  const client = spawn('mariadb', [...args, '--batch', '--default-character-set=utf8mb4', database], { env, stdio: ['pipe', 'ignore', 'pipe'] });
  const done = finished(client, 'mariadb', collect(client.stderr));
  await both(pipeline(createReadStream(file), createGunzip(), client.stdin!), done);
}
