// Fault: the database goes away while the API runs. Health must say so with 503, the catalogue
// must answer 503-class problem details or 500 without internals, and everything must recover
// when the database is back — without restarting the API.
import request from 'supertest';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { startMariaDb } from '../../scripts/lib/mariadb';
import { createTestApp, type TestApp } from '../setup/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function eventually(check: () => Promise<boolean>, ms: number): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, 250));
  }
  return false;
}

it('reports the outage on /api/health and recovers when MariaDB is back', async () => {
  const db = inject('db');
  await request(t.app).get('/api/health').expect(200);

  process.kill(db.pid, 'SIGTERM');
  const down = await eventually(async () => (await request(t.app).get('/api/health')).status === 503, 30_000);
  expect(down).toBe(true);
  const res = await request(t.app).get('/api/health').expect(503);
  expect(res.body.data.database.ok).toBe(false);
  expect(res.body.data.database.error).toMatch(/unreachable/);
  const catalogue = await request(t.app).get('/api/catalogue/service-types');
  expect(catalogue.status).toBeGreaterThanOrEqual(500);
  expect(catalogue.headers['content-type']).toMatch(/problem\+json/);

  // start the same server again (same data directory, same port); the global teardown stops it
  const restarted = await startMariaDb(db.dir, db.port);
  expect(restarted.startedHere).toBe(true);
  const up = await eventually(async () => (await request(t.app).get('/api/health')).status === 200, 30_000);
  expect(up).toBe(true);
  const after = await request(t.app).get('/api/catalogue/service-types').expect(200);
  expect(after.body.data.length).toBeGreaterThan(0);
}, 90_000);
