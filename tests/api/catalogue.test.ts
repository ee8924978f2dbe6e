// The catalogue routes against the real MariaDB: contents, shapes and bad input.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CapabilityListSchema, ProblemDetailsSchema, ServiceTypeListSchema } from '@emberline/domain';
import { CAPABILITIES, SERVICE_TYPES } from '../../apps/api/src/db/seed/catalogue-data';
import { runSeed } from '../../apps/api/src/db/seed';
import { createTestApp, type TestApp } from '../setup/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/catalogue/service-types', () => {
  it('lists every seeded service type with its required capability codes, in catalogue order', async () => {
    const res = await request(t.app).get('/api/catalogue/service-types').expect(200).expect('content-type', /application\/json/);
    const body = ServiceTypeListSchema.parse(res.body);
    expect(body.data.map((s) => s.code)).toEqual(SERVICE_TYPES.map((s) => s.code));
    const conversion = body.data.find((s) => s.code === 'parking-conversion-auto')!;
    expect(conversion.requiredCapabilities).toEqual([...SERVICE_TYPES[0]!.requiredCapabilities].sort());
    expect(conversion.cautions).toContain('stable-power-flashing');
  });

  it('every service type that flashes or configures a control unit carries the stable-power caution', async () => {
    const res = await request(t.app).get('/api/catalogue/service-types').expect(200);
    for (const s of ServiceTypeListSchema.parse(res.body).data) {
      const flashes = s.requiredCapabilities.some((c) => c === 'uds-flash-programming' || c === 'control-unit-coding');
      if (flashes) expect(s.cautions, s.code).toContain('stable-power-flashing');
      if (flashes) expect(s.requiredCapabilities, s.code).toContain('battery-support-unit');
    }
  });

  it('hides retired service types', async () => {
    await t.dataSource.query("UPDATE service_type SET retired = 1 WHERE code = 'handset-pairing'");
    try {
      const res = await request(t.app).get('/api/catalogue/service-types').expect(200);
      expect(res.body.data.map((s: { code: string }) => s.code)).not.toContain('handset-pairing');
      await request(t.app).get('/api/catalogue/service-types/handset-pairing').expect(404);
    } finally {
      await t.dataSource.query("UPDATE service_type SET retired = 0 WHERE code = 'handset-pairing'");
    }
  });
});

describe('GET /api/catalogue/service-types/:code', () => {
  it('returns one service type', async () => {
    const res = await request(t.app).get('/api/catalogue/service-types/seasonal-heater-service').expect(200);
    expect(res.body.data.name).toBe('Seasonal heater service');
    expect(res.body.data.defaultDurationMinutes).toBe(90);
  });

  it('answers 404 problem details for an unknown code', async () => {
    const res = await request(t.app).get('/api/catalogue/service-types/no-such-service').expect(404).expect('content-type', /application\/problem\+json/);
    const problem = ProblemDetailsSchema.parse(res.body);
    expect(problem.code).toBe('NOT_FOUND');
    expect(problem.detail).toContain('no-such-service');
  });

  it('refuses a malformed code with a field error', async () => {
    const res = await request(t.app).get('/api/catalogue/service-types/Bad_Code!').expect(400);
    expect(res.body.code).toBe('VALIDATION_FAILED');
    expect(res.body.errors).toEqual([expect.objectContaining({ path: 'params.code' })]);
  });
});

describe('GET /api/catalogue/capabilities', () => {
  it('lists every seeded capability', async () => {
    const res = await request(t.app).get('/api/catalogue/capabilities').expect(200);
    const body = CapabilityListSchema.parse(res.body);
    expect(body.data.map((c) => c.code).sort()).toEqual(CAPABILITIES.map((c) => c.code).sort());
  });

  it('filters by category', async () => {
    const res = await request(t.app).get('/api/catalogue/capabilities?category=diagnostics').expect(200);
    const codes = res.body.data.map((c: { code: string }) => c.code).sort();
    expect(codes).toEqual(CAPABILITIES.filter((c) => c.category === 'diagnostics').map((c) => c.code).sort());
  });

  it('refuses an unknown category with a field error naming the allowed values', async () => {
    const res = await request(t.app).get('/api/catalogue/capabilities?category=astrology').expect(400);
    expect(res.body.errors[0].path).toBe('query.category');
    expect(res.body.errors[0].message).toContain('diagnostics');
  });
});

describe('seed', () => {
  it('is idempotent: a second run adds nothing and leaves admin edits alone', async () => {
    await t.dataSource.query("UPDATE capability SET name = 'Edited by an admin' WHERE code = 'digital-multimeter'");
    const before = await t.dataSource.query('SELECT COUNT(*) AS n FROM service_type_capability');
    const report = await runSeed(t.dataSource.manager, { passwordHashCost: 4 });
    expect(report).toEqual({ demo: 'seeded', capabilitiesAdded: 0, serviceTypesAdded: 0, eligibilityRulesAdded: 0, usersAdded: 0, organisationsAdded: 0, profilesAdded: 0, documentsAdded: 0 });
    expect(await t.dataSource.query('SELECT COUNT(*) AS n FROM service_type_capability')).toEqual(before);
    const [row] = await t.dataSource.query("SELECT name FROM capability WHERE code = 'digital-multimeter'");
    expect(row.name).toBe('Edited by an admin');
    await t.dataSource.query("UPDATE capability SET name = 'Digital multimeter with current clamp' WHERE code = 'digital-multimeter'");
  });
});
