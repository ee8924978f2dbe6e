// Quotes and bookings without the payment flow's webhooks: the quote preview (a worked example),
// booking validation, one booking per slot under a race, payments unavailable, the owner's and
// the partner's lists and details, the CSV export, and who may decide on a booking.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REVERSE_CHARGE_NOTE } from '@emberline/domain';
import { ELIGIBILITY_RULES } from '../../apps/api/src/db/seed/eligibility-rules';
import { createTestApp, type TestApp } from '../setup/app';
import { signIn, type SignedIn } from '../setup/accounts';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { seedDemoBookings } from '../../apps/api/src/db/seed/demo-bookings';
import { bearer } from '../setup/onboarding';
import { startPaymentsFake, type TestPaymentsFake } from '../setup/payments';
import {
  ADDRESS,
  book,
  bookablePartner,
  bookingCount,
  bookingRequest,
  expectProblem,
  insertBooking,
  LINZ,
  newOwner,
  slotStarts,
  VEHICLE,
  type BookablePartner,
} from '../setup/bookings';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;
let owner: SignedIn;

const paths = (res: request.Response) => (res.body.errors as { path: string }[]).map((e) => e.path).sort();

beforeAll(async () => {
  fake = await startPaymentsFake();
  t = await createTestApp(fake.env);
  P = await bookablePartner(t.app, t.dataSource);
  owner = await newOwner(t.app, t.dataSource);
}, 120_000);
afterAll(async () => {
  await t.close();
  await fake.close();
});

describe('GET /api/partners/:partnerId/quote', () => {
  const GLUTWERK_VAN = { factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, fuel: 'diesel' };
  const glutwerk = async () => (await t.dataSource.query("SELECT id FROM organisation WHERE name = 'Glutwerk Mobil'"))[0].id as string;

  it('prices the demo conversion at the owner\'s place: labour, kit and travel with Austrian VAT per line (worked example, by hand)', async () => {
    // a point 0.25° of latitude due north of Glutwerk's base (47.2692, 11.4041): on one meridian the
    // great-circle distance is R × Δφ = 6 371.0088 km × 0.25 × π / 180 = 27.799 km (mean Earth
    // radius, IUGG); by road × 1.3 (the slot engine's assumption) = 36.14 → 37 km started;
    // 17 km beyond the free 20 km at 0.80 = 13.60
    const place = { lat: 47.5192, lng: 11.4041 };
    const straightKm = (6371.0088 * 0.25 * Math.PI) / 180;
    expect(straightKm).toBeCloseTo(27.799, 3);
    expect(Math.ceil(straightKm * 1.3)).toBe(37);
    const res = await request(t.app)
      .get(`/api/partners/${await glutwerk()}/quote`)
      .query({ serviceType: 'parking-conversion-auto', jobAt: 'owner', ...place, country: 'AT', ...GLUTWERK_VAN, start: '2027-01-12T09:00:00+01:00' })
      .expect(200);
    const q = res.body.data;
    expect(q.partner).toBeUndefined();
    // AT standard rate 20 % (Council Directive 2006/112/EC, Art. 54(2)(b): work on goods is taxed where done; rate from the Commission's VAT rates table, see REFERENCES)
    expect(q.vat).toMatchObject({ treatment: 'standard', country: 'AT', rateBp: 2000 });
    // worked example, by hand: 180.00 + 85.00 + 13.60 = 278.60 net; 36.00 + 17.00 + 2.72 = 55.72 VAT; 334.32 gross
    expect(q.lines.map((l: { kind: string; netMinor: number; vatMinor: number; grossMinor: number }) => [l.kind, l.netMinor, l.vatMinor, l.grossMinor])).toEqual([
      ['labour', 18_000, 3_600, 21_600],
      ['parts', 8_500, 1_700, 10_200],
      ['travel', 1_360, 272, 1_632],
    ]);
    expect(q.lines[2].description).toContain('37 km');
    expect(q).toMatchObject({ currency: 'EUR', netMinor: 27_860, vatMinor: 5_572, grossMinor: 33_432, depositMinor: 0, cancellation: { freeUntilHours: 24, feeMinor: 0 } });
  });

  it('charges no VAT to a business customer from another EU country (reverse charge)', async () => {
    const res = await request(t.app)
      .get(`/api/partners/${await glutwerk()}/quote`)
      .query({ serviceType: 'parking-conversion-auto', jobAt: 'owner', lat: 47.5192, lng: 11.4041, ...GLUTWERK_VAN, vatId: 'DE814627599' })
      .expect(200);
    // Council Directive 2006/112/EC, Art. 44 and 196: the business customer accounts for the VAT
    expect(res.body.data.vat).toMatchObject({ treatment: 'reverse-charge', rateBp: 0, note: REVERSE_CHARGE_NOTE });
    expect(res.body.data.vatMinor).toBe(0);
    expect(res.body.data.grossMinor).toBe(27_860);
  });

  it('asks for the country rather than guessing it: a private customer\'s quote without `country` is 422 VAT_UNDECIDABLE', async () => {
    // Council Directive 2006/112/EC, Art. 54(2)(b): a consumer pays the VAT of the country where the work is done
    const res = await request(t.app)
      .get(`/api/partners/${await glutwerk()}/quote`)
      .query({ serviceType: 'parking-conversion-auto', jobAt: 'owner', lat: 47.5192, lng: 11.4041, ...GLUTWERK_VAN })
      .expect(422);
    expectProblem(res, 422, 'VAT_UNDECIDABLE');
    expect(res.body.detail).toMatch(/country/);
  });

  it('work in Bavaria for an Austrian partner: a consumer pays DE 19 % (Art. 54(2)(b)), an Austrian business AT 20 % (Art. 44)', async () => {
    const quote = async (extra: object) =>
      (await request(t.app).get(`/api/partners/${await glutwerk()}/quote`).query({ serviceType: 'parking-conversion-auto', jobAt: 'owner', lat: 47.5192, lng: 11.4041, country: 'DE', ...GLUTWERK_VAN, start: '2027-01-12T09:00:00+01:00', ...extra }).expect(200)).body.data;
    const consumer = await quote({});
    // by hand: 180.00 × 19 % = 34.20; 85.00 × 19 % = 16.15; 13.60 × 19 % = 2.584 → 2.58; 52.93 VAT
    expect(consumer.vat).toMatchObject({ treatment: 'standard', country: 'DE', rateBp: 1900, rule: { code: 'b2c-work-place', article: 'Art. 54(2)(b)' } });
    expect(consumer.vatMinor).toBe(5_293);
    const business = await quote({ vatId: 'ATU13585627' });
    // by hand: 278.60 × 20 % = 55.72 (per line 36.00 + 17.00 + 2.72)
    expect(business.vat).toMatchObject({ treatment: 'standard', country: 'AT', rateBp: 2000, rule: { code: 'b2b-domestic', article: 'Art. 44', params: { workCountry: 'DE', customerCountry: 'AT', placeOfSupply: 'AT' } } });
    expect(business.vatMinor).toBe(5_572);
  });

  it('refuses a vehicle the service does not fit with the rule\'s own words on serviceType', async () => {
    const res = await request(t.app)
      .get(`/api/partners/${await glutwerk()}/quote`)
      .query({ serviceType: 'parking-conversion-auto', jobAt: 'owner', lat: 47.5192, lng: 11.4041, ...GLUTWERK_VAN, climateControl: 'manual' })
      .expect(400);
    const rule = ELIGIBILITY_RULES.find((r) => r.code === 'manual-climate-needs-manual-conversion')!;
    expect(res.body.errors).toEqual([{ path: 'query.serviceType', message: rule.effect.message }]);
  });

  it('refuses a place outside the area with field errors on lat and lng, and a mode the partner does not work in', async () => {
    expect(paths(await request(t.app).get(`/api/partners/${P.orgId}/quote`).query({ serviceType: 'handset-pairing', jobAt: 'owner', ...LINZ }).expect(400))).toEqual(['query.lat', 'query.lng']);
    expect(paths(await request(t.app).get(`/api/partners/${P.orgId}/quote`).query({ serviceType: 'handset-pairing', jobAt: 'owner' }).expect(400))).toEqual(['query.lat', 'query.lng']);
    expect(paths(await request(t.app).get(`/api/partners/${P.orgId}/quote`).query({ serviceType: 'handset-pairing', jobAt: 'workshop' }).expect(400))).toEqual(['query.jobAt']);
    expect(paths(await request(t.app).get(`/api/partners/${P.orgId}/quote`).query({ serviceType: 'seasonal-heater-service', jobAt: 'owner', ...ADDRESS }).expect(400))).toEqual(['query.serviceType']);
    expect(paths(await request(t.app).get(`/api/partners/${P.orgId}/quote`).query({ serviceType: 'handset-pairing', jobAt: 'owner', lat: 47.26, lng: 11.39, vatId: 'ATU1' }).expect(400))).toEqual(['query.vatId']);
    await request(t.app).get('/api/partners/00000000-0000-4000-8000-000000000000/quote').query({ serviceType: 'handset-pairing', jobAt: 'workshop' }).expect(404);
  });
});

describe('POST /api/bookings', () => {
  it('holds the slot for ten minutes, stores the quote and opens the payment page', async () => {
    const [start] = await slotStarts(t.app, P.orgId);
    const before = Date.now();
    const res = await book(t.app, owner, bookingRequest(P.orgId, start!, { notes: 'Van is in the yard' }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const b = res.body.data;
    expect(b).toMatchObject({ status: 'held', start, jobAt: 'owner', partner: { id: P.orgId }, technician: { id: P.technician.userId }, partnerQuote: null, notes: 'Van is in the yard' });
    expect(b.reference).toMatch(/^EMB-[A-Z0-9]{6}$/);
    expect(b.checkoutUrl).toMatch(new RegExp(`^${fake.url}/pay/cs_test_`));
    expect(Date.parse(b.holdExpiresAt) - before).toBeGreaterThanOrEqual(10 * 60_000 - 1000);
    expect(Date.parse(b.holdExpiresAt) - before).toBeLessThanOrEqual(10 * 60_000 + 5000);
    expect(Date.parse(b.end) - Date.parse(b.start)).toBe(30 * 60_000);
    // 45.00 labour + 15.00 handset, travel within the free 20 km; AT 20 % (worked example, by hand)
    expect(b.quote).toMatchObject({ netMinor: 6000, vatMinor: 1200, grossMinor: 7200 });
    expect(b.customer).toMatchObject({ kind: 'consumer', email: owner.email, phone: '+43 660 1234567' });
    expect(b.payment).toEqual({ status: 'pending', authorisedMinor: 0, capturedMinor: 0, refundedMinor: 0 });
    expect(b.history).toMatchObject([{ from: null, to: 'held', actor: 'owner' }]);

    // the checkout holds the gross, expires at least 30 minutes on, and comes back to the booking
    const session = fake.state().checkoutSessions.find((s) => (s.metadata as { booking_id: string }).booking_id === b.id)!;
    expect(session).toMatchObject({ amount_total: 7200, currency: 'eur', customer_email: owner.email, success_url: `http://emberline.test/bookings/${b.id}?paid=1`, cancel_url: `http://emberline.test/bookings/${b.id}?cancelled=1` });
    expect((session.expires_at as number) * 1000 - before).toBeGreaterThanOrEqual(30 * 60_000);
    const key = fake.state().requests.find((r) => r.path === '/v1/checkout/sessions' && r.idempotencyKey === `booking:${b.id}:checkout`);
    expect(key).toBeDefined();

    // the held slot is gone from the public list while the hold lasts
    expect(await slotStarts(t.app, P.orgId)).not.toContain(start);
  });

  it('answers 400 with field errors for an address outside the area, and saves nothing', async () => {
    const [start] = await slotStarts(t.app, P.orgId);
    const before = await bookingCount(t.dataSource);
    const res = await book(t.app, owner, bookingRequest(P.orgId, start!, { address: { ...ADDRESS, ...LINZ } })).expect(400);
    expect(paths(res)).toEqual(['address.lat', 'address.lng']);
    expect(await bookingCount(t.dataSource)).toBe(before);
  });

  it('validates the request, the vehicle and the technician, with nothing saved', async () => {
    const [start] = await slotStarts(t.app, P.orgId);
    const before = await bookingCount(t.dataSource);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, start!, { address: undefined })).expect(400))).toEqual(['address']);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, '2027-01-12 09:00')).expect(400))).toEqual(['start']);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, start!, { vehicleId: '00000000-0000-4000-8000-000000000000' })).expect(400))).toEqual(['vehicleId']);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, start!, { technicianId: P.admin.userId })).expect(400))).toEqual(['technicianId']);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, start!, { jobAt: 'workshop' })).expect(400))).toEqual(['jobAt']);
    expect(paths(await book(t.app, owner, bookingRequest(P.orgId, start!, { customer: { kind: 'business', companyName: 'Test GmbH', vatId: 'ATU1' } })).expect(400))).toEqual(['customer.vatId']);
    expect(paths(await book(t.app, owner, bookingRequest('00000000-0000-4000-8000-000000000000', start!)).expect(400))).toEqual(['partnerId']);
    expect(paths(await book(t.app, owner, { ...bookingRequest(P.orgId, start!), vehicle: { ...VEHICLE, climateControl: 'sometimes' } }).expect(400))).toEqual(['vehicle.climateControl']);
    expect(await bookingCount(t.dataSource)).toBe(before);
  });

  it('refuses a start that is not bookable with 409 SLOT_TAKEN', async () => {
    const [start] = await slotStarts(t.app, P.orgId);
    // 07:07 is off the grid and outside the hours
    const odd = new Date(Date.parse(start!) + 7 * 60_000).toISOString();
    expectProblem(await book(t.app, owner, bookingRequest(P.orgId, odd)), 409, 'SLOT_TAKEN');
  });

  it('is for owners: a partner admin is refused, a visitor must sign in', async () => {
    const [start] = await slotStarts(t.app, P.orgId);
    expectProblem(await book(t.app, P.admin, bookingRequest(P.orgId, start!)), 403, 'FORBIDDEN');
    expectProblem(await request(t.app).post('/api/bookings').send(bookingRequest(P.orgId, start!)), 401, 'NOT_SIGNED_IN');
  });

  it('gives one slot to exactly one of eight owners booking it at the same moment', async () => {
    const starts = await slotStarts(t.app, P.orgId);
    const start = starts[starts.length - 1]!;
    const owners: SignedIn[] = [];
    for (let i = 0; i < 8; i++) owners.push(await newOwner(t.app, t.dataSource));
    const results = await Promise.all(owners.map((o) => book(t.app, o, bookingRequest(P.orgId, start))));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses, JSON.stringify(results.map((r) => r.body.code ?? r.body.data?.status))).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.code).toBe('SLOT_TAKEN');
    expect(await bookingCount(t.dataSource, 'organisation_id = ? AND start_at = ?', [P.orgId, new Date(start)])).toBe(1);
  }, 60_000);

  it('answers 503 when the payments provider cannot be reached, and leaves no booking behind', async () => {
    const down = await startPaymentsFake();
    const app = await createTestApp(down.env);
    try {
      await down.close();
      const [start] = await slotStarts(app.app, P.orgId);
      const before = await bookingCount(t.dataSource);
      const res = await book(app.app, owner, bookingRequest(P.orgId, start!));
      expectProblem(res, 503, 'PAYMENTS_UNAVAILABLE');
      expect(res.body.type).toBe('urn:emberline:problem:payments-unavailable');
      expect(await bookingCount(t.dataSource)).toBe(before);
      expect(await slotStarts(app.app, P.orgId)).toContain(start);
    } finally {
      await app.close();
    }
  }, 60_000);
});

describe('bookings in the public slots and the search', () => {
  /** Bregenz, where no other test partner works: the search finds this one alone. */
  const BREGENZ = { lat: 47.5031, lng: 9.7471 };

  it('leaves a booked start out of the partner\'s slots and out of the search\'s next slot', async () => {
    const B = await bookablePartner(t.app, t.dataSource, { area: { baseLabel: 'Bregenz', baseLat: BREGENZ.lat, baseLng: BREGENZ.lng, mode: 'mobile', radiusKm: 30, workshopAddress: null } });
    const search = async () => {
      const res = await request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', ...BREGENZ }).expect(200);
      return (res.body.data as { partnerId: string; nextSlot: { start: string } | null }[]).find((r) => r.partnerId === B.orgId)!.nextSlot!.start;
    };
    const slots = async () => ((await request(t.app).get(`/api/partners/${B.orgId}/slots`).query({ serviceType: 'handset-pairing', ...BREGENZ, days: 2 }).expect(200)).body.data.organisation as { start: string }[]).map((s) => s.start);
    const first = await search();
    expect((await slots())[0]).toBe(first);
    // a confirmed job of 30 minutes at the first start, at the owner's place in Bregenz
    await insertBooking(t.dataSource, { orgId: B.orgId, technicianId: B.technician.userId, ownerId: owner.userId, offerId: B.offerId, start: new Date(first), status: 'confirmed' });
    await t.dataSource.query('UPDATE booking SET job_lat = ?, job_lng = ? WHERE organisation_id = ?', [BREGENZ.lat, BREGENZ.lng, B.orgId]);
    expect(await slots()).not.toContain(first);
    expect(await search()).not.toBe(first);
    expect(Date.parse(await search())).toBeGreaterThanOrEqual(Date.parse(first) + 30 * 60_000);
  }, 60_000);
});

describe('lists, details and the CSV export', () => {
  let other: SignedIn;
  let mine: { id: string; reference: string };
  let theirs: { id: string; reference: string };
  const day = (d: number) => new Date(Date.now() + d * 86_400_000);

  beforeAll(async () => {
    other = await newOwner(t.app, t.dataSource);
    mine = await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: owner.userId, offerId: P.offerId, start: day(20), status: 'confirmed', customerName: 'Ana "Quotes", Esq.' });
    theirs = await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: other.userId, offerId: P.offerId, start: day(21), customerName: '=cmd|calc', customerEmail: 'other@test.example' });
  });

  it('shows owners their own bookings only', async () => {
    const list = (await request(t.app).get('/api/bookings').set(bearer(owner)).expect(200)).body.data as { id: string; partnerQuote: unknown }[];
    expect(list.map((b) => b.id)).toContain(mine.id);
    expect(list.map((b) => b.id)).not.toContain(theirs.id);
    expect(list.every((b) => b.partnerQuote === null)).toBe(true);
    await request(t.app).get(`/api/bookings/${mine.id}`).set(bearer(owner)).expect(200);
    expectProblem(await request(t.app).get(`/api/bookings/${theirs.id}`).set(bearer(owner)), 404, 'NOT_FOUND');
    expectProblem(await request(t.app).get(`/api/bookings/${theirs.id}/calendar.ics`).set(bearer(owner)), 404, 'NOT_FOUND');
  });

  it('shows the partner every booking with its share, filtered by status, time, technician and text', async () => {
    const list = async (query: Record<string, string>) => ((await request(t.app).get(`/api/orgs/${P.orgId}/bookings`).query(query).set(bearer(P.admin)).expect(200)).body.data as { id: string }[]).map((b) => b.id);
    expect(await list({})).toEqual(expect.arrayContaining([mine.id, theirs.id]));
    expect(await list({ status: 'confirmed' })).toContain(mine.id);
    expect(await list({ status: 'confirmed' })).not.toContain(theirs.id);
    expect(await list({ from: day(20.5).toISOString(), to: day(30).toISOString() })).toEqual([theirs.id]);
    expect(await list({ technicianId: P.admin.userId })).toEqual([]);
    expect(await list({ q: 'other@test' })).toEqual([theirs.id]);
    expect(await list({ q: mine.reference })).toEqual([mine.id]);
    const detail = (await request(t.app).get(`/api/orgs/${P.orgId}/bookings/${mine.id}`).set(bearer(P.technician)).expect(200)).body.data;
    expect(detail.partnerQuote).toMatchObject({ commissionBp: 1200, commissionMinor: 540 });
    expect(detail.checkoutUrl).toBeNull();
    // malformed filters are field errors, for the list and the CSV alike
    const bad = { status: 'maybe', from: 'yesterday', technicianId: 'nobody' };
    expect(paths(await request(t.app).get(`/api/orgs/${P.orgId}/bookings`).query(bad).set(bearer(P.admin)).expect(400))).toEqual(['query.from', 'query.status', 'query.technicianId']);
    expect(paths(await request(t.app).get(`/api/orgs/${P.orgId}/bookings.csv`).query(bad).set(bearer(P.admin)).expect(400))).toEqual(['query.from', 'query.status', 'query.technicianId']);
  });

  it('exports CSV with a header row, one row per booking and RFC 4180 quoting', async () => {
    const res = await request(t.app).get(`/api/orgs/${P.orgId}/bookings.csv`).query({ from: day(19).toISOString() }).set(bearer(P.admin)).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="bookings-/);
    const text = res.text;
    // RFC 4180, section 2: CRLF line breaks, a header line, fields with quotes or commas in double quotes with quotes doubled
    const lines = text.split('\r\n');
    expect(lines.at(-1)).toBe('');
    expect(lines[0]!.split(',')[0]).toBe('reference');
    expect(lines.length - 2).toBe(2);
    const mineLine = lines.find((l) => l.startsWith(mine.reference))!;
    expect(mineLine).toContain('"Ana ""Quotes"", Esq."');
    expect(mineLine).toContain(',EUR,45.00,9.00,54.00,authorised,54.00,0.00,0.00,');
    // a cell that starts like a formula is defused (OWASP: CSV injection)
    expect(lines.find((l) => l.startsWith(theirs.reference))).toContain(",'=cmd|calc,");
  });

  it('lets partner admins and the assigned technician decide, not another technician, nor an owner', async () => {
    const second = await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.admin.userId, ownerId: other.userId, offerId: P.offerId, start: day(22) });
    expectProblem(await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${second.id}/decision`).set(bearer(P.technician)).send({ action: 'accept' }), 403, 'FORBIDDEN');
    const accepted = await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${theirs.id}/decision`).set(bearer(P.technician)).send({ action: 'accept' }).expect(200);
    expect(accepted.body.data.status).toBe('confirmed');
    expect(accepted.body.data.history.at(-1)).toMatchObject({ from: 'requested', to: 'confirmed', actor: 'partner' });
    expectProblem(await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${theirs.id}/decision`).set(bearer(P.admin)).send({ action: 'accept' }), 409, 'BOOKING_STATE');
    expectProblem(await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${theirs.id}/decision`).set(bearer(owner)).send({ action: 'cancel', reason: 'no' }), 404, 'NOT_FOUND');
    expect(paths(await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${theirs.id}/decision`).set(bearer(P.admin)).send({ action: 'decline' }).expect(400))).toEqual(['reason']);
    // a no-show only after the start
    expectProblem(await request(t.app).post(`/api/orgs/${P.orgId}/bookings/${theirs.id}/decision`).set(bearer(P.admin)).send({ action: 'no-show' }), 409, 'BOOKING_STATE');
  });

  it('serves the demo owner an upcoming confirmed booking and a completed one', async () => {
    const clara = await signIn(t.app, 'clara@owners.example', DEMO_PASSWORD);
    const list = (await request(t.app).get('/api/bookings').set(bearer(clara)).expect(200)).body.data as { status: string; start: string; payment: { status: string } }[];
    expect(list.some((b) => b.status === 'confirmed' && Date.parse(b.start) > Date.now() && b.payment.status === 'authorised')).toBe(true);
    expect(list.some((b) => b.status === 'completed' && b.payment.status === 'captured')).toBe(true);
    // Kaltstart's busy week: confirmed and requested jobs ahead
    const [kaltstart] = await t.dataSource.query("SELECT id FROM organisation WHERE name = 'Kaltstart Service Bayern'");
    const florian = await signIn(t.app, 'florian@kaltstart.example', DEMO_PASSWORD);
    const week = (await request(t.app).get(`/api/orgs/${kaltstart.id}/bookings`).query({ from: new Date().toISOString() }).set(bearer(florian)).expect(200)).body.data as { status: string }[];
    expect(week.filter((b) => b.status === 'confirmed').length).toBeGreaterThanOrEqual(3);
    expect(week.filter((b) => b.status === 'requested').length).toBeGreaterThanOrEqual(2);
    // the seed is idempotent
    expect(await seedDemoBookings(t.dataSource.manager, new Date())).toBe(0);
  });
});
