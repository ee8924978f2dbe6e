// Distances on the Earth as a sphere: great-circle distance, a bounding box for a radius, service areas.
import { DomainInputError } from '../errors';

/** A point in WGS84 degrees, the way the apps and the database store bases and customers. */
export interface GeoPoint {
  lat: number;
  lng: number;
}

/**
 * Mean Earth radius R1 = (2a + b) / 3 of the GRS80/WGS84 ellipsoid, 6 371 008.8 m (IUGG).
 * Distances on this sphere are within about 0.6 % of the ellipsoidal (geodesic) ones.
 */
export const MEAN_EARTH_RADIUS_M = 6_371_008.8;

const RAD = Math.PI / 180;

/** Throws when a point is not a finite latitude in [−90, 90] and longitude in [−180, 180]. */
export function assertGeoPoint(point: GeoPoint, label = 'point'): void {
  if (!Number.isFinite(point.lat) || point.lat < -90 || point.lat > 90) throw new DomainInputError(`${label}: latitude must be between −90 and 90, got ${point.lat}`);
  if (!Number.isFinite(point.lng) || point.lng < -180 || point.lng > 180) throw new DomainInputError(`${label}: longitude must be between −180 and 180, got ${point.lng}`);
}

/**
 * Great-circle distance in metres by the haversine formula, which stays accurate for short
 * distances (where the spherical law of cosines loses digits) and is exact on the sphere.
 */
export function greatCircleDistanceM(a: GeoPoint, b: GeoPoint, radiusM: number = MEAN_EARTH_RADIUS_M): number {
  const phi1 = a.lat * RAD;
  const phi2 = b.lat * RAD;
  const sinHalfDPhi = Math.sin((phi2 - phi1) / 2);
  const sinHalfDLambda = Math.sin(((b.lng - a.lng) * RAD) / 2);
  const h = sinHalfDPhi * sinHalfDPhi + Math.cos(phi1) * Math.cos(phi2) * sinHalfDLambda * sinHalfDLambda;
  // rounding can push h a hair above 1 for antipodal points
  return 2 * radiusM * Math.asin(Math.sqrt(Math.min(1, h)));
}

/**
 * Latitude/longitude limits enclosing every point within `radiusM` of `center` (on the same
 * sphere), for a cheap index prefilter before the exact distance check. When the box crosses
 * the antimeridian, `west > east`: match `lng >= west OR lng <= east`. Near a pole the box
 * spans all longitudes.
 */
export interface BoundingBox {
  south: number;
  west: number;
  north: number;
  east: number;
}

export function boundingBox(center: GeoPoint, radiusM: number, earthRadiusM: number = MEAN_EARTH_RADIUS_M): BoundingBox {
  if (!(radiusM >= 0)) throw new RangeError(`radius must be zero or more metres, got ${radiusM}`);
  const angular = radiusM / earthRadiusM;
  const south = center.lat - angular / RAD;
  const north = center.lat + angular / RAD;
  if (south <= -90 || north >= 90 || angular >= Math.PI) {
    // the circle reaches a pole: every longitude is within reach
    return { south: Math.max(south, -90), west: -180, north: Math.min(north, 90), east: 180 };
  }
  // Widest longitude offset of the circle, reached at the latitude of its tangent meridians
  // (bounding coordinates on a sphere; the sine ratio stays below 1 because no pole is inside).
  const dLng = Math.asin(Math.min(1, Math.sin(angular) / Math.cos(center.lat * RAD))) / RAD;
  if (dLng >= 180) return { south, west: -180, north, east: 180 };
  return { south, west: wrapLongitude(center.lng - dLng), north, east: wrapLongitude(center.lng + dLng) };
}

/** True when the point lies in the box, antimeridian-crossing boxes included. */
export function isInBoundingBox(point: GeoPoint, box: BoundingBox): boolean {
  if (point.lat < box.south || point.lat > box.north) return false;
  return box.west <= box.east ? point.lng >= box.west && point.lng <= box.east : point.lng >= box.west || point.lng <= box.east;
}

/** True when `point` is within `radiusM` of the area's centre (the boundary counts as inside). */
export function isInServiceArea(point: GeoPoint, center: GeoPoint, radiusM: number): boolean {
  return greatCircleDistanceM(center, point) <= radiusM;
}

function wrapLongitude(lng: number): number {
  if (lng < -180) return lng + 360;
  if (lng > 180) return lng - 360;
  return lng;
}
