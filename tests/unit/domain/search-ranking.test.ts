// Best-match score (worked examples by hand), sort orders, and the anonymous coverage-gap cell
// (distances checked with geographiclib-geodesic, WGS84, as an outside reference).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import geodesic from 'geographiclib-geodesic';
import { bestMatchScore, compareResults, gapCell, GAP_CELL_KM } from '../../../packages/domain/src';

const WGS84 = geodesic.Geodesic.WGS84;
const km = (a: { lat: number; lng: number }, b: { lat: number; lng: number }) => WGS84.Inverse(a.lat, a.lng, b.lat, b.lng).s12! / 1000;

describe('bestMatchScore (worked examples, by hand)', () => {
  it('at the place, cheapest, a slot now and a 5-star rating scores 1', () => {
    expect(bestMatchScore({ distanceKm: 0, maxDistanceKm: 100, totalMinor: 100, cheapestMinor: 100, rating: 5, minutesToSlot: 0, windowMinutes: 20_160 })).toBe(1);
  });

  it('50 of 100 km, twice the cheapest, slot half-way through the window, unrated: 0.35·0.5 + 0.3·0.5 + 0.2·0.5 + 0.15·0.625 = 0.5188', () => {
    // unrated counts as 3.5 stars: (3.5 − 1) / 4 = 0.625
    expect(bestMatchScore({ distanceKm: 50, maxDistanceKm: 100, totalMinor: 200, cheapestMinor: 100, rating: null, minutesToSlot: 10_080, windowMinutes: 20_160 })).toBe(0.5188);
  });

  it('no slot in the window and at the limit leaves only price and rating: 0.3 + 0.15·0 = 0.3 for a 1-star cheapest', () => {
    expect(bestMatchScore({ distanceKm: 120, maxDistanceKm: 100, totalMinor: 100, cheapestMinor: 100, rating: 1, minutesToSlot: null, windowMinutes: 20_160 })).toBe(0.3);
  });
});

describe('compareResults', () => {
  const r = (partnerId: string, score: number, distanceKm: number, totalMinor: number, start: string | null) => ({ partnerId, score, distanceKm, totalMinor, nextSlot: start ? { start } : null });
  const list = [r('a', 0.5, 30, 300, '2026-12-03T09:00:00Z'), r('b', 0.9, 10, 500, null), r('c', 0.5, 20, 200, '2026-12-02T09:00:00Z')];
  const order = (sort: Parameters<typeof compareResults>[0]) => [...list].sort(compareResults(sort)).map((x) => x.partnerId);
  it('orders by each sort, ties by distance then id; no slot sorts last on soonest', () => {
    expect(order('best')).toEqual(['b', 'c', 'a']);
    expect(order('distance')).toEqual(['b', 'c', 'a']);
    expect(order('price')).toEqual(['c', 'a', 'b']);
    expect(order('soonest')).toEqual(['c', 'a', 'b']);
  });
});

describe('gapCell keeps places only about 10 km precise', () => {
  const point = fc.record({ lat: fc.double({ min: -80, max: 80, noNaN: true }), lng: fc.double({ min: -180, max: 180, noNaN: true }) });

  it('the cell centre lies within half the cell diagonal (+1 %) of the place — geographiclib-geodesic, WGS84', () => {
    const halfDiagonal = (GAP_CELL_KM * Math.SQRT2) / 2;
    fc.assert(
      fc.property(point, (p) => {
        expect(km(p, gapCell(p))).toBeLessThanOrEqual(halfDiagonal * 1.01);
      }),
      { numRuns: 500 },
    );
  });

  it('is stable: a cell centre is its own cell; the Linz demo owner falls in one cell with points 1 km away in its middle', () => {
    fc.assert(
      fc.property(point, (p) => {
        expect(gapCell(gapCell(p))).toEqual(gapCell(p));
      }),
      { numRuns: 300 },
    );
    const linz = { lat: 48.3069, lng: 14.2858 };
    const centre = gapCell(linz);
    expect(gapCell({ lat: centre.lat + 0.005, lng: centre.lng - 0.005 })).toEqual(centre);
    expect(km(linz, centre)).toBeLessThan(7.1);
  });
});
