// Start-up faults, run as real processes: bad configuration, a port already in use, and a
// MariaDB that refuses to start. Each must fail with a clear message and a non-zero exit.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { expect, inject, it } from 'vitest';
import { startMariaDb } from '../../scripts/lib/mariadb';
import { dbEnv, root } from '../../scripts/lib/project';

function runServer(env: Record<string, string>) {
  return spawnSync(process.execPath, ['--import', 'tsx', path.join(root, 'apps/api/src/server.ts')], {
    cwd: root,
    env: { PATH: process.env.PATH ?? '', LOG_LEVEL: 'silent', SERVE_APPS: 'false', ...env },
    encoding: 'utf8',
    timeout: 30_000,
  });
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

it('exits with code 2 and names the variable when the configuration is invalid', () => {
  const r = runServer({ ...dbEnv(inject('db')), PORT: 'not-a-port' });
  expect(r.status).toBe(2);
  expect(r.stderr).toContain('Configuration error');
  expect(r.stderr).toContain('PORT');
}, 40_000);

it('exits with code 4 and a clear message when the port is taken', async () => {
  const blocker = net.createServer();
  await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
  const { port } = blocker.address() as net.AddressInfo;
  try {
    const r = runServer({ ...dbEnv(inject('db')), PORT: String(port) });
    expect(r.status).toBe(4);
    expect(r.stderr).toContain(`Port ${port} on 127.0.0.1 is already in use`);
  } finally {
    blocker.close();
  }
}, 40_000);

it('reports the end of the MariaDB error log when the server cannot start', async () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-db-fault-'));
  try {
    const error = await startMariaDb(dir, await freePort(), { extraArgs: ['--no-such-option-for-the-test'] }).catch((e: Error) => e);
    expect(error).toBeInstanceOf(Error);
    expect((error as Error).message).toMatch(/MariaDB did not start/);
    expect((error as Error).message).toMatch(/no-such-option-for-the-test/);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}, 60_000);
