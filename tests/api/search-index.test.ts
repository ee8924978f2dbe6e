// The search index follows the database, whoever writes it: two apps on the same database are two
// API instances, each with its own index. A change made through app A's API, or by SQL behind both
// apps' backs, shows in the very next search on app B. Each test has a partner of its own, based
// in Oulu, where no other test file puts anyone.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SEARCH_LIMIT } from '@emberline/domain';
import { searchIndexFor } from '../../apps/api/src/services/search-index';
import { createTestApp, type TestApp } from '../setup/app';
import { countQueries } from '../setup/queries';
import { approvedPartner, bearer } from '../setup/onboarding';

/** A makes the changes; B only searches. */
let a: TestApp;
let b: TestApp;

const OULU = { lat: 65.0121, lng: 25.4651 };
/** The owner's place, about 21 km north of the base: inside the 60 km radius, with a travel fee. */
const PLACE = { lat: 65.2, lng: 25.4 };
const DAY = [{ start: '08:00', end: '17:00' }];
const EVERY_DAY = { monday: DAY, tuesday: DAY, wednesday: DAY, thursday: DAY, friday: DAY, saturday: DAY, sunday: DAY };
const HOURS = { timeZone: 'Europe/Helsinki', weekly: EVERY_DAY, minimumNoticeMinutes: 60, bookingHorizonDays: 60, bufferMinutes: 0 };
const POLICY = { freeWithinKm: 10, ratePerKmMinor: 90, currency: 'EUR', maxDistanceKm: 100 };

type Result = { partnerId: string; labourMinor: number; partsMinor: number; travelFeeMinor: number; totalMinor: number; nextSlot: { start: string } | null };

/** An approved mobile partner with one technician on a handset-pairing offer (45.00 EUR, two 15.00 EUR parts), hours every day and a travel policy, set up through app A. */
async function searchablePartner(base = { ...OULU, label: 'Oulu' }) {
  const p = await approvedPartner(a.app, a.dataSource, { technician: true, area: { baseLabel: base.label, baseLat: base.lat, baseLng: base.lng, mode: 'mobile', radiusKm: 60, workshopAddress: null } });
  const technicianId = p.technician!.userId;
  const org = `/api/orgs/${p.orgId}`;
  const post = (path: string, body: object) => request(a.app).post(`${org}${path}`).set(bearer(p.admin)).send(body).expect(201);
  const partId: string = (await post('/parts', { name: 'Handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: 5 })).body.data.id;
  const offerId: string = (
    await post('/offers', {
      serviceTypeCode: 'handset-pairing',
      priceMinor: 4500,
      currency: 'EUR',
      durationMinutes: 30,
      deposit: { kind: 'none' },
      cancellation: { freeUntilHours: 24, feeMinor: 0 },
      technicianUserIds: [technicianId],
      partsKit: [{ partId, quantity: 2 }],
    })
  ).body.data.id;
  const put = (path: string, body: object) => request(a.app).put(`${org}${path}`).set(bearer(p.admin)).send(body).expect(200);
  await put(`/technicians/${technicianId}/hours`, HOURS);
  await put('/travel-policy', POLICY);
  return { ...p, org, technicianId, partId, offerId, put };
}
type Partner = Awaited<ReturnType<typeof searchablePartner>>;

const search = (t: TestApp) => request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', ...PLACE, mode: 'mobile', limit: SEARCH_LIMIT.max }).expect(200);

/** The partner's result in a search at PLACE on `t`, if it is listed. */
async function resultOn(t: TestApp, p: Partner): Promise<Result | undefined> {
  return ((await search(t)).body.data as Result[]).find((r) => r.partnerId === p.orgId);
}

/** A's partner as B finds it before the change: listed, priced and with a slot. */
async function seenOnB(p: Partner): Promise<Result> {
  const r = await resultOn(b, p);
  expect(r, 'the partner on B before the change').toBeDefined();
  expect(r!.nextSlot).not.toBeNull();
  return r!;
}

const indexStats = () => ({ ...searchIndexFor(b.dataSource.manager).stats });
const logRows = async (organisationId: string) => Number((await a.dataSource.query('SELECT COUNT(*) AS n FROM search_index_change WHERE organisation_id = ?', [organisationId]))[0].n);

beforeAll(async () => {
  a = await createTestApp();
  b = await createTestApp();
  // B's index is loaded whole once, before any test partner exists
  await request(b.app).get('/api/search').query({ serviceType: 'handset-pairing', ...PLACE }).expect(200);
  expect(indexStats().fullLoads).toBe(1);
}, 60_000);

afterAll(async () => {
  await a.close();
  await b.close();
});

describe('the search index of another instance', () => {
  it('shows an offer price changed through the API', async () => {
    const p = await searchablePartner();
    const before = await seenOnB(p);
    expect(before).toMatchObject({ labourMinor: 4500, partsMinor: 3000 });
    await request(a.app).patch(`${p.org}/offers/${p.offerId}`).set(bearer(p.admin)).send({ priceMinor: 5200 }).expect(200);
    expect(await resultOn(b, p)).toMatchObject({ labourMinor: 5200, partsMinor: 3000, totalMinor: before.totalMinor + 700 });
  });

  it('shows a part price changed by SQL, and logs nothing for a change of stock only', async () => {
    const p = await searchablePartner();
    const before = await seenOnB(p);
    expect(before.partsMinor).toBe(3000);

    // stock moves with every job: not a change for the index
    const rowsBefore = await logRows(p.orgId);
    await a.dataSource.query('UPDATE part SET stock = stock + 3 WHERE id = ?', [p.partId]);
    expect(await logRows(p.orgId)).toBe(rowsBefore);

    await a.dataSource.query('UPDATE part SET unit_price_minor = 1750 WHERE id = ?', [p.partId]);
    expect(await logRows(p.orgId)).toBe(rowsBefore + 1);
    // two parts of 17.50 EUR
    expect(await resultOn(b, p)).toMatchObject({ partsMinor: 3500, totalMinor: before.totalMinor + 500 });
  });

  it('shows working hours changed through the API in the next slot', async () => {
    const p = await searchablePartner();
    await seenOnB(p);
    // no working day left: listed, but with no slot
    await p.put(`/technicians/${p.technicianId}/hours`, { ...HOURS, weekly: {} });
    expect(await resultOn(b, p)).toMatchObject({ nextSlot: null });
    await p.put(`/technicians/${p.technicianId}/hours`, HOURS);
    expect((await resultOn(b, p))!.nextSlot).not.toBeNull();
  });

  it('drops a partner suspended by a network admin, and lists it again once reinstated', async () => {
    const p = await searchablePartner();
    await seenOnB(p);
    const decide = (body: object) => request(a.app).post(`/api/admin/applications/${p.orgId}/decision`).set(bearer(p.networkAdmin)).send(body).expect(200);
    await decide({ decision: 'suspend', message: 'Checking a complaint' });
    expect(await resultOn(b, p)).toBeUndefined();
    await decide({ decision: 'reinstate' });
    expect(await resultOn(b, p)).toMatchObject({ labourMinor: 4500, partsMinor: 3000 });
  });

  it('answers 0 results and a total of 0 when the only partner there was suspended since B last looked', async () => {
    // Rovaniemi is 165 km from Oulu, out of reach of the other tests' partners
    const p = await searchablePartner({ lat: 66.5039, lng: 25.7294, label: 'Rovaniemi' });
    const near = () => request(b.app).get('/api/search').query({ serviceType: 'handset-pairing', lat: 66.55, lng: 25.75, mode: 'mobile' }).expect(200);
    expect((await near()).body).toMatchObject({ data: [{ partnerId: p.orgId }], meta: { total: 1 } });
    await request(a.app).post(`/api/admin/applications/${p.orgId}/decision`).set(bearer(p.networkAdmin)).send({ decision: 'suspend', message: 'Checking a complaint' }).expect(200);
    // B's first attempt still counts the partner, finds its index behind, and searches again
    const res = await near();
    expect(res.body.data).toEqual([]);
    expect(res.body.meta.total).toBe(0);
  });

  it('drops a partner whose required capability is deleted by SQL', async () => {
    const p = await searchablePartner();
    await seenOnB(p);
    expect((await search(b)).body.meta.eligibility.requiredCapabilities).toEqual(['digital-multimeter']);
    const deleted = await a.dataSource.query(
      "DELETE FROM organisation_capability WHERE organisation_id = ? AND capability_id = (SELECT id FROM capability WHERE code = 'digital-multimeter')",
      [p.orgId],
    );
    expect(deleted.affectedRows).toBe(1);
    expect(await resultOn(b, p)).toBeUndefined();
  });

  it('shows a travel policy changed through the API in the travel fee', async () => {
    const p = await searchablePartner();
    const before = await seenOnB(p);
    expect(before.travelFeeMinor).toBeGreaterThan(0);
    await p.put('/travel-policy', { ...POLICY, ratePerKmMinor: 150 });
    // the same chargeable kilometres at 1.50 EUR instead of 0.90 EUR
    const fee = (before.travelFeeMinor / 90) * 150;
    expect(await resultOn(b, p)).toMatchObject({ travelFeeMinor: fee, totalMinor: before.totalMinor - before.travelFeeMinor + fee });
  });

  it('loses the slot when the only technician\'s account is deleted by SQL', async () => {
    const p = await searchablePartner();
    await seenOnB(p);
    await a.dataSource.query('DELETE FROM user_account WHERE id = ?', [p.technicianId]);
    // the membership goes with the account (ON DELETE CASCADE), and with it the hours and the assignment
    expect(Number((await a.dataSource.query('SELECT COUNT(*) AS n FROM membership WHERE user_id = ?', [p.technicianId]))[0].n)).toBe(0);
    // still listed (the offer stands), but nobody can do the job: no slot
    expect(await resultOn(b, p)).toMatchObject({ labourMinor: 4500, nextSlot: null });
  });

  it('sends one statement when nothing changed, and reloads only the organisation that changed', async () => {
    const p = await searchablePartner();
    await seenOnB(p);
    await resultOn(b, p);
    const stats = indexStats();
    const statements = await countQueries(b.dataSource, () => resultOn(b, p));
    // the bookings, with the change-log check joined in (search.service.ts)
    expect(statements).toBe(1);
    expect(indexStats()).toEqual(stats);

    await request(a.app).patch(`${p.org}/offers/${p.offerId}`).set(bearer(p.admin)).send({ priceMinor: 4800, durationMinutes: 45 }).expect(200);
    expect(await resultOn(b, p)).toMatchObject({ labourMinor: 4800 });
    expect(indexStats()).toEqual({ fullLoads: stats.fullLoads, organisationsReloaded: stats.organisationsReloaded + 1 });
    // loaded whole once, before the first test: every change since was applied organisation by organisation
    expect(stats.fullLoads).toBe(1);
  });
});
