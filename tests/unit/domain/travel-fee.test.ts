// Travel fee: worked examples computed by hand beside each check, and properties with fast-check.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { greatCircleDistanceM, travelFee, travelFeeForDistance } from '../../../packages/domain/src/geo';

// The demo brief's policy: free within 20 km, then 0.80 EUR per km (80 cents), at most 150 km.
const demo = { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150 };

describe('travelFeeForDistance (worked examples, by hand)', () => {
  it('10 km straight × 1.3 = 13 road km, inside the free 20 km → 0', () => {
    expect(travelFeeForDistance(demo, 10)).toMatchObject({ roadKm: 13, chargeableKm: 0, feeMinor: 0, withinReach: true });
  });

  it('40 km straight × 1.3 = 52 road km; 52 − 20 = 32 km × 80 c = 2 560 c (25.60 EUR)', () => {
    expect(travelFeeForDistance(demo, 40)).toMatchObject({ roadKm: 52, chargeableKm: 32, feeMinor: 2560 });
  });

  it('a started kilometre counts: 30.1 km × 1.3 = 39.13 → 40 road km; (40 − 20) × 80 = 1 600 c', () => {
    expect(travelFeeForDistance(demo, 30.1)).toMatchObject({ roadKm: 40, chargeableKm: 20, feeMinor: 1600 });
  });

  it('float noise does not start a kilometre: 20/1.3 km straight is exactly 20 road km → free', () => {
    expect(travelFeeForDistance(demo, 20 / 1.3)).toMatchObject({ roadKm: 20, feeMinor: 0 });
  });

  it('beyond the longest distance: 120 km × 1.3 = 156 > 150 → out of reach, no fee quoted', () => {
    expect(travelFeeForDistance(demo, 120)).toMatchObject({ roadKm: 156, withinReach: false, feeMinor: 0 });
  });

  it('exactly at the longest distance is still within reach (150 road km → 130 × 80 = 10 400 c)', () => {
    expect(travelFeeForDistance(demo, 150 / 1.3)).toMatchObject({ roadKm: 150, withinReach: true, feeMinor: 10_400 });
  });

  it('refuses negative or non-finite distances and fractional rates', () => {
    expect(() => travelFeeForDistance(demo, -1)).toThrow(RangeError);
    expect(() => travelFeeForDistance(demo, Number.NaN)).toThrow(RangeError);
    expect(() => travelFeeForDistance({ ...demo, ratePerKmMinor: 0.5 }, 10)).toThrow(RangeError);
  });
});

describe('travelFee between two places', () => {
  it('Innsbruck → Munich: 97.2 km straight × 1.3 = 126.4 → 127 road km, (127 − 20) × 80 = 8 560 c', () => {
    // city coordinates from the demo brief (public geographic data); the WGS84 geodesic between
    // them is 97.196 km (geographiclib-geodesic, Geodesic.WGS84.Inverse), the sphere gives 97.200 km
    const innsbruck = { lat: 47.2692, lng: 11.4041 };
    const munich = { lat: 48.1351, lng: 11.582 };
    const straightKm = greatCircleDistanceM(innsbruck, munich) / 1000;
    expect(straightKm).toBeCloseTo(97.2, 1);
    expect(travelFee(demo, innsbruck, munich)).toMatchObject({ roadKm: 127, chargeableKm: 107, feeMinor: 8560, withinReach: true });
  });
});

describe('travelFeeForDistance properties (fast-check)', () => {
  const policy = fc.record({ freeWithinKm: fc.integer({ min: 0, max: 500 }), ratePerKmMinor: fc.integer({ min: 0, max: 10_000 }), maxDistanceKm: fc.integer({ min: 1, max: 500 }) });
  it('never negative, whole minor units, and never falls as the distance grows within reach', () => {
    fc.assert(
      fc.property(policy, fc.double({ min: 0, max: 600, noNaN: true }), fc.double({ min: 0, max: 50, noNaN: true }), (p, km, more) => {
        const a = travelFeeForDistance(p, km);
        const b = travelFeeForDistance(p, km + more);
        expect(Number.isInteger(a.feeMinor) && a.feeMinor >= 0).toBe(true);
        if (b.withinReach) expect(b.feeMinor).toBeGreaterThanOrEqual(a.feeMinor);
        if (a.roadKm <= p.freeWithinKm) expect(a.feeMinor).toBe(0);
      }),
    );
  });
});
