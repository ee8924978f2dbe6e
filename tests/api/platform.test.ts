// Cross-cutting API behaviour: health, problem details, security headers and the OpenAPI document.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Validator } from '@seriousme/openapi-schema-validator';
import { HealthResponseSchema, ProblemDetailsSchema } from '@emberline/domain';
import { createTestApp, type TestApp } from '../setup/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/health', () => {
  it('reports a reachable, fully migrated database', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    const { data } = HealthResponseSchema.parse(res.body);
    expect(data.status).toBe('ok');
    expect(data.database).toMatchObject({ ok: true, pendingMigrations: 0 });
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('reports pending migrations as degraded with 503', async () => {
    const [last] = await t.dataSource.query('SELECT id, timestamp, name FROM migrations ORDER BY id DESC LIMIT 1');
    await t.dataSource.query('DELETE FROM migrations WHERE id = ?', [last.id]);
    try {
      const res = await request(t.app).get('/api/health').expect(503);
      expect(res.body.data).toMatchObject({ status: 'degraded', database: { ok: true, pendingMigrations: 1 } });
    } finally {
      await t.dataSource.query('INSERT INTO migrations (id, timestamp, name) VALUES (?, ?, ?)', [last.id, last.timestamp, last.name]);
    }
  });
});

describe('problem details (RFC 9457)', () => {
  it('answers an unknown API route with 404 problem details', async () => {
    const res = await request(t.app).get('/api/no/such/route').expect(404).expect('content-type', /^application\/problem\+json/);
    const problem = ProblemDetailsSchema.parse(res.body);
    expect(problem).toMatchObject({ status: 404, code: 'ROUTE_NOT_FOUND', instance: '/api/no/such/route' });
    expect(problem.requestId).toBe(res.headers['x-request-id']);
  });

  it('answers malformed JSON with 400 problem details and no stack trace', async () => {
    const res = await request(t.app).post('/api/catalogue/service-types').set('content-type', 'application/json').send('{"broken": ').expect(400);
    expect(res.body.code).toBe('MALFORMED_JSON');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/);
  });

  it('answers an oversized body with 413', async () => {
    const res = await request(t.app).post('/api/health').set('content-type', 'application/json').send(JSON.stringify({ x: 'a'.repeat(1_100_000) })).expect(413);
    expect(res.body.code).toBe('PAYLOAD_TOO_LARGE');
  });

  it('masks unexpected errors as 500 without internals', async () => {
    const broken = await createTestApp();
    await broken.dataSource.query('RENAME TABLE capability TO capability_hidden');
    try {
      const res = await request(broken.app).get('/api/catalogue/capabilities').expect(500);
      expect(res.body.code).toBe('INTERNAL');
      expect(JSON.stringify(res.body)).not.toMatch(/capability|ER_|sql/i);
    } finally {
      await broken.dataSource.query('RENAME TABLE capability_hidden TO capability');
      await broken.close();
    }
  });

  it('keeps a well-formed incoming request id and replaces a suspicious one', async () => {
    const kept = await request(t.app).get('/api/health').set('x-request-id', 'abc-12345678');
    expect(kept.headers['x-request-id']).toBe('abc-12345678');
    const replaced = await request(t.app).get('/api/health').set('x-request-id', '<script>');
    expect(replaced.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});

describe('security headers', () => {
  it('sends helmet headers and no x-powered-by', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-powered-by']).toBeUndefined();
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
  });
});

describe('OpenAPI', () => {
  it('serves a document that validates against the official OpenAPI 3.1 schema', async () => {
    const res = await request(t.app).get('/api/openapi.json').expect(200);
    expect(res.body.openapi).toBe('3.1.0');
    const validator = new Validator();
    const result = await validator.validate(res.body);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('documents every route the app serves, with problem responses', async () => {
    const doc = (await request(t.app).get('/api/openapi.json')).body;
    const served = new Set(Object.keys(doc.paths));
    for (const p of ['/api/health', '/api/catalogue/service-types', '/api/catalogue/service-types/{code}', '/api/catalogue/capabilities', '/api/auth/sign-in', '/api/auth/refresh', '/api/me', '/api/orgs/{orgId}/team', '/api/admin/mail-log']) {
      expect(served.has(p), p).toBe(true);
    }
    // every operation names its problems, and protected ones say how to authenticate
    for (const [p, item] of Object.entries(doc.paths as Record<string, Record<string, { responses: Record<string, unknown>; security?: unknown[] }>>)) {
      for (const [method, op] of Object.entries(item)) {
        expect(op.responses['400'], `${method} ${p} documents 400`).toBeDefined();
        if (p.startsWith('/api/orgs/') || p.startsWith('/api/admin/') || p === '/api/me') {
          expect(op.security, `${method} ${p} documents bearer auth`).toEqual([{ bearerAuth: [] }]);
          expect(op.responses['401'], `${method} ${p} documents 401`).toBeDefined();
        }
      }
    }
    expect(doc.paths['/api/catalogue/capabilities'].get.parameters[0]).toMatchObject({ name: 'category', in: 'query' });
    expect(doc.paths['/api/catalogue/service-types/{code}'].get.responses['404'].content['application/problem+json']).toBeDefined();
  });

  it('serves a readable docs page', async () => {
    const res = await request(t.app).get('/api/docs/').expect(200);
    expect(res.text).toContain('Emberline API reference');
  });
});
