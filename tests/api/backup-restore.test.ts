// db:backup and db:restore on the test MariaDB: the seeded test database is dumped and restored
// into another database on the same server, and every table, trigger and routine is compared.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gunzipSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import { searchIndexTriggers } from '../../apps/api/src/db/migrations/1764690000000-search-index';
import { backupDatabase, restoreDatabase } from '../../scripts/lib/backup';
import { rootSql } from '../../scripts/lib/mariadb';
import { root } from '../../scripts/lib/project';

const db = inject('db');
const source = db.name;
const copy = `${db.name}_restored`;
const server = { socket: db.socket };
let dir: string;
let file: string;

const rows = (sql: string) =>
  rootSql(db.socket, sql)
    .split('\n')
    .filter(Boolean)
    .map((line) => line.split('\t') as [string, ...string[]]);

interface Snapshot {
  tables: Record<string, { rows: number; checksum: string }>;
  triggers: string[][];
  routines: string[][];
}

/** Every table's row count and CHECKSUM TABLE, and the triggers and routines with their bodies. */
function snapshot(database: string): Snapshot {
  const names = rows(`SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = '${database}' AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME`).map(([n]) => n);
  const counts = new Map(rows(names.map((n) => `SELECT '${n}', COUNT(*) FROM \`${database}\`.\`${n}\``).join(' UNION ALL ')).map(([n, c]) => [n, Number(c)]));
  const checksums = new Map(rows(`CHECKSUM TABLE ${names.map((n) => `\`${database}\`.\`${n}\``).join(', ')}`).map(([n, c]) => [n.slice(database.length + 1), c]));
  return {
    tables: Object.fromEntries(names.map((n) => [n, { rows: counts.get(n)!, checksum: checksums.get(n)! }])),
    triggers: rows(
      `SELECT TRIGGER_NAME, EVENT_OBJECT_TABLE, ACTION_TIMING, EVENT_MANIPULATION, REPLACE(REPLACE(ACTION_STATEMENT, '\\n', ' '), '\\t', ' ') FROM information_schema.TRIGGERS WHERE TRIGGER_SCHEMA = '${database}' ORDER BY TRIGGER_NAME`,
    ),
    routines: rows(`SELECT ROUTINE_NAME, ROUTINE_TYPE FROM information_schema.ROUTINES WHERE ROUTINE_SCHEMA = '${database}' ORDER BY ROUTINE_NAME`),
  };
}

beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'emberline-backup-'));
  file = path.join(dir, 'nested', 'test.sql.gz');
});

afterAll(() => {
  rootSql(db.socket, `DROP DATABASE IF EXISTS \`${copy}\``);
  rmSync(dir, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('restores every table with the same rows and checksum, and every trigger, into a fresh database', async () => {
    const before = snapshot(source);
    // the seeded database is worth comparing: data in it, and the search index's triggers
    expect(Object.values(before.tables).reduce((n, t) => n + t.rows, 0)).toBeGreaterThan(100);
    expect(before.triggers.map(([name]) => name)).toEqual(expect.arrayContaining(searchIndexTriggers.map((t) => t.name)));

    const written = await backupDatabase(server, source, file);
    expect(written.bytes).toBeGreaterThan(1000);
    rootSql(db.socket, `DROP DATABASE IF EXISTS \`${copy}\``);
    await restoreDatabase(server, copy, file);

    const after = snapshot(copy);
    expect(Object.keys(after.tables)).toEqual(Object.keys(before.tables));
    for (const [name, t] of Object.entries(before.tables)) expect(after.tables[name], name).toEqual(t);
    expect(after.triggers).toEqual(before.triggers);
    expect(after.routines).toEqual(before.routines);
  });

  it('writes a dump without definers, so its triggers run as whoever restores it on another server', async () => {
    const sql = gunzipSync(readFileSync(file)).toString('utf8');
    expect(sql).toMatch(/CREATE\*\/ \/\*!50003 TRIGGER/);
    expect(sql).not.toMatch(/DEFINER=`/);

    // the restored triggers work: a change to a watched table writes the change log
    const logged = () => Number(rows(`SELECT COUNT(*) FROM \`${copy}\`.search_index_change`)[0]![0]);
    const n = logged();
    rootSql(db.socket, `UPDATE \`${copy}\`.partner_profile SET phone = phone LIMIT 1`);
    expect(logged()).toBe(n + 1);
  });

  it('refuses a truncated backup and leaves the database as it was', async () => {
    const sql = gunzipSync(readFileSync(file));
    const cut = path.join(dir, 'cut.sql.gz');
    writeFileSync(cut, gzipSync(sql.subarray(0, Math.floor(sql.length / 2))));
    const before = snapshot(copy);
    await expect(restoreDatabase(server, copy, cut)).rejects.toThrow(/cut short/);
    expect(snapshot(copy)).toEqual(before);

    writeFileSync(cut, 'not gzip');
    await expect(restoreDatabase(server, copy, cut)).rejects.toThrow(/not a readable gzipped backup/);
    expect(snapshot(copy)).toEqual(before);
  });

  it('leaves no file behind when the dump fails', async () => {
    const missing = path.join(dir, 'missing.sql.gz');
    await expect(backupDatabase(server, 'no_such_database', missing)).rejects.toThrow(/mariadb-dump failed/);
    expect(readdirSync(dir).filter((f) => f.startsWith('missing'))).toEqual([]);
  });

  it('npm run db:restore asks for --yes before it replaces anything', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/backup.ts'), 'db:restore', file], { cwd: root, encoding: 'utf8', timeout: 20_000 });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/Run again with --yes/);
  });
});
