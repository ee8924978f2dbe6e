// The search index's lookups against a plain scan of every partner: the latitude bands and the
// longitude order (binary search) must find exactly the partners a scan finds, near the
// antimeridian and far north too, and the nearest-partner walk over the bands exactly the three
// a full sort gives. Distances are the domain's great-circle distance (itself checked against
// GeographicLib in tests/unit/domain).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { boundingBox, greatCircleDistanceM, isInBoundingBox, MAX_SEARCH_RADIUS_KM, type GeoPoint, type WorkMode } from '../../../packages/domain/src';
import { snapshotOf, type IndexedOffer, type IndexedPartner } from '../../../apps/api/src/services/search-index';
import { candidatesOf, nearestOffering } from '../../../apps/api/src/services/search.service';

const SERVICE = 7;
const OTHER_SERVICE = 8;
const MODES: WorkMode[] = ['mobile', 'workshop', 'both'];

const offer = (serviceTypeId: number): IndexedOffer => ({ offerId: `offer-${serviceTypeId}`, serviceTypeId, currency: 'EUR', labourMinor: 5000, partsMinor: 0, offerMinutes: 60, technicians: [] });

/** Bases clustered where bands and longitude ranges have edges: around a place, the antimeridian, the far north. */
const pointNear = (centre: GeoPoint) =>
  fc.record({ dLat: fc.double({ min: -4, max: 4, noNaN: true }), dLng: fc.double({ min: -8, max: 8, noNaN: true }) }).map(({ dLat, dLng }) => ({
    lat: Math.max(-89.9, Math.min(89.9, centre.lat + dLat)),
    lng: ((centre.lng + dLng + 540) % 360) - 180,
  }));

const CENTRES: GeoPoint[] = [
  { lat: 48.2, lng: 16.37 },
  { lat: -16.5, lng: 179.9 },
  { lat: 78.2, lng: 15.6 },
  { lat: 0, lng: -179.5 },
];

const scenario = fc.constantFrom(...CENTRES).chain((centre) =>
  fc.record({
    place: pointNear(centre),
    ownerRadiusKm: fc.integer({ min: 5, max: MAX_SEARCH_RADIUS_KM }),
    partners: fc.array(
      fc.record({
        base: pointNear(centre),
        mode: fc.constantFrom(...MODES),
        radiusKm: fc.integer({ min: 5, max: 400 }),
        services: fc.subarray([SERVICE, OTHER_SERVICE], { minLength: 1 }),
        capabilities: fc.subarray([1, 2, 3]),
      }),
      { maxLength: 120 },
    ),
  }),
);

function build(partners: { base: GeoPoint; mode: WorkMode; radiusKm: number; services: number[]; capabilities: number[] }[]): Map<string, IndexedPartner> {
  return new Map(
    partners.map((p, i) => {
      const id = `p-${String(i).padStart(3, '0')}`;
      return [
        id,
        {
          partnerId: id,
          name: id,
          city: null,
          base: p.base,
          band: Math.floor(p.base.lat * 2),
          mode: p.mode,
          radiusKm: p.mode === 'workshop' ? null : p.radiusKm,
          capabilityIds: new Set(p.capabilities),
          policy: null,
          offers: new Map(p.services.map((s) => [s, offer(s)])),
        },
      ];
    }),
  );
}

describe('search index lookups', () => {
  it('finds the same candidates as a scan of every partner', () => {
    fc.assert(
      fc.property(scenario, fc.subarray([1, 2, 3], { maxLength: 2 }), ({ place, ownerRadiusKm, partners }, required) => {
        const all = build(partners);
        const box = boundingBox(place, MAX_SEARCH_RADIUS_KM * 1000);
        const expected = [...all.values()]
          .filter((p) => p.offers.has(SERVICE) && required.every((c) => p.capabilityIds.has(c)) && isInBoundingBox(p.base, box))
          .filter((p) => {
            const km = greatCircleDistanceM(p.base, place) / 1000;
            return (p.mode !== 'workshop' && p.radiusKm !== null && km <= p.radiusKm) || (p.mode !== 'mobile' && km <= ownerRadiusKm);
          })
          .map((p) => p.partnerId)
          .sort();
        const found = candidatesOf(snapshotOf(all), SERVICE, required, place, ownerRadiusKm).map((c) => c.partnerId).sort();
        expect(found).toEqual(expected);
      }),
      { numRuns: 300 },
    );
  });

  it('finds the same three nearest partners as sorting every partner by distance', () => {
    fc.assert(
      fc.property(scenario, fc.integer({ min: 0, max: 10 }), ({ place, partners }, excluded) => {
        const all = build(partners);
        const exclude = new Set([...all.keys()].slice(0, excluded));
        const expected = [...all.values()]
          .filter((p) => p.offers.has(SERVICE) && !exclude.has(p.partnerId))
          .map((p) => ({ id: p.partnerId, km: greatCircleDistanceM(p.base, place) / 1000 }))
          .sort((a, b) => a.km - b.km || (a.id < b.id ? -1 : 1))
          .slice(0, 3)
          .map((p) => p.id);
        expect(nearestOffering(snapshotOf(all), SERVICE, place, exclude).map((n) => n.partnerId)).toEqual(expected);
      }),
      { numRuns: 300 },
    );
  });
});
