// The vehicle rules: the starting rules seeded once, the public list, network admins' changes
// (validated against the catalogue, audited), and the search applying what the table says.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedCatalogue } from '../../apps/api/src/db/seed';
import { ELIGIBILITY_RULES } from '../../apps/api/src/db/seed/eligibility-rules';
import { createTestApp, type TestApp } from '../setup/app';
import { signUpAndVerify } from '../setup/accounts';
import { bearer, networkAdmin } from '../setup/onboarding';

let t: TestApp;
let admin: Awaited<ReturnType<typeof networkAdmin>>;
const CODE = 'test-rules-petrol-pairing';
const RULE = {
  code: CODE,
  serviceTypes: ['handset-pairing'],
  when: { fuel: ['petrol'] },
  effect: { severity: 'notice', message: 'Petrol vans keep the receiver in another place.', extraMinutes: 10, addCapabilities: ['lin-can-tools'] },
};

const list = (who?: { accessToken: string }) => {
  const req = request(t.app).get('/api/catalogue/eligibility-rules');
  return who ? req.set(bearer(who)) : req;
};
const codes = (res: request.Response) => (res.body.data as { code: string }[]).map((r) => r.code);
const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();
const audits = async (code: string): Promise<string[]> =>
  (await t.dataSource.query("SELECT action FROM audit_log WHERE entity_type = 'eligibility-rule' AND entity_id = ? ORDER BY id", [code])).map((r: { action: string }) => r.action);

beforeAll(async () => {
  t = await createTestApp();
  admin = await networkAdmin(t.app);
});
afterAll(() => t.close());

describe('GET /api/catalogue/eligibility-rules', () => {
  it('lists the starting rules, active, in their order', async () => {
    const res = await list().expect(200);
    expect(codes(res).slice(0, ELIGIBILITY_RULES.length)).toEqual(ELIGIBILITY_RULES.map((r) => r.code));
    const first = res.body.data[0];
    expect(first).toMatchObject({ code: 'no-coolant-heater-to-convert', active: true, when: { factoryHeater: ['none', 'air'] }, effect: { severity: 'block', addCapabilities: [], extraMinutes: 0, extraParts: [] } });
    expect(Date.parse(first.updatedAt)).not.toBeNaN();
  });
});

describe('network admins change the rules', () => {
  it('adds, changes, switches off and deletes a rule, each audited, and the search follows', async () => {
    const search = (q: object = {}) => request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', lat: 55.6415, lng: 12.0803, fuel: 'petrol', ...q }).expect(200);
    const created = await request(t.app).post('/api/admin/eligibility-rules').set(bearer(admin)).send(RULE).expect(201);
    expect(created.body.data).toMatchObject({ ...RULE, active: true, effect: { ...RULE.effect, suggestServiceTypes: [], extraParts: [] } });
    expect(codes(await list().expect(200)).at(-1)).toBe(CODE);
    expect((await search()).body.meta.eligibility).toMatchObject({ extraMinutes: 10, requiredCapabilities: ['digital-multimeter', 'lin-can-tools'] });

    const changed = await request(t.app)
      .put(`/api/admin/eligibility-rules/${CODE}`)
      .set(bearer(admin))
      .send({ ...RULE, effect: { ...RULE.effect, severity: 'block', suggestServiceTypes: ['remote-kit-fitting'] } })
      .expect(200);
    expect(changed.body.data.effect).toMatchObject({ severity: 'block', suggestServiceTypes: ['remote-kit-fitting'] });
    expect((await search()).body).toMatchObject({ data: [], meta: { eligibility: { eligible: false }, gapRecorded: false } });

    await request(t.app).put(`/api/admin/eligibility-rules/${CODE}`).set(bearer(admin)).send({ ...RULE, active: false }).expect(200);
    expect(codes(await list().expect(200))).not.toContain(CODE);
    // a signed-in network admin still sees it, to switch it on again
    const all = await list(admin).expect(200);
    expect(all.body.data.find((r: { code: string }) => r.code === CODE)).toMatchObject({ active: false });
    expect((await search()).body.meta.eligibility).toMatchObject({ eligible: true, extraMinutes: 0 });

    await request(t.app).delete(`/api/admin/eligibility-rules/${CODE}`).set(bearer(admin)).expect(200);
    expect(codes(await list(admin).expect(200))).not.toContain(CODE);
    await request(t.app).delete(`/api/admin/eligibility-rules/${CODE}`).set(bearer(admin)).expect(404);
    await request(t.app).put(`/api/admin/eligibility-rules/${CODE}`).set(bearer(admin)).send(RULE).expect(404);
    expect(await audits(CODE)).toEqual(['eligibility-rule.create', 'eligibility-rule.update', 'eligibility-rule.update', 'eligibility-rule.delete']);

    // the code can be used again after a deletion
    await request(t.app).post('/api/admin/eligibility-rules').set(bearer(admin)).send(RULE).expect(201);
    await request(t.app).delete(`/api/admin/eligibility-rules/${CODE}`).set(bearer(admin)).expect(200);
  });

  it('answers 409 for a code in use and names unknown or retired catalogue codes', async () => {
    const code = 'test-rules-duplicate';
    await request(t.app).post('/api/admin/eligibility-rules').set(bearer(admin)).send({ ...RULE, code }).expect(201);
    try {
      expect((await request(t.app).post('/api/admin/eligibility-rules').set(bearer(admin)).send({ ...RULE, code }).expect(409)).body.code).toBe('RULE_EXISTS');
      const bad = await request(t.app)
        .post('/api/admin/eligibility-rules')
        .set(bearer(admin))
        .send({ ...RULE, code: 'test-rules-unknown', serviceTypes: ['handset-pairing', 'teleportation'], effect: { ...RULE.effect, suggestServiceTypes: ['levitation'], addCapabilities: ['lin-can-tools', 'magic-wand'] } })
        .expect(400);
      expect(paths(bad)).toEqual(['effect.addCapabilities.1', 'effect.suggestServiceTypes.0', 'serviceTypes.1']);
      expect(bad.body.errors.find((e: { path: string }) => e.path === 'serviceTypes.1').message).toContain('teleportation');
      const wrongCode = await request(t.app).put(`/api/admin/eligibility-rules/${code}`).set(bearer(admin)).send({ ...RULE, code: 'another-code' }).expect(400);
      expect(paths(wrongCode)).toEqual(['code']);
      expect(codes(await list(admin).expect(200))).not.toContain('test-rules-unknown');
    } finally {
      await request(t.app).delete(`/api/admin/eligibility-rules/${code}`).set(bearer(admin)).expect(200);
    }
  });

  it('answers bad input with field errors and saves nothing', async () => {
    const send = (body: object) => request(t.app).post('/api/admin/eligibility-rules').set(bearer(admin)).send(body).expect(400);
    expect(paths(await send({ ...RULE, code: 'Bad Code', when: {} }))).toEqual(['code', 'when']);
    expect(paths(await send({ ...RULE, effect: { ...RULE.effect, severity: 'maybe', message: 'short', extraMinutes: 7 } }))).toEqual(['effect.extraMinutes', 'effect.message', 'effect.severity']);
    expect(paths(await send({ ...RULE, when: { electricalSystemV: [48], yearBefore: 1800 } }))).toEqual(['when.electricalSystemV.0', 'when.yearBefore']);
    expect(codes(await list(admin).expect(200))).not.toContain(CODE);
  });

  it('is for network admins only', async () => {
    await request(t.app).post('/api/admin/eligibility-rules').send(RULE).expect(401);
    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/admin/eligibility-rules').set(bearer(owner)).send(RULE).expect(403);
    await request(t.app).put('/api/admin/eligibility-rules/no-coolant-heater-to-convert').set(bearer(owner)).send(RULE).expect(403);
    await request(t.app).delete('/api/admin/eligibility-rules/no-coolant-heater-to-convert').set(bearer(owner)).expect(403);
    // an owner's token on the public list is fine and shows only the active rules
    expect(codes(await list(owner).expect(200))).toEqual(codes(await list().expect(200)));
    await request(t.app).get('/api/catalogue/eligibility-rules').set('authorization', 'Bearer not-a-token').expect(401);
  });
});

describe('the seed', () => {
  it('adds the starting rules once and never brings back or overwrites what admins changed', async () => {
    const code = 'older-control-unit-check';
    const original = (await list().expect(200)).body.data.find((r: { code: string }) => r.code === code);
    await request(t.app)
      .put(`/api/admin/eligibility-rules/${code}`)
      .set(bearer(admin))
      .send({ ...original, updatedAt: undefined, effect: { ...original.effect, extraMinutes: 30 } })
      .expect(200);
    await request(t.app).delete('/api/admin/eligibility-rules/petrol-air-heater-fuel-pickup').set(bearer(admin)).expect(200);
    try {
      expect((await seedCatalogue(t.dataSource.manager)).eligibilityRulesAdded).toBe(0);
      const after = (await list().expect(200)).body.data;
      expect(after.find((r: { code: string }) => r.code === code).effect.extraMinutes).toBe(30);
      expect(after.map((r: { code: string }) => r.code)).not.toContain('petrol-air-heater-fuel-pickup');
    } finally {
      const { updatedAt: _u, ...body } = original;
      await request(t.app).put(`/api/admin/eligibility-rules/${code}`).set(bearer(admin)).send(body).expect(200);
      // back in its place in the order, for the test files after this one
      await t.dataSource.query("UPDATE eligibility_rule SET deleted_at = NULL, active = 1 WHERE code = 'petrol-air-heater-fuel-pickup'");
    }
  });
});
