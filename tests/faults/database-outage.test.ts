// Fault: the database goes away while the API runs. Health must say so with 503, reads must answer
// 503 problem details with Retry-After (never 500), and everything must recover when the database
// is back — without restarting the API.
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { eventually, killDb, restartDb } from './fault-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

it('reports the outage on /api/health and recovers when MariaDB is back', async () => {
  await request(t.app).get('/api/health').expect(200);

  await killDb('SIGTERM');
  const down = await eventually(async () => (await request(t.app).get('/api/health')).status === 503, 30_000);
  expect(down).toBe(true);
  const res = await request(t.app).get('/api/health').expect(503);
  expect(res.body.data.database.ok).toBe(false);
  expect(res.body.data.database.error).toMatch(/unreachable/);
  for (const res of [
    await request(t.app).get('/api/catalogue/service-types'),
    await request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', lat: 47.26, lng: 11.39 }),
  ]) {
    expect(res.status, JSON.stringify(res.body)).toBe(503);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    expect(res.headers['retry-after']).toMatch(/^\d+$/);
    expect(res.body).toMatchObject({ code: 'SERVICE_UNAVAILABLE', status: 503 });
    expect(JSON.stringify(res.body)).not.toMatch(/ECONNREFUSED|at \w+ \(/);
  }

  // start the same server again (same data directory, same port); the global teardown stops it
  const restarted = await restartDb();
  expect(restarted.startedHere).toBe(true);
  const up = await eventually(async () => (await request(t.app).get('/api/health')).status === 200, 30_000);
  expect(up).toBe(true);
  const after = await request(t.app).get('/api/catalogue/service-types').expect(200);
  expect(after.body.data.length).toBeGreaterThan(0);
}, 90_000);
