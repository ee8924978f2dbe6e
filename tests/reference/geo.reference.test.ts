// Reference checks for the geo helpers: the sphere with the IUGG mean radius against the WGS84
// ellipsoid as GeographicLib (geographiclib-geodesic, C. F. F. Karney) computes it.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Constants, Geodesic } from 'geographiclib-geodesic';
import { greatCircleDistanceM, MEAN_EARTH_RADIUS_M, type GeoPoint } from '../../packages/domain/src/geo';

/** A sphere of radius R1 stays within about 0.6 % of the WGS84 ellipsoid (Karney, GeographicLib documentation, "Geodesics on an ellipsoid"; checked here against geographiclib-geodesic). */
const TOLERANCE = 0.006;

const geodesicM = (a: GeoPoint, b: GeoPoint): number => Geodesic.WGS84.Inverse(a.lat, a.lng, b.lat, b.lng).s12!;
const deviation = (a: GeoPoint, b: GeoPoint): number => Math.abs(greatCircleDistanceM(a, b) - geodesicM(a, b)) / geodesicM(a, b);

const DEMO_CITIES: Record<string, GeoPoint> = {
  Innsbruck: { lat: 47.2692, lng: 11.4041 },
  Munich: { lat: 48.1351, lng: 11.582 },
  Tromsø: { lat: 69.6492, lng: 18.9553 },
  Östersund: { lat: 63.1792, lng: 14.6357 },
  Graz: { lat: 47.0707, lng: 15.4395 },
  Salzburg: { lat: 47.8095, lng: 13.055 },
  Roskilde: { lat: 55.6415, lng: 12.0803 },
  Linz: { lat: 48.3069, lng: 14.2858 },
};

describe('mean Earth radius', () => {
  it('R1 = (2a + b) / 3 of WGS84 (a and f as GeographicLib holds them) rounds to 6 371 008.8 m — IUGG mean radius', () => {
    const { a, f } = Constants.WGS84;
    const b = a * (1 - f);
    expect(Math.abs((2 * a + b) / 3 - MEAN_EARTH_RADIUS_M)).toBeLessThan(0.05);
  });
});

describe('great-circle distance against GeographicLib (WGS84 geodesics)', () => {
  it("the library reproduces its own example to the millimetre: Wellington (−41.32, 174.81) to Salamanca (40.96, −5.50) = 19 959 679.267 m — GeographicLib documentation", () => {
    const s12 = Geodesic.WGS84.Inverse(-41.32, 174.81, 40.96, -5.5).s12!;
    expect(Math.abs(s12 - 19_959_679.267)).toBeLessThan(0.0005);
  });

  it('Wellington to Salamanca on the sphere is within 0.6 % of 19 959 679.267 m — GeographicLib documentation (Karney), 0.6 % sphere tolerance', () => {
    const d = greatCircleDistanceM({ lat: -41.32, lng: 174.81 }, { lat: 40.96, lng: -5.5 });
    expect(Math.abs(d - 19_959_679.267) / 19_959_679.267).toBeLessThan(TOLERANCE);
  });

  it('every pair of demo cities is within 0.6 % of the WGS84 geodesic — geographiclib-geodesic Inverse', () => {
    const names = Object.keys(DEMO_CITIES);
    let worst = { pair: '', deviation: 0 };
    for (let i = 0; i < names.length; i++) {
      for (let j = i + 1; j < names.length; j++) {
        const d = deviation(DEMO_CITIES[names[i]!]!, DEMO_CITIES[names[j]!]!);
        if (d > worst.deviation) worst = { pair: `${names[i]}–${names[j]}`, deviation: d };
        expect(d, `${names[i]}–${names[j]}`).toBeLessThan(TOLERANCE);
      }
    }
    console.info(`geo reference: worst demo-city deviation ${(worst.deviation * 100).toFixed(3)} % (${worst.pair})`);
  });

  it('random point pairs anywhere on Earth are within 0.6 % of the WGS84 geodesic — geographiclib-geodesic Inverse (fast-check, 2000 pairs)', () => {
    const point = fc.record({
      lat: fc.double({ min: -90, max: 90, noNaN: true }),
      lng: fc.double({ min: -180, max: 180, noNaN: true }),
    });
    let worst = 0;
    fc.assert(
      fc.property(point, point, (a, b) => {
        // below a metre the relative error says nothing; the absolute one is what matters there
        const g = geodesicM(a, b);
        if (g < 1) return Math.abs(greatCircleDistanceM(a, b) - g) < 0.01;
        const d = deviation(a, b);
        worst = Math.max(worst, d);
        return d < TOLERANCE;
      }),
      { numRuns: 2000 },
    );
    console.info(`geo reference: worst random-pair deviation ${(worst * 100).toFixed(3)} %`);
  });

  it('short hops (up to ~50 km, the service-area scale) are within 0.6 % too — geographiclib-geodesic Inverse (fast-check)', () => {
    const hop = fc.record({
      lat: fc.double({ min: -80, max: 80, noNaN: true }),
      lng: fc.double({ min: -179, max: 179, noNaN: true }),
      dLat: fc.double({ min: -0.4, max: 0.4, noNaN: true }),
      dLng: fc.double({ min: -0.4, max: 0.4, noNaN: true }),
    });
    fc.assert(
      fc.property(hop, ({ lat, lng, dLat, dLng }) => {
        const a = { lat, lng };
        const b = { lat: lat + dLat, lng: lng + dLng };
        if (geodesicM(a, b) < 1) return true;
        return deviation(a, b) < TOLERANCE;
      }),
      { numRuns: 1000 },
    );
  });
});
