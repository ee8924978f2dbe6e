// The OpenAPI document against a standard linter's recommended rules, and the operation ids clients are generated from.
import { createConfig, lintFromString } from '@redocly/openapi-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { operationIdFor } from '../../apps/api/src/lib/api-router';
import { buildOpenApiDocument } from '../../apps/api/src/routes/docs.routes';
import { createTestApp, type TestApp } from '../setup/app';

let t: TestApp;
let doc: ReturnType<typeof buildOpenApiDocument>;
beforeAll(async () => {
  t = await createTestApp();
  doc = buildOpenApiDocument(t.app.openApiRegistry, 'test');
});
afterAll(() => t.close());

type Operation = { operationId?: string; security?: Record<string, string[]>[] };
const operations = () =>
  Object.entries(doc.paths ?? {}).flatMap(([path, item]) =>
    (['get', 'put', 'post', 'delete', 'patch'] as const).flatMap((method) => {
      const op = (item as Record<string, Operation | undefined>)[method];
      return op ? [{ method, path, op }] : [];
    }),
  );

describe('OpenAPI lint', () => {
  it("passes Redocly's recommended rules with no errors", async () => {
    const config = await createConfig({ extends: ['recommended'] });
    const problems = await lintFromString({ source: JSON.stringify(doc), absoluteRef: 'openapi.json', config });
    const errors = problems.filter((p) => p.severity === 'error').map((p) => `${p.ruleId}: ${p.message} at ${p.location[0]?.pointer ?? '?'}`);
    expect(errors).toEqual([]);
  });

  it('gives every operation a unique camelCase operationId made from its method and path', () => {
    const ops = operations();
    expect(ops.length).toBeGreaterThan(50);
    for (const { method, path, op } of ops) {
      expect(op.operationId, `${method} ${path}`).toMatch(/^[a-z]+[A-Z][A-Za-z0-9]*$/);
      expect(op.operationId).toBe(operationIdFor(method, path, '/api'));
    }
    expect(new Set(ops.map((o) => o.op.operationId)).size).toBe(ops.length);
    expect(operationIdFor('get', '/api/orgs/{orgId}/bookings/{bookingId}', '/api')).toBe('getOrgsByOrgIdBookingsByBookingId');
    expect(operationIdFor('post', '/api/auth/sign-in', '/api')).toBe('postAuthSignIn');
  });

  it('says that public operations need no security, and which need a bearer token', () => {
    for (const { method, path, op } of operations()) {
      expect(op.security, `${method} ${path} declares its security`).toBeDefined();
    }
    const security = (path: string, method: string) => (doc.paths![path] as Record<string, Operation>)[method]!.security;
    expect(security('/api/health', 'get')).toEqual([]);
    expect(security('/api/auth/sign-in', 'post')).toEqual([]);
    expect(security('/api/payments/webhook', 'post')).toEqual([]);
    expect(security('/api/me', 'get')).toEqual([{ bearerAuth: [] }]);
  });
});
