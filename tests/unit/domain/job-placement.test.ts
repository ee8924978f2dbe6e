// Where a partner can do a job: mode, radius (its boundary to the last float), travel price and reach, and the fee.
import { describe, expect, it } from 'vitest';
import { DomainInputError, greatCircleDistanceM, placeJob, type GeoPoint, type PlacementPartner } from '../../../packages/domain/src';

const BASE = { lat: 47.2692, lng: 11.4041 };
// The demo brief's policy: free within 20 km, then 0.80 EUR per km, at most 150 km by road.
const POLICY = { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150, currency: 'EUR' as const };
const mobile = (over: Partial<PlacementPartner> = {}): PlacementPartner => ({ base: BASE, mode: 'mobile', radiusKm: 80, travelPolicy: POLICY, ...over });

/** The point `km` due north of `from` on the sphere of the distance function. */
const north = (from: GeoPoint, km: number): GeoPoint => ({ lat: from.lat + ((km * 1000) / 6_371_008.8) * (180 / Math.PI), lng: from.lng });

const nextUp = (x: number) => {
  const bits = new BigInt64Array(new Float64Array([x]).buffer);
  bits[0]! += 1n;
  return new Float64Array(bits.buffer)[0]!;
};

/** The last latitude (a double) still within `radiusKm` of the base along the meridian `lng`, and the next one up. */
function edge(base: GeoPoint, radiusKm: number, lng: number): { inside: GeoPoint; outside: GeoPoint } {
  let lo = base.lat;
  let hi = base.lat + 5;
  for (;;) {
    const mid = (lo + hi) / 2;
    if (mid === lo || mid === hi) break;
    if (greatCircleDistanceM(base, { lat: mid, lng }) <= radiusKm * 1000) lo = mid;
    else hi = mid;
  }
  return { inside: { lat: lo, lng }, outside: { lat: nextUp(lo), lng } };
}

describe('placeJob at the owner’s place', () => {
  it('40 km away: 40 × 1.3 = 52 road km, 32 beyond the free 20 at 80 → 2560', () => {
    const p = placeJob(mobile(), north(BASE, 40), 'owner', 'EUR');
    expect(p).toMatchObject({ jobAt: 'owner', possible: true, reason: null, travelFeeMinor: 2560, travel: { roadKm: 52, chargeableKm: 32 } });
    expect(p.distanceKm).toBeCloseTo(40, 9);
  });

  it('refuses, in order: workshop only, no place, outside the radius, no travel price, beyond reach', () => {
    expect(placeJob(mobile({ mode: 'workshop' }), north(BASE, 10), 'owner', 'EUR').reason).toBe('workshop-only');
    expect(placeJob(mobile(), null, 'owner', 'EUR')).toMatchObject({ possible: false, reason: 'no-place', distanceKm: null });
    expect(placeJob(mobile(), north(BASE, 81), 'owner', 'EUR').reason).toBe('outside-area');
    expect(placeJob(mobile({ radiusKm: null }), north(BASE, 1), 'owner', 'EUR').reason).toBe('outside-area');
    expect(placeJob(mobile({ travelPolicy: null }), north(BASE, 10), 'owner', 'EUR').reason).toBe('no-travel-price');
    expect(placeJob(mobile(), north(BASE, 10), 'owner', 'CHF').reason).toBe('no-travel-price');
    // 120 km inside a 200 km radius is 156 road km, beyond the 150 the policy drives
    const far = placeJob(mobile({ radiusKm: 200 }), north(BASE, 120), 'owner', 'EUR');
    expect(far).toMatchObject({ possible: false, reason: 'beyond-reach', travelFeeMinor: 0, travel: { roadKm: 156, withinReach: false } });
  });

  it('the radius boundary counts as inside, and the next double of latitude is outside', () => {
    for (const radiusKm of [5, 64, 65, 80, 128, 131, 300]) {
      // meridians that cross the circle: through the base, and part of the radius east and west
      for (const lng of [0, 0.37, -0.8].map((f) => BASE.lng + (f * radiusKm) / (111.2 * Math.cos((BASE.lat * Math.PI) / 180)))) {
        const { inside, outside } = edge(BASE, radiusKm, lng);
        const partner = mobile({ radiusKm, travelPolicy: { ...POLICY, maxDistanceKm: 1000 } });
        expect(placeJob(partner, inside, 'owner', 'EUR').possible, `${radiusKm} km at ${lng}`).toBe(true);
        expect(placeJob(partner, outside, 'owner', 'EUR').reason, `${radiusKm} km at ${lng}`).toBe('outside-area');
        // the search's pre-filter in km is never stricter than the rule in metres
        expect(greatCircleDistanceM(BASE, inside) / 1000 <= radiusKm).toBe(true);
      }
    }
  });
});

describe('placeJob at the workshop', () => {
  it('costs no travel, whatever the radius, and gives the distance the owner drives', () => {
    const p = placeJob(mobile({ mode: 'both', radiusKm: 10 }), north(BASE, 30), 'workshop', 'EUR');
    expect(p).toMatchObject({ jobAt: 'workshop', possible: true, travel: null, travelFeeMinor: 0 });
    expect(p.distanceKm).toBeCloseTo(30, 9);
    expect(placeJob(mobile({ mode: 'workshop', radiusKm: null, travelPolicy: null }), null, 'workshop', 'EUR')).toMatchObject({ possible: true, distanceKm: null });
  });

  it('is refused by a partner without a workshop', () => {
    expect(placeJob(mobile(), north(BASE, 3), 'workshop', 'EUR').reason).toBe('mobile-only');
  });
});

describe('placeJob refuses input outside its rule', () => {
  it('throws on a base or place off the globe and on a radius that is not a distance', () => {
    expect(() => placeJob(mobile(), { lat: 95, lng: 11 }, 'owner', 'EUR')).toThrow(DomainInputError);
    expect(() => placeJob(mobile({ base: { lat: Number.NaN, lng: 11 } }), north(BASE, 1), 'workshop', 'EUR')).toThrow(DomainInputError);
    for (const radiusKm of [-1, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => placeJob(mobile({ radiusKm }), north(BASE, 1), 'owner', 'EUR'), String(radiusKm)).toThrow(DomainInputError);
  });
});
