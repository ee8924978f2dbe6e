// Unit checks of the geo helpers: sphere identities, bounding boxes, service areas, travel time.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  assertGeoPoint,
  boundingBox,
  DEFAULT_TRAVEL_ASSUMPTIONS,
  greatCircleDistanceM,
  isInBoundingBox,
  isInServiceArea,
  MEAN_EARTH_RADIUS_M,
  travelMinutes,
  travelMinutesForDistance,
  type GeoPoint,
} from '../../../packages/domain/src/geo';

const R1 = 6_371_008.8; // IUGG mean radius R1 of GRS80 (Moritz, "Geodetic Reference System 1980", 1980)
const point = fc.record({ lat: fc.double({ min: -90, max: 90, noNaN: true }), lng: fc.double({ min: -180, max: 180, noNaN: true }) });

describe('greatCircleDistanceM on the sphere of radius R1', () => {
  it('uses the IUGG mean radius 6 371 008.8 m — GRS80 (Moritz 1980), the IUGG mean radius R1', () => {
    expect(MEAN_EARTH_RADIUS_M).toBe(R1);
  });

  it('one degree along the equator is R1·π/180 — arc length on a circle', () => {
    expect(greatCircleDistanceM({ lat: 0, lng: 10 }, { lat: 0, lng: 11 })).toBeCloseTo((R1 * Math.PI) / 180, 6);
  });

  it('pole to pole and antipodal points are half a great circle, π·R1 — spherical geometry', () => {
    expect(greatCircleDistanceM({ lat: 90, lng: 0 }, { lat: -90, lng: 0 })).toBeCloseTo(Math.PI * R1, 3);
    expect(greatCircleDistanceM({ lat: 30, lng: 20 }, { lat: -30, lng: -160 })).toBeCloseTo(Math.PI * R1, 3);
  });

  it('crossing the antimeridian takes the short way: 179.5° E to 179.5° W on the equator is one degree', () => {
    expect(greatCircleDistanceM({ lat: 0, lng: 179.5 }, { lat: 0, lng: -179.5 })).toBeCloseTo((R1 * Math.PI) / 180, 6);
  });

  it('a quarter meridian from the equator to a pole is π·R1/2, whatever the longitude of the pole point', () => {
    expect(greatCircleDistanceM({ lat: 0, lng: 47 }, { lat: 90, lng: -120 })).toBeCloseTo((Math.PI * R1) / 2, 3);
  });

  it('is a metric: zero to itself, symmetric, and the triangle inequality holds (fast-check)', () => {
    fc.assert(
      fc.property(point, point, point, (a, b, c) => {
        expect(greatCircleDistanceM(a, a)).toBe(0);
        expect(greatCircleDistanceM(a, b)).toBeCloseTo(greatCircleDistanceM(b, a), 6);
        // haversine is ill-conditioned for nearly antipodal points (asin near 1): some 0.1 m there
        expect(greatCircleDistanceM(a, c)).toBeLessThanOrEqual(greatCircleDistanceM(a, b) + greatCircleDistanceM(b, c) + 0.5);
        expect(greatCircleDistanceM(a, b)).toBeLessThanOrEqual(Math.PI * R1 + 1e-6);
      }),
      { numRuns: 300 },
    );
  });

  it('rejects latitudes and longitudes outside their ranges', () => {
    expect(() => assertGeoPoint({ lat: 91, lng: 0 })).toThrow(/latitude/);
    expect(() => assertGeoPoint({ lat: 0, lng: -181 })).toThrow(/longitude/);
    expect(() => assertGeoPoint({ lat: Number.NaN, lng: 0 })).toThrow(/latitude/);
    expect(() => assertGeoPoint({ lat: 47.27, lng: 11.4 })).not.toThrow();
  });
});

describe('boundingBox', () => {
  it('for 100 km around 47° N spans ±100 km/R1 in latitude and asin(sin(d/R1)/cos φ) in longitude — bounding coordinates on a sphere', () => {
    const angular = 100_000 / R1;
    const box = boundingBox({ lat: 47, lng: 11 }, 100_000);
    const deg = 180 / Math.PI;
    expect(box.north - 47).toBeCloseTo(angular * deg, 10);
    expect(47 - box.south).toBeCloseTo(angular * deg, 10);
    expect(box.east - 11).toBeCloseTo(Math.asin(Math.sin(angular) / Math.cos((47 * Math.PI) / 180)) * deg, 10);
  });

  it('contains every point within the radius, and its edges touch the circle (fast-check)', () => {
    const center = fc.record({ lat: fc.double({ min: -89, max: 89, noNaN: true }), lng: fc.double({ min: -180, max: 180, noNaN: true }) });
    fc.assert(
      fc.property(center, fc.double({ min: 100, max: 2_000_000, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), (c, radius, u, v) => {
        const box = boundingBox(c, radius);
        // a point in a patch a bit larger than the circle, wrapped into range
        const spread = ((radius / R1) * 180) / Math.PI;
        const lat = Math.max(-90, Math.min(90, c.lat + u * spread * 1.2));
        const cos = Math.max(Math.cos((lat * Math.PI) / 180), 1e-3);
        let lng = c.lng + (v * spread * 1.2) / cos;
        lng = ((((lng + 180) % 360) + 360) % 360) - 180;
        const p: GeoPoint = { lat, lng };
        if (greatCircleDistanceM(c, p) <= radius) expect(isInBoundingBox(p, box)).toBe(true);
        // the northern and southern edges lie on the circle when no pole is inside
        if (box.north < 90) expect(greatCircleDistanceM(c, { lat: box.north, lng: c.lng })).toBeCloseTo(radius, 3);
      }),
      { numRuns: 500 },
    );
  });

  it('crossing the antimeridian gives west > east and still contains both sides', () => {
    const box = boundingBox({ lat: -17.7, lng: 179.9 }, 50_000);
    expect(box.west).toBeGreaterThan(box.east);
    expect(isInBoundingBox({ lat: -17.7, lng: -179.9 }, box)).toBe(true);
    expect(isInBoundingBox({ lat: -17.7, lng: 179.8 }, box)).toBe(true);
    expect(isInBoundingBox({ lat: -17.7, lng: 170 }, box)).toBe(false);
  });

  it('reaching a pole spans every longitude', () => {
    const box = boundingBox({ lat: 89.9, lng: 40 }, 50_000);
    expect(box).toMatchObject({ west: -180, east: 180, north: 90 });
    expect(isInBoundingBox({ lat: 89.95, lng: -140 }, box)).toBe(true);
  });

  it('refuses a negative radius', () => {
    expect(() => boundingBox({ lat: 0, lng: 0 }, -1)).toThrow(/radius/);
  });
});

describe('isInServiceArea', () => {
  it('counts the boundary as inside and one metre beyond as outside', () => {
    const center = { lat: 47.2692, lng: 11.4041 };
    const edge = { lat: 47.2692 + ((30_000 / R1) * 180) / Math.PI, lng: 11.4041 }; // 30 km due north
    const d = greatCircleDistanceM(center, edge);
    expect(d).toBeCloseTo(30_000, 6);
    expect(isInServiceArea(edge, center, d)).toBe(true);
    expect(isInServiceArea(edge, center, d - 1)).toBe(false);
  });
});

describe('travel time', () => {
  it('defaults to road factor 1.3 and 60 km/h (assumptions: common practice, no source)', () => {
    expect(DEFAULT_TRAVEL_ASSUMPTIONS).toEqual({ roadFactor: 1.3, averageSpeedKmh: 60 });
  });

  it('100 km straight line at factor 1.3 and 60 km/h is 130 km of road, 130 minutes — arithmetic', () => {
    expect(travelMinutesForDistance(100_000)).toBeCloseTo(130, 10);
    expect(travelMinutesForDistance(100_000, { roadFactor: 1.5, averageSpeedKmh: 90 })).toBeCloseTo((150 / 90) * 60, 10);
  });

  it('between two points it is their great-circle distance × factor ÷ speed', () => {
    const a = { lat: 48.1351, lng: 11.582 };
    const b = { lat: 47.2692, lng: 11.4041 };
    expect(travelMinutes(a, b, { roadFactor: 1.2, averageSpeedKmh: 50 })).toBeCloseTo(((greatCircleDistanceM(a, b) / 1000) * 1.2 * 60) / 50, 10);
  });
});
