// Offers, parts, travel policy and working hours under /orgs/:orgId: the happy paths, the
// capability rule, another organisation's ids, bad input (field errors, nothing saved) and roles.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam } from '../setup/accounts';
import { AREA, approvedPartner, bearer, CAPABILITIES } from '../setup/onboarding';

let t: TestApp;
type Team = Awaited<ReturnType<typeof partnerWithTeam>>;
let A: Team;
let B: Team;
let bPartId: string;

const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();
const PART = { name: 'Test handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: 4 };
const OFFER = {
  serviceTypeCode: 'handset-pairing',
  priceMinor: 4500,
  currency: 'EUR',
  durationMinutes: 30,
  deposit: { kind: 'percent', percent: 20 },
  cancellation: { freeUntilHours: 24, feeMinor: 1000 },
};
const HOURS = {
  timeZone: 'Europe/Vienna',
  weekly: { monday: [{ start: '08:00', end: '12:00' }, { start: '12:00', end: '17:00' }] },
  minimumNoticeMinutes: 60,
  bookingHorizonDays: 30,
  bufferMinutes: 15,
};

async function count(table: 'offer' | 'part' | 'working_hours' | 'travel_policy', orgId: string): Promise<number> {
  const [row] = await t.dataSource.query(`SELECT COUNT(*) AS n FROM ${table} WHERE organisation_id = ?`, [orgId]);
  return Number(row.n);
}

const post = (team: Team, path: string, body: object, who = team.admin) => request(t.app).post(`/api/orgs/${team.orgId}${path}`).set(bearer(who)).send(body);

beforeAll(async () => {
  t = await createTestApp();
  A = await partnerWithTeam(t.app, t.dataSource, { technician: true });
  B = await partnerWithTeam(t.app, t.dataSource, { technician: true });
  for (const team of [A, B]) await request(t.app).put(`/api/orgs/${team.orgId}/application/capabilities`).set(bearer(team.admin)).send(CAPABILITIES).expect(200);
  bPartId = (await post(B, '/parts', { ...PART, name: 'Secret part of B' }).expect(201)).body.data.id;
}, 60_000);
afterAll(() => t.close());

describe('offers', () => {
  it('creates, lists, reads, changes and withdraws an offer with its technicians and parts kit', async () => {
    const part = (await post(A, '/parts', PART).expect(201)).body.data;
    expect(part).toMatchObject({ ...PART, organisationId: A.orgId });
    const created = await post(A, '/offers', { ...OFFER, technicianUserIds: [A.technician!.userId], partsKit: [{ partId: part.id, quantity: 2 }] }).expect(201);
    const offer = created.body.data;
    expect(offer).toMatchObject({
      organisationId: A.orgId,
      serviceTypeCode: 'handset-pairing',
      priceMinor: 4500,
      currency: 'EUR',
      durationMinutes: 30,
      technicianUserIds: [A.technician!.userId],
      partsKit: [{ partId: part.id, quantity: 2, name: PART.name, unitPriceMinor: 1500 }],
      partsTotalMinor: 3000,
      deposit: { kind: 'percent', percent: 20 },
    });
    const [row] = await t.dataSource.query('SELECT price_minor FROM offer WHERE id = ?', [offer.id]);
    expect(String(row.price_minor)).toBe('4500');

    // the team reads; only partner admins write
    const list = await request(t.app).get(`/api/orgs/${A.orgId}/offers`).set(bearer(A.technician!)).expect(200);
    expect(list.body.data.map((o: { id: string }) => o.id)).toEqual([offer.id]);
    await post(A, '/offers', { ...OFFER, serviceTypeCode: 'heater-fault-diagnosis' }, A.technician!).expect(403);

    // one offer per service type
    expect((await post(A, '/offers', OFFER).expect(409)).body.code).toBe('OFFER_EXISTS');

    const patched = await request(t.app).patch(`/api/orgs/${A.orgId}/offers/${offer.id}`).set(bearer(A.admin)).send({ priceMinor: 5000, technicianUserIds: [], deposit: { kind: 'none' } }).expect(200);
    expect(patched.body.data).toMatchObject({ priceMinor: 5000, technicianUserIds: [], deposit: { kind: 'none' }, partsTotalMinor: 3000 });

    // a part in a kit stays until it leaves the kit
    expect((await request(t.app).delete(`/api/orgs/${A.orgId}/parts/${part.id}`).set(bearer(A.admin)).expect(409)).body.code).toBe('PART_IN_USE');
    await request(t.app).delete(`/api/orgs/${A.orgId}/offers/${offer.id}`).set(bearer(A.admin)).expect(200);
    await request(t.app).get(`/api/orgs/${A.orgId}/offers/${offer.id}`).set(bearer(A.admin)).expect(404);
    await request(t.app).delete(`/api/orgs/${A.orgId}/parts/${part.id}`).set(bearer(A.admin)).expect(200);
    expect(await count('offer', A.orgId)).toBe(0);
    expect(await count('part', A.orgId)).toBe(0);
  });

  it('offers a service type only when the organisation holds every capability it requires', async () => {
    // the sample equipment has no flashing, coding or interface tools
    const res = await post(A, '/offers', { ...OFFER, serviceTypeCode: 'parking-conversion-auto' }).expect(400);
    expect(paths(res)).toEqual(['serviceTypeCode']);
    const message = res.body.errors[0].message as string;
    for (const code of ['uds-flash-programming', 'control-unit-coding', 'sealed-connector-crimping']) expect(message).toContain(code);
    for (const held of ['vci-pass-thru', 'battery-support-unit', 'digital-multimeter']) expect(message).not.toContain(held);
    expect(paths(await post(A, '/offers', { ...OFFER, serviceTypeCode: 'no-such-service' }).expect(400))).toEqual(['serviceTypeCode']);
    expect(await count('offer', A.orgId)).toBe(0);
  });

  it('answers another organisation\'s part or technician with a field error that says nothing of it', async () => {
    const res = await post(A, '/offers', { ...OFFER, technicianUserIds: [B.technician!.userId], partsKit: [{ partId: bPartId, quantity: 1 }] }).expect(400);
    expect(paths(res)).toEqual(['partsKit.0.partId', 'technicianUserIds.0']);
    const text = JSON.stringify(res.body);
    for (const secret of ['Secret part of B', B.technician!.email, B.orgId]) expect(text).not.toContain(secret);
    expect(await count('offer', A.orgId)).toBe(0);
    // and B's part is not reachable under A's id
    await request(t.app).patch(`/api/orgs/${A.orgId}/parts/${bPartId}`).set(bearer(A.admin)).send({ stock: 1 }).expect(404);
    const [row] = await t.dataSource.query('SELECT stock FROM part WHERE id = ?', [bPartId]);
    expect(Number(row.stock)).toBe(PART.stock);
  });

  it('refuses bad input with field errors on the right paths and saves nothing', async () => {
    const res = await post(A, '/offers', {
      ...OFFER,
      priceMinor: -1,
      durationMinutes: 17,
      currency: 'USD',
      deposit: { kind: 'percent', percent: 0 },
      cancellation: { freeUntilHours: 400, feeMinor: 1.5 },
      partsKit: [{ partId: bPartId, quantity: 100 }],
    }).expect(400);
    expect(paths(res)).toEqual(['cancellation.feeMinor', 'cancellation.freeUntilHours', 'currency', 'deposit.percent', 'durationMinutes', 'partsKit.0.quantity', 'priceMinor']);
    expect(paths(await post(A, '/offers', { ...OFFER, priceMinor: 10_000_001 }).expect(400))).toEqual(['priceMinor']);
    // a fixed deposit above the price
    expect(paths(await post(A, '/offers', { ...OFFER, deposit: { kind: 'fixed', amountMinor: 5000 } }).expect(400))).toEqual(['deposit.amountMinor']);
    expect(paths(await post(A, '/parts', { ...PART, stock: -1, unitPriceMinor: 12.5 }).expect(400))).toEqual(['stock', 'unitPriceMinor']);
    expect(await count('offer', A.orgId)).toBe(0);
    expect(await count('part', A.orgId)).toBe(0);
  });

  it('leaves an offer as it was when a change is refused', async () => {
    const part = (await post(A, '/parts', { ...PART, name: 'Kit part' }).expect(201)).body.data;
    const offer = (await post(A, '/offers', { ...OFFER, technicianUserIds: [A.technician!.userId], partsKit: [{ partId: part.id, quantity: 1 }] }).expect(201)).body.data;
    const res = await request(t.app)
      .patch(`/api/orgs/${A.orgId}/offers/${offer.id}`)
      .set(bearer(A.admin))
      .send({ priceMinor: 9999, technicianUserIds: [], partsKit: [{ partId: bPartId, quantity: 1 }] })
      .expect(400);
    expect(paths(res)).toEqual(['partsKit.0.partId']);
    const now = (await request(t.app).get(`/api/orgs/${A.orgId}/offers/${offer.id}`).set(bearer(A.admin)).expect(200)).body.data;
    expect(now).toMatchObject({ priceMinor: OFFER.priceMinor, technicianUserIds: [A.technician!.userId], partsKit: [{ partId: part.id, quantity: 1 }] });
    // a part in a EUR kit keeps its currency
    expect(paths(await request(t.app).patch(`/api/orgs/${A.orgId}/parts/${part.id}`).set(bearer(A.admin)).send({ currency: 'SEK' }).expect(400))).toEqual(['currency']);
  });
});

describe('a price of 0', () => {
  it('is refused unless the partner says the service is free, and free means 0', async () => {
    const zero = await post(B, '/offers', { ...OFFER, priceMinor: 0 }).expect(400);
    expect(zero.body.errors).toEqual([expect.objectContaining({ path: 'priceMinor', message: 'Enter a price above 0, or tick that the service is free' })]);
    expect(paths(await post(B, '/offers', { ...OFFER, free: true }).expect(400))).toEqual(['free']);
    expect(await count('offer', B.orgId)).toBe(0);
    const offer = (await post(B, '/offers', { ...OFFER, priceMinor: 0, free: true }).expect(201)).body.data;
    expect(offer.priceMinor).toBe(0);
    const patch = (body: object) => request(t.app).patch(`/api/orgs/${B.orgId}/offers/${offer.id}`).set(bearer(B.admin)).send(body);
    // a change that leaves the price alone need not say it again
    await patch({ durationMinutes: 60 }).expect(200);
    await patch({ priceMinor: 2500 }).expect(200);
    expect(paths(await patch({ priceMinor: 0 }).expect(400))).toEqual(['priceMinor']);
    expect(paths(await patch({ free: true }).expect(400))).toEqual(['free']);
    expect((await patch({ priceMinor: 0, free: true }).expect(200)).body.data.priceMinor).toBe(0);
    await request(t.app).delete(`/api/orgs/${B.orgId}/offers/${offer.id}`).set(bearer(B.admin)).expect(200);
  });
});

describe('booking settings', () => {
  it('turns automatic confirmation on and off for partner admins, audited; bad values are field errors', async () => {
    const path = `/api/orgs/${A.orgId}/booking-settings`;
    expect((await request(t.app).get(path).set(bearer(A.technician!)).expect(200)).body.data).toEqual({ organisationId: A.orgId, autoConfirmBookings: false });
    const on = await request(t.app).put(path).set(bearer(A.admin)).send({ autoConfirmBookings: true }).expect(200);
    expect(on.body.data).toEqual({ organisationId: A.orgId, autoConfirmBookings: true });
    const [row] = await t.dataSource.query('SELECT auto_confirm_bookings FROM organisation WHERE id = ?', [A.orgId]);
    expect(Number(row.auto_confirm_bookings)).toBe(1);
    expect(paths(await request(t.app).put(path).set(bearer(A.admin)).send({ autoConfirmBookings: 'yes' }).expect(400))).toEqual(['autoConfirmBookings']);
    await request(t.app).put(path).set(bearer(A.technician!)).send({ autoConfirmBookings: false }).expect(403);
    await request(t.app).put(path).set(bearer(A.admin)).send({ autoConfirmBookings: false }).expect(200);
    expect((await request(t.app).get(path).set(bearer(A.admin)).expect(200)).body.data.autoConfirmBookings).toBe(false);
    const audit: { before: unknown; after: unknown }[] = await t.dataSource.query("SELECT before_state AS `before`, after_state AS `after` FROM audit_log WHERE organisation_id = ? AND action = 'booking-settings.save' ORDER BY id", [A.orgId]);
    expect(audit).toHaveLength(2);
  });
});

describe('travel policy', () => {
  it('is unset at first, then saved; bad values are field errors', async () => {
    const first = await request(t.app).get(`/api/orgs/${A.orgId}/travel-policy`).set(bearer(A.technician!)).expect(200);
    expect(first.body.data).toMatchObject({ organisationId: A.orgId, configured: false, freeWithinKm: null });
    const bad = await request(t.app).put(`/api/orgs/${A.orgId}/travel-policy`).set(bearer(A.admin)).send({ freeWithinKm: 30, ratePerKmMinor: -5, currency: 'EUR', maxDistanceKm: 150 }).expect(400);
    expect(paths(bad)).toEqual(['ratePerKmMinor']);
    const short = await request(t.app).put(`/api/orgs/${A.orgId}/travel-policy`).set(bearer(A.admin)).send({ freeWithinKm: 30, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 20 }).expect(400);
    expect(paths(short)).toEqual(['maxDistanceKm']);
    expect(await count('travel_policy', A.orgId)).toBe(0);
    await request(t.app).put(`/api/orgs/${A.orgId}/travel-policy`).set(bearer(A.technician!)).send({ freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 }).expect(403);
    const saved = await request(t.app).put(`/api/orgs/${A.orgId}/travel-policy`).set(bearer(A.admin)).send({ freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 }).expect(200);
    expect(saved.body.data).toEqual({ organisationId: A.orgId, configured: true, freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 });
  });
});

describe('working hours', () => {
  const hoursUrl = (team: Team, userId: string) => `/api/orgs/${team.orgId}/technicians/${userId}/hours`;

  it('refuses an unknown zone and overlapping intervals with field errors, saving nothing', async () => {
    const url = hoursUrl(A, A.technician!.userId);
    const zone = await request(t.app).put(url).set(bearer(A.admin)).send({ ...HOURS, timeZone: 'Europe/Atlantis' }).expect(400);
    expect(paths(zone)).toEqual(['timeZone']);
    const overlap = await request(t.app)
      .put(url)
      .set(bearer(A.admin))
      .send({ ...HOURS, weekly: { tuesday: [{ start: '08:00', end: '12:00' }, { start: '11:30', end: '17:00' }] } })
      .expect(400);
    expect(paths(overlap)).toEqual(['weekly.tuesday.1.start']);
    expect(await count('working_hours', A.orgId)).toBe(0);
    expect((await request(t.app).get(url).set(bearer(A.admin)).expect(200)).body.data).toEqual({ organisationId: A.orgId, userId: A.technician!.userId, hours: null });
  });

  it('saves a member\'s hours and refuses someone who is not a member', async () => {
    const url = hoursUrl(A, A.technician!.userId);
    const saved = await request(t.app).put(url).set(bearer(A.admin)).send(HOURS).expect(200);
    expect(saved.body.data.hours).toMatchObject({ timeZone: 'Europe/Vienna', weekly: { monday: HOURS.weekly.monday, sunday: [] }, exceptions: [] });
    expect((await request(t.app).get(url).set(bearer(A.technician!)).expect(200)).body.data.hours.weekly.monday).toEqual(HOURS.weekly.monday);
    await request(t.app).put(hoursUrl(A, B.technician!.userId)).set(bearer(A.admin)).send(HOURS).expect(404);
    await request(t.app).get(hoursUrl(A, B.technician!.userId)).set(bearer(A.admin)).expect(404);
    expect(await count('working_hours', B.orgId)).toBe(0);
  });

  it('lets a technician add and remove their own days off and time away, and nothing else', async () => {
    const own = hoursUrl(A, A.technician!.userId);
    await request(t.app).put(own).set(bearer(A.admin)).send(HOURS).expect(200);
    const holiday = { kind: 'days-off', from: '2026-12-24', to: '2026-12-26', note: 'Family' };
    const added = await request(t.app).put(own).set(bearer(A.technician!)).send({ ...HOURS, exceptions: [holiday] }).expect(200);
    expect(added.body.data.hours.exceptions).toEqual([holiday]);
    const [entry] = await t.dataSource.query("SELECT actor_user_id FROM audit_log WHERE action = 'working-hours.save' AND entity_id = ? ORDER BY id DESC LIMIT 1", [A.technician!.userId]);
    expect(entry.actor_user_id).toBe(A.technician!.userId);

    // the weekly pattern stays the partner admin's
    const weekly = await request(t.app).put(own).set(bearer(A.technician!)).send({ ...HOURS, exceptions: [holiday], weekly: { ...HOURS.weekly, saturday: [{ start: '08:00', end: '12:00' }] } }).expect(403);
    expect(weekly.body.code).toBe('HOURS_ADMIN_ONLY');
    expect(weekly.body.detail).toContain('your own days off');
    // and so are a colleague's hours
    const colleague = await request(t.app).put(hoursUrl(A, A.admin.userId)).set(bearer(A.technician!)).send(HOURS).expect(403);
    expect(colleague.body.code).toBe('HOURS_ADMIN_ONLY');
    expect((await request(t.app).get(own).set(bearer(A.admin)).expect(200)).body.data.hours.exceptions).toEqual([holiday]);

    await request(t.app).put(own).set(bearer(A.technician!)).send({ ...HOURS, exceptions: [] }).expect(200);
    expect((await request(t.app).get(own).set(bearer(A.admin)).expect(200)).body.data.hours.exceptions).toEqual([]);
  });
});

describe('service area', () => {
  it('belongs to the application until approval, then moves here; bad values are field errors and nothing is saved', async () => {
    // before approval: 409 naming the application
    const draft = await request(t.app).put(`/api/orgs/${A.orgId}/service-area`).set(bearer(A.admin)).send(AREA).expect(409);
    expect(draft.body.code).toBe('AREA_IN_APPLICATION');

    const P = await approvedPartner(t.app, t.dataSource, { technician: true });
    const url = `/api/orgs/${P.orgId}/service-area`;
    const before = (await request(t.app).get(url).set(bearer(P.technician!)).expect(200)).body.data;
    expect(before.area).toMatchObject({ baseLat: expect.any(Number), mode: expect.any(String) });

    const far = await request(t.app).put(url).set(bearer(P.admin)).send({ ...AREA, mode: 'mobile', radiusKm: 600 }).expect(400);
    expect(paths(far)).toEqual(['radiusKm']);
    const off = await request(t.app).put(url).set(bearer(P.admin)).send({ ...AREA, baseLat: 95 }).expect(400);
    expect(paths(off)).toEqual(['baseLat']);
    await request(t.app).put(url).set(bearer(P.technician!)).send(AREA).expect(403);
    expect((await request(t.app).get(url).set(bearer(P.admin)).expect(200)).body.data).toEqual(before);

    const moved = { baseLabel: 'Munich', baseLat: 48.1351, baseLng: 11.582, mode: 'mobile', radiusKm: 45, workshopAddress: 'ignored for mobile work' };
    const saved = await request(t.app).put(url).set(bearer(P.admin)).send(moved).expect(200);
    expect(saved.body.data.area).toEqual({ ...moved, workshopAddress: null });
    const [entry] = await t.dataSource.query("SELECT before_state, after_state FROM audit_log WHERE organisation_id = ? AND action = 'service-area.save'", [P.orgId]);
    expect(entry).toBeDefined();
  });
});

describe('audit', () => {
  it('records every change to offers, parts, travel policy and hours with the state before and after', async () => {
    const part = (await post(B, '/parts', { ...PART, name: 'Audited part' }).expect(201)).body.data;
    await request(t.app).patch(`/api/orgs/${B.orgId}/parts/${part.id}`).set(bearer(B.admin)).send({ stock: 1 }).expect(200);
    await request(t.app).delete(`/api/orgs/${B.orgId}/parts/${part.id}`).set(bearer(B.admin)).expect(200);
    const offer = (await post(B, '/offers', OFFER).expect(201)).body.data;
    await request(t.app).patch(`/api/orgs/${B.orgId}/offers/${offer.id}`).set(bearer(B.admin)).send({ priceMinor: 13_000 }).expect(200);
    await request(t.app).delete(`/api/orgs/${B.orgId}/offers/${offer.id}`).set(bearer(B.admin)).expect(200);
    const rows: { action: string; entity_id: string; before_state: unknown; after_state: unknown }[] = await t.dataSource.query(
      "SELECT action, entity_id, before_state, after_state FROM audit_log WHERE organisation_id = ? AND entity_id IN (?, ?) ORDER BY id",
      [B.orgId, part.id, offer.id],
    );
    expect(rows.map((r) => r.action)).toEqual(['part.create', 'part.update', 'part.delete', 'offer.create', 'offer.update', 'offer.delete']);
    const state = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v) as Record<string, unknown> | null;
    const update = rows.find((r) => r.action === 'offer.update')!;
    expect(state(update.before_state)).toMatchObject({ priceMinor: 4500 });
    expect(state(update.after_state)).toMatchObject({ priceMinor: 13_000 });
    expect(state(rows.find((r) => r.action === 'part.delete')!.after_state)).toBeNull();
    const hours = await t.dataSource.query("SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ? AND action = 'working-hours.save'", [A.orgId]);
    const travel = await t.dataSource.query("SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ? AND action = 'travel-policy.save'", [A.orgId]);
    expect(Number(hours[0].n)).toBeGreaterThan(0);
    expect(Number(travel[0].n)).toBeGreaterThan(0);
  });
});
