// Coverage: owners ask to hear when someone covers their place (stored as a cell, confirmed by
// e-mail), are told once when a partner who can do the service is approved or starts offering it
// there, and network admins see where searches went unanswered. The test partners work in
// Portugal, where no other test file puts anyone.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gapCell } from '@emberline/domain';
import { purgeCoverage } from '../../apps/api/src/services/coverage.service';
import { createTestApp, type TestApp } from '../setup/app';
import { uniqueEmail } from '../setup/accounts';
import { approvedPartner, bearer, networkAdmin } from '../setup/onboarding';

let t: TestApp;
const PORTO = { lat: 41.1579, lng: -8.6291 };
/** About 46 km north-east of Porto. */
const BRAGA = { lat: 41.5454, lng: -8.4265 };
const LISBON = { lat: 38.7223, lng: -9.1393 };
/** Ponta Delgada, Azores: nobody covers it. */
const AZORES = { lat: 37.7412, lng: -25.6756 };

const alert = (body: object, lang = 'en') => request(t.app).post('/api/coverage-alerts').set('accept-language', lang).send(body);
const mailsTo = (to: string, template: string): Promise<{ subject: string; text_body: string }[]> =>
  t.dataSource.query('SELECT subject, text_body FROM mail_outbox WHERE to_address = ? AND template = ? ORDER BY created_at', [to, template]);
const alertsOf = (email: string) => t.dataSource.query('SELECT * FROM coverage_alert WHERE email = ?', [email.toLowerCase()]);
const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();
const area = (at: { lat: number; lng: number }, mode: string, radiusKm: number | null) => ({
  baseLabel: 'Test base',
  baseLat: at.lat,
  baseLng: at.lng,
  mode,
  radiusKm,
  workshopAddress: mode === 'mobile' ? null : 'Rua da Oficina 1',
});

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('POST /api/coverage-alerts', () => {
  it('stores the cell of the place, never the place, and confirms by e-mail once', async () => {
    const email = uniqueEmail('owner');
    const res = await alert({ email, serviceType: 'handset-pairing', ...AZORES }).expect(202);
    expect(res.body).toEqual({ data: { accepted: true } });
    const [row] = await alertsOf(email);
    expect({ lat: row.cell_lat, lng: row.cell_lng }).toEqual(gapCell(AZORES));
    expect(row.cell_lat).not.toBe(AZORES.lat);
    expect(row).toMatchObject({ service_type_code: 'handset-pairing', notified_at: null, locale: 'en' });
    const [mail] = await mailsTo(email, 'coverage-alert-confirmed');
    expect(mail!.subject).toBe('We will tell you when someone covers your area');
    expect(mail!.text_body).toContain('Handset pairing and range check');

    // the same again: the same answer, nothing stored or sent twice
    expect((await alert({ email, serviceType: 'handset-pairing', ...AZORES }).expect(202)).body).toEqual(res.body);
    expect(await alertsOf(email)).toHaveLength(1);
    expect(await mailsTo(email, 'coverage-alert-confirmed')).toHaveLength(1);
  });

  it('writes the confirmation in the language the browser asks for', async () => {
    const email = uniqueEmail('owner');
    await alert({ email, serviceType: 'handset-pairing', ...AZORES }, 'de-AT,de;q=0.9').expect(202);
    expect((await mailsTo(email, 'coverage-alert-confirmed'))[0]!.subject).toBe('Wir sagen Ihnen Bescheid, sobald jemand Ihre Gegend abdeckt');
  });

  it('answers bad input with field errors and stores nothing', async () => {
    const email = uniqueEmail('owner');
    expect(paths(await alert({ email: 'not-an-address', serviceType: 'handset-pairing', ...AZORES }).expect(400))).toEqual(['email']);
    expect(paths(await alert({ email, serviceType: 'handset-pairing', lat: 91, lng: 'east' }).expect(400))).toEqual(['lat', 'lng']);
    expect(paths(await alert({ email, serviceType: 'no-such-service', ...AZORES }).expect(400))).toEqual(['serviceType']);
    expect(paths(await alert({}).expect(400))).toEqual(['email', 'lat', 'lng', 'serviceType']);
    expect(await alertsOf(email)).toHaveLength(0);
    expect(await mailsTo(email, 'coverage-alert-confirmed')).toHaveLength(0);
  });

  it('limits how often one address can ask', async () => {
    const limited = await createTestApp({}, { limits: { coverageAlert: { perIp: 10, perAccount: 2, windowMinutes: 60 } } });
    try {
      const email = uniqueEmail('owner');
      const send = () => request(limited.app).post('/api/coverage-alerts').send({ email, serviceType: 'handset-pairing', ...AZORES });
      await send().expect(202);
      await send().expect(202);
      expect((await send().expect(429)).body.code).toBe('TOO_MANY_REQUESTS');
    } finally {
      await limited.close();
    }
  });
});

describe('telling owners when someone covers their place', () => {
  it('tells each waiting owner in the new partner\'s area once, for what it can do, and erases the address', async () => {
    const [near, nearBy, farAway, otherService] = ['near', 'braga', 'lisbon', 'conversion'].map((p) => uniqueEmail(p)) as [string, string, string, string];
    await alert({ email: near, serviceType: 'handset-pairing', ...PORTO }).expect(202);
    await alert({ email: nearBy, serviceType: 'handset-pairing', ...BRAGA }).expect(202);
    await alert({ email: farAway, serviceType: 'handset-pairing', ...LISBON }).expect(202);
    // the test partner holds no flashing kit, so it cannot convert
    await alert({ email: otherService, serviceType: 'parking-conversion-auto', ...PORTO }).expect(202);
    const [nearAlert] = await alertsOf(near);

    const p = await approvedPartner(t.app, t.dataSource, { area: area(PORTO, 'mobile', 80) });
    const [mail] = await mailsTo(near, 'coverage-alert-match');
    expect(mail!.subject).toContain('in your area');
    const cell = gapCell(PORTO);
    expect(mail!.text_body).toContain(`http://emberline.test/search?service=handset-pairing&lat=${cell.lat}&lng=${cell.lng}`);
    expect(mail!.text_body).toContain('Glimmspur Heiztechnik');
    expect(await mailsTo(nearBy, 'coverage-alert-match')).toHaveLength(1);
    expect(await mailsTo(farAway, 'coverage-alert-match')).toHaveLength(0);
    expect(await mailsTo(otherService, 'coverage-alert-match')).toHaveLength(0);

    // told: the address is gone, the row stays for the counts
    const [told] = await t.dataSource.query('SELECT email, notified_at FROM coverage_alert WHERE id = ?', [nearAlert.id]);
    expect(told.email).toBeNull();
    expect(told.notified_at).not.toBeNull();
    expect(await alertsOf(farAway)).toHaveLength(1);
    expect(await alertsOf(otherService)).toHaveLength(1);

    // a second partner there, and the first one offering the service: nobody is told twice
    await approvedPartner(t.app, t.dataSource, { area: area(PORTO, 'mobile', 80) });
    await request(t.app)
      .post(`/api/orgs/${p.orgId}/offers`)
      .set(bearer(p.admin))
      .send({ serviceTypeCode: 'handset-pairing', priceMinor: 4500, currency: 'EUR', durationMinutes: 30, deposit: { kind: 'none' }, cancellation: { freeUntilHours: 24, feeMinor: 0 } })
      .expect(201);
    expect(await mailsTo(near, 'coverage-alert-match')).toHaveLength(1);
    expect(await mailsTo(nearBy, 'coverage-alert-match')).toHaveLength(1);
  });

  it('tells owners within the search radius of a workshop when it starts offering their service', async () => {
    const w = await approvedPartner(t.app, t.dataSource, { area: area(LISBON, 'workshop', null) });
    const [waiting, otherService] = ['pairing', 'diagnosis'].map((p) => uniqueEmail(p)) as [string, string];
    // asked after the approval: the new offer is what answers them
    await alert({ email: waiting, serviceType: 'handset-pairing', lat: 38.80, lng: -9.38 }).expect(202);
    await alert({ email: otherService, serviceType: 'control-unit-configuration', ...LISBON }).expect(202);
    expect(await mailsTo(waiting, 'coverage-alert-match')).toHaveLength(0);
    await request(t.app)
      .post(`/api/orgs/${w.orgId}/offers`)
      .set(bearer(w.admin))
      .send({ serviceTypeCode: 'handset-pairing', priceMinor: 4000, currency: 'EUR', durationMinutes: 30, deposit: { kind: 'none' }, cancellation: { freeUntilHours: 24, feeMinor: 0 } })
      .expect(201);
    expect(await mailsTo(waiting, 'coverage-alert-match')).toHaveLength(1);
    expect(await mailsTo(otherService, 'coverage-alert-match')).toHaveLength(0);
    expect(await alertsOf(waiting)).toHaveLength(0);
    expect(await alertsOf(otherService)).toHaveLength(1);
  });
});

describe('GET /api/admin/coverage-gaps', () => {
  it('counts unanswered searches per cell and service, newest first, with the owners waiting there', async () => {
    const admin = await networkAdmin(t.app);
    const gaps = (query: object = {}) => request(t.app).get('/api/admin/coverage-gaps').query(query).set(bearer(admin));

    // the demo's searches around Linz
    const linz = gapCell({ lat: 48.3069, lng: 14.2858 });
    const demo = (await gaps().expect(200)).body;
    expect(demo.data.find((c: { lat: number; lng: number; serviceTypeCode: string }) => c.lat === linz.lat && c.lng === linz.lng && c.serviceTypeCode === 'parking-conversion-manual')).toMatchObject({ searches: 2 });

    const place = { lat: 37.75, lng: -25.6 };
    const cell = gapCell(place);
    for (let i = 0; i < 2; i++) expect((await request(t.app).get('/api/search').query({ serviceType: 'seasonal-heater-service', ...place }).expect(200)).body.meta.gapRecorded).toBe(true);
    await alert({ email: uniqueEmail('azores'), serviceType: 'seasonal-heater-service', ...place }).expect(202);
    const res = await gaps({ days: 30, serviceType: 'seasonal-heater-service' }).expect(200);
    expect(res.body.data[0]).toMatchObject({ lat: cell.lat, lng: cell.lng, serviceTypeCode: 'seasonal-heater-service', searches: 2, alerts: 1 });
    expect(res.body.data.every((c: { serviceTypeCode: string }) => c.serviceTypeCode === 'seasonal-heater-service')).toBe(true);
    const times = res.body.data.map((c: { lastSearchedAt: string }) => Date.parse(c.lastSearchedAt));
    expect(times).toEqual([...times].sort((a: number, b: number) => b - a));
    expect(res.body.meta).toMatchObject({ days: 30 });
    expect(res.body.meta.totalSearches).toBe(res.body.data.reduce((s: number, c: { searches: number }) => s + c.searches, 0));

    // the demo searches are days old: a one-day window leaves them out
    const today = (await gaps({ days: 1 }).expect(200)).body.data;
    expect(today.some((c: { lat: number; lng: number }) => c.lat === linz.lat && c.lng === linz.lng)).toBe(false);
  });

  it('is for network admins only, and checks its query', async () => {
    await request(t.app).get('/api/admin/coverage-gaps').expect(401);
    const partner = await approvedPartner(t.app, t.dataSource, { area: area(LISBON, 'workshop', null) });
    await request(t.app).get('/api/admin/coverage-gaps').set(bearer(partner.admin)).expect(403);
    const res = await request(t.app).get('/api/admin/coverage-gaps').query({ days: 0, serviceType: 'Bad Code' }).set(bearer(partner.networkAdmin)).expect(400);
    expect(paths(res)).toEqual(['query.days', 'query.serviceType']);
  });
});

describe('retention', () => {
  it('deletes gap searches and alerts older than a year, and keeps the recent ones', async () => {
    const old = new Date(Date.now() - 400 * 86_400_000);
    const recent = new Date(Date.now() - 10 * 86_400_000);
    const cell = gapCell({ lat: 64.1, lng: -21.9 });
    for (const at of [old, recent]) {
      await t.dataSource.query("INSERT INTO coverage_gap_search (cell_lat, cell_lng, service_type_code, vehicle_class, created_at) VALUES (?, ?, 'handset-pairing', 'none/12v', ?)", [cell.lat, cell.lng, at]);
      await t.dataSource.query("INSERT INTO coverage_alert (id, email, service_type_code, cell_lat, cell_lng, created_at) VALUES (UUID(), ?, 'handset-pairing', ?, ?, ?)", [uniqueEmail('old'), cell.lat, cell.lng, at]);
    }
    const deleted = await purgeCoverage(t.dataSource.manager, new Date());
    expect(deleted.gaps).toBeGreaterThanOrEqual(1);
    expect(deleted.alerts).toBeGreaterThanOrEqual(1);
    const left = await t.dataSource.query('SELECT created_at FROM coverage_gap_search WHERE cell_lat = ? AND cell_lng = ?', [cell.lat, cell.lng]);
    expect(left).toHaveLength(1);
    expect(new Date(left[0].created_at).getTime()).toBe(recent.getTime());
    expect(await t.dataSource.query('SELECT id FROM coverage_alert WHERE cell_lat = ? AND cell_lng = ?', [cell.lat, cell.lng])).toHaveLength(1);
  });
});
