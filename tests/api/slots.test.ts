// Public bookable slots of a partner: approved partners only, the customer's place inside the
// service area, starts on the 15-minute grid inside the technicians' working hours.
import { DateTime } from 'luxon';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam } from '../setup/accounts';
import { approvedPartner, bearer, CAPABILITIES } from '../setup/onboarding';

let t: TestApp;
type Partner = Awaited<ReturnType<typeof approvedPartner>>;
let P: Partner;

/** Near the test area's base (Innsbruck, 80 km). */
const INSIDE = { lat: 47.26, lng: 11.39 };
/** Linz: about 190 km away. */
const OUTSIDE = { lat: 48.3069, lng: 14.2858 };
const DAY = [{ start: '08:00', end: '17:00' }];
const EVERY_DAY = { monday: DAY, tuesday: DAY, wednesday: DAY, thursday: DAY, friday: DAY, saturday: DAY, sunday: DAY };
const OFFER = { serviceTypeCode: 'handset-pairing', priceMinor: 4500, currency: 'EUR', durationMinutes: 30, deposit: { kind: 'none' }, cancellation: { freeUntilHours: 24, feeMinor: 0 } };

const slots = (partnerId: string, query: Record<string, string | number>) => request(t.app).get(`/api/partners/${partnerId}/slots`).query(query);
const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();

async function offerWithHours(team: { orgId: string; admin: { accessToken: string }; technician?: { userId: string } }) {
  const tech = team.technician!.userId;
  await request(t.app).post(`/api/orgs/${team.orgId}/offers`).set(bearer(team.admin)).send({ ...OFFER, technicianUserIds: [tech] }).expect(201);
  await request(t.app)
    .put(`/api/orgs/${team.orgId}/technicians/${tech}/hours`)
    .set(bearer(team.admin))
    .send({ timeZone: 'Europe/Vienna', weekly: EVERY_DAY, minimumNoticeMinutes: 60, bookingHorizonDays: 60, bufferMinutes: 0 })
    .expect(200);
}

/** Every slot starts on the local quarter hour, inside 08:00–17:00 with room for the job, after now + notice. */
function expectInsideHours(list: { start: string; end: string; localStart: string }[], durationMinutes: number, zone: string, noticeMinutes: number, days: number[]) {
  const earliest = Date.now() + noticeMinutes * 60_000 - 5_000;
  for (const s of list) {
    const local = DateTime.fromISO(s.start, { zone });
    expect(local.minute % 15, s.localStart).toBe(0);
    expect(local.second).toBe(0);
    const minutes = local.hour * 60 + local.minute;
    expect(minutes, s.localStart).toBeGreaterThanOrEqual(8 * 60);
    expect(minutes + durationMinutes, s.localStart).toBeLessThanOrEqual(17 * 60);
    expect(days, s.localStart).toContain(local.weekday);
    expect(Date.parse(s.end) - Date.parse(s.start)).toBe(durationMinutes * 60_000);
    expect(Date.parse(s.start)).toBeGreaterThanOrEqual(earliest);
    expect(s.localStart.startsWith(local.toFormat("yyyy-MM-dd'T'HH:mm"))).toBe(true);
  }
}

beforeAll(async () => {
  t = await createTestApp();
  P = await approvedPartner(t.app, t.dataSource, { technician: true });
  await offerWithHours(P);
}, 60_000);
afterAll(() => t.close());

describe('partner slots', () => {
  it('lists starts inside the technician\'s hours on the 15-minute grid for a place in the area', async () => {
    const res = await slots(P.orgId, { serviceType: 'handset-pairing', ...INSIDE, days: 3 }).expect(200);
    const data = res.body.data;
    expect(data).toMatchObject({ partnerId: P.orgId, serviceTypeCode: 'handset-pairing', durationMinutes: 30, timeZone: 'Europe/Vienna' });
    expect(data.organisation.length).toBeGreaterThan(0);
    expect(data.organisation.length).toBeLessThanOrEqual(50);
    expectInsideHours(data.organisation, 30, 'Europe/Vienna', 60, [1, 2, 3, 4, 5, 6, 7]);
    for (const s of data.organisation) expect(s.technicianIds).toEqual([P.technician!.userId]);
    expect(data.technicians).toHaveLength(1);
    expect(data.technicians[0].technicianId).toBe(P.technician!.userId);
    expect(data.technicians[0].slots.length).toBeGreaterThan(0);
  });

  it('lists the seeded demo partner\'s weekday hours for its conversion offer', async () => {
    const [org] = await t.dataSource.query("SELECT id FROM organisation WHERE name = 'Glutwerk Mobil'");
    const res = await slots(org.id, { serviceType: 'parking-conversion-auto', lat: 47.2692, lng: 11.4041, days: 7 }).expect(200);
    expect(res.body.data.durationMinutes).toBe(90);
    expect(res.body.data.organisation.length).toBeGreaterThan(0);
    expectInsideHours(res.body.data.organisation, 90, 'Europe/Vienna', 120, [1, 2, 3, 4, 5]);
  });

  it('refuses a place outside the service area with field errors on lat and lng', async () => {
    const res = await slots(P.orgId, { serviceType: 'handset-pairing', ...OUTSIDE }).expect(400);
    expect(paths(res)).toEqual(['query.lat', 'query.lng']);
  });

  it('validates the query', async () => {
    expect(paths(await slots(P.orgId, { serviceType: 'handset-pairing', lat: 91, lng: 11.4, days: 29 }).expect(400))).toEqual(['query.days', 'query.lat']);
    expect(paths(await slots(P.orgId, { serviceType: 'handset-pairing', lat: 'north', lng: 11.4 }).expect(400))).toEqual(['query.lat']);
    expect(paths(await slots(P.orgId, { serviceType: 'heater-fault-diagnosis', ...INSIDE }).expect(400))).toEqual(['query.serviceType']);
  });

  it('answers 404 for a partner that is not approved: a draft, or one suspended later', async () => {
    const draft = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    await request(t.app).put(`/api/orgs/${draft.orgId}/application/capabilities`).set(bearer(draft.admin)).send(CAPABILITIES).expect(200);
    await offerWithHours(draft);
    expect((await slots(draft.orgId, { serviceType: 'handset-pairing', ...INSIDE }).expect(404)).body.code).toBe('NOT_FOUND');

    const later = await approvedPartner(t.app, t.dataSource, { technician: true });
    await offerWithHours(later);
    await slots(later.orgId, { serviceType: 'handset-pairing', ...INSIDE }).expect(200);
    await t.dataSource.query("UPDATE organisation SET status = 'suspended', status_reason = 'test' WHERE id = ?", [later.orgId]);
    await slots(later.orgId, { serviceType: 'handset-pairing', ...INSIDE }).expect(404);
    await slots('00000000-0000-4000-8000-000000000000', { serviceType: 'handset-pairing', ...INSIDE }).expect(404);
  });
});
