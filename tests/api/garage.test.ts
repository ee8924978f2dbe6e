// The owner's garage: CRUD, validation, and that owners only ever see their own vehicles.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { VehicleInput } from '@emberline/domain';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam, signIn, signUpAndVerify } from '../setup/accounts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const van: VehicleInput = {
  name: 'Test van',
  model: 'Korvan Cargo 4',
  year: 2022,
  fuel: 'diesel',
  factoryHeater: 'coolant_auxiliary',
  climateControl: 'automatic',
  electricalSystemV: 12,
  batteryCapacityAh: 95,
  batteryType: 'agm',
};

describe('garage', () => {
  it('adds, lists, changes and removes vehicles', async () => {
    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    const auth = { authorization: `Bearer ${owner.accessToken}` };
    expect((await request(t.app).get('/api/me/vehicles').set(auth).expect(200)).body.data).toEqual([]);
    const added = await request(t.app).post('/api/me/vehicles').set(auth).send(van).expect(201);
    expect(added.body.data).toMatchObject(van);
    const id = added.body.data.id;
    const changed = await request(t.app).patch(`/api/me/vehicles/${id}`).set(auth).send({ electricalSystemV: 24, name: 'Renamed' }).expect(200);
    expect(changed.body.data).toMatchObject({ electricalSystemV: 24, name: 'Renamed', model: van.model });
    expect((await request(t.app).get('/api/me/vehicles').set(auth)).body.data).toHaveLength(1);
    await request(t.app).delete(`/api/me/vehicles/${id}`).set(auth).expect(200);
    await request(t.app).delete(`/api/me/vehicles/${id}`).set(auth).expect(404);
  });

  it('refuses impossible values with field errors naming the range', async () => {
    const owner = await signIn(t.app, 'clara@owners.example', DEMO_PASSWORD);
    const res = await request(t.app)
      .post('/api/me/vehicles')
      .set({ authorization: `Bearer ${owner.accessToken}` })
      .send({ ...van, year: 1900, electricalSystemV: 48, batteryCapacityAh: 5, factoryHeater: 'jet' })
      .expect(400);
    const byPath = Object.fromEntries(res.body.errors.map((e: { path: string; message: string }) => [e.path, e.message]));
    expect(byPath.year).toMatch(/between 1980 and/);
    expect(byPath.electricalSystemV).toMatch(/12 V or 24 V/);
    expect(byPath.batteryCapacityAh).toMatch(/between 10 and 1000 Ah/);
    expect(byPath.factoryHeater).toBeDefined();
  });

  it("keeps owners apart: another owner's vehicle is not found and not changed", async () => {
    const clara = await signIn(t.app, 'clara@owners.example', DEMO_PASSWORD);
    const max = await signIn(t.app, 'max@owners.example', DEMO_PASSWORD);
    const claras = (await request(t.app).get('/api/me/vehicles').set({ authorization: `Bearer ${clara.accessToken}` }).expect(200)).body.data;
    expect(claras.map((v: { model: string }) => v.model)).toEqual(['Korvan Cargo 4']);
    const target = claras[0].id;
    const maxAuth = { authorization: `Bearer ${max.accessToken}` };
    await request(t.app).patch(`/api/me/vehicles/${target}`).set(maxAuth).send({ name: 'Mine now' }).expect(404);
    await request(t.app).delete(`/api/me/vehicles/${target}`).set(maxAuth).expect(404);
    const maxList = (await request(t.app).get('/api/me/vehicles').set(maxAuth)).body.data;
    expect(maxList.map((v: { id: string }) => v.id)).not.toContain(target);
    const after = (await request(t.app).get('/api/me/vehicles').set({ authorization: `Bearer ${clara.accessToken}` })).body.data;
    expect(after[0].name).toBe('Work van');
  });

  it('is for owners only', async () => {
    const { admin } = await partnerWithTeam(t.app, t.dataSource);
    await request(t.app).get('/api/me/vehicles').set({ authorization: `Bearer ${admin.accessToken}` }).expect(403);
    await request(t.app).get('/api/me/vehicles').expect(401);
  });
});
