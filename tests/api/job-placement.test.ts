// The search, the quote and the booking give one answer for the same partner and place: whether the
// partner comes there and what the drive costs, at a radius's last inside and first outside point,
// well inside, and beyond the travel policy's reach. The partner works from Umeå, where no other
// test file puts anyone.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { greatCircleDistanceM, type GeoPoint } from '@emberline/domain';
import { createTestApp, type TestApp } from '../setup/app';
import type { SignedIn } from '../setup/accounts';
import { startPaymentsFake, type TestPaymentsFake } from '../setup/payments';
import { ADDRESS, book, bookablePartner, bookingRequest, newOwner, VEHICLE, type BookablePartner } from '../setup/bookings';
import { bearer } from '../setup/onboarding';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;
let owner: SignedIn;

const UMEA = { lat: 63.8258, lng: 20.263 };
const RADIUS_KM = 65;

const nextUp = (x: number) => {
  const bits = new BigInt64Array(new Float64Array([x]).buffer);
  bits[0]! += 1n;
  return new Float64Array(bits.buffer)[0]!;
};

/** The last latitude (a double) within the radius along the meridian `lng`, and the next double up. */
function edge(lng: number): { inside: GeoPoint; outside: GeoPoint } {
  let lo = UMEA.lat;
  let hi = UMEA.lat + 2;
  for (;;) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    if (greatCircleDistanceM(UMEA, { lat: mid, lng }) <= RADIUS_KM * 1000) lo = mid;
    else hi = mid;
  }
  return { inside: { lat: lo, lng }, outside: { lat: nextUp(lo), lng } };
}

/** What each of the three says about one place: null where it refuses, else the travel fee and the net total. */
async function answers(place: GeoPoint, start: string) {
  const found = await request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', ...place, mode: 'mobile' }).expect(200);
  const hit = (found.body.data as { partnerId: string; travelFeeMinor: number; totalMinor: number }[]).find((r) => r.partnerId === P.orgId);
  const quoted = await request(t.app)
    .get(`/api/partners/${P.orgId}/quote`)
    .query({ serviceType: 'handset-pairing', jobAt: 'owner', ...place, country: 'SE', ...VEHICLE });
  const booked = await book(t.app, owner, bookingRequest(P.orgId, start, { address: { ...ADDRESS, country: 'SE', ...place } }));
  const priced = (q: { netMinor: number; lines: { kind: string; netMinor: number }[] }) => ({ travelFeeMinor: q.lines.find((l) => l.kind === 'travel')?.netMinor ?? 0, totalMinor: q.netMinor });
  return {
    search: hit ? { travelFeeMinor: hit.travelFeeMinor, totalMinor: hit.totalMinor } : null,
    quote: quoted.status === 200 ? priced(quoted.body.data) : { status: quoted.status, errors: quoted.body.errors },
    booking: booked.status === 201 ? priced(booked.body.data.quote) : { status: booked.status, errors: booked.body.errors },
  };
}

/** The first bookable start at `place` (the travel time from the base counts). */
async function firstStart(place: GeoPoint): Promise<string> {
  const res = await request(t.app).get(`/api/partners/${P.orgId}/slots`).query({ serviceType: 'handset-pairing', ...place, days: 5 }).expect(200);
  return res.body.data.organisation[0].start as string;
}

beforeAll(async () => {
  fake = await startPaymentsFake();
  t = await createTestApp(fake.env);
  P = await bookablePartner(t.app, t.dataSource, { area: { baseLabel: 'Umeå', baseLat: UMEA.lat, baseLng: UMEA.lng, mode: 'mobile', radiusKm: RADIUS_KM, workshopAddress: null } });
  owner = await newOwner(t.app, t.dataSource);
}, 120_000);
afterAll(async () => {
  await t.close();
  await fake.close();
});

describe('one placement rule for the search, the quote and the booking', () => {
  it('at the radius: the last point inside is offered, quoted and booked at one price; the next double of latitude is refused by all three', async () => {
    const { inside, outside } = edge(UMEA.lng + 0.4);
    const start = await firstStart(inside);
    const yes = await answers(inside, start);
    // by hand: 65 km × 1.3 = 84.5 → 85 road km, 65 beyond the free 20 at 0.80 → 52.00; 45.00 labour + 15.00 handset
    const expected = { travelFeeMinor: 5200, totalMinor: 4500 + 1500 + 5200 };
    expect(yes).toEqual({ search: expected, quote: expected, booking: expected });

    const no = await answers(outside, start);
    const atPlace = (prefix: string) => [`${prefix}lat`, `${prefix}lng`].map((path) => expect.objectContaining({ path, message: expect.stringContaining('outside the partner') }));
    expect(no).toEqual({ search: null, quote: { status: 400, errors: atPlace('query.') }, booking: { status: 400, errors: atPlace('address.') } });
  });

  it('well inside the radius all three charge the same drive', async () => {
    const place = { lat: 64.05, lng: 20.5 };
    const got = await answers(place, await firstStart(place));
    expect(got.search).not.toBeNull();
    expect(got.search!.travelFeeMinor).toBeGreaterThan(0);
    expect(got.quote).toEqual(got.search);
    expect(got.booking).toEqual(got.search);
  });

  it('inside the radius but beyond the travel policy\'s longest drive: all three refuse', async () => {
    await request(t.app).put(`/api/orgs/${P.orgId}/travel-policy`).set(bearer(P.admin)).send({ freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 60 }).expect(200);
    // about 55 km straight is about 72 km by road, more than the 60 the partner drives
    const place = { lat: UMEA.lat + 0.49, lng: UMEA.lng };
    const got = await answers(place, new Date(Date.now() + 2 * 86_400_000).toISOString());
    const atPlace = (prefix: string) => [`${prefix}lat`, `${prefix}lng`].map((path) => expect.objectContaining({ path, message: expect.stringContaining('they drive at most 60 km') }));
    expect(got).toEqual({ search: null, quote: { status: 400, errors: atPlace('query.') }, booking: { status: 400, errors: atPlace('address.') } });
  });
});
