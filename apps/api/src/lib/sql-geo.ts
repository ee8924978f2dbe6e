// SQL for geographic prefilters: "inside this bounding box" on two columns, so an index on
// (lat, lng) narrows the rows before the exact great-circle check in the domain.
import { MEAN_EARTH_RADIUS_M, type BoundingBox, type GeoPoint } from '@emberline/domain';

/** Latitude bands of the search index (partner_profile.base_band = FLOOR(base_lat × 2)). */
export const LATITUDE_BANDS_PER_DEGREE = 2;

/** The bands a box covers, for `base_band IN (?)`. */
export function latitudeBands(box: BoundingBox): number[] {
  const bands: number[] = [];
  for (let b = Math.floor(box.south * LATITUDE_BANDS_PER_DEGREE); b <= Math.floor(box.north * LATITUDE_BANDS_PER_DEGREE); b++) bands.push(b);
  return bands;
}

/** The condition and its parameters; a box crossing the antimeridian (west > east) matches either side. */
export function boxCondition(box: BoundingBox, lat: string, lng: string): { sql: string; params: number[] } {
  const longitude = box.west <= box.east ? `${lng} BETWEEN ? AND ?` : `(${lng} >= ? OR ${lng} <= ?)`;
  return { sql: `${lat} BETWEEN ? AND ? AND ${longitude}`, params: [box.south, box.north, box.west, box.east] };
}

const KM_PER_DEGREE = ((MEAN_EARTH_RADIUS_M / 1000) * Math.PI) / 180;
/** The radius is widened by a millionth so rounding never drops a point on the edge. */
const WIDEN = 1.000001;
/** A number as an SQL double literal: a plain decimal literal would make MariaDB compute in slow DECIMAL arithmetic. */
const double = (v: number) => v.toExponential();

/**
 * SQL true for every row whose point lies within `radiusColumn` km (a column: each row its own
 * radius) of `center`: the bounding box of that circle, row by row — latitude within r ÷ km per
 * degree; longitude within asin(sin(r/R) ÷ cos φ) either way round the antimeridian, or any
 * longitude when the circle reaches a pole (bounding coordinates on a sphere). A prefilter: rows
 * just outside pass too, and the exact great-circle check in the domain decides. The constants
 * are folded here so the database does one multiplication, and the trigonometry only for rows
 * whose latitude is in reach.
 */
export function reachCondition(center: GeoPoint, lat: string, lng: string, radiusColumn: string): { sql: string; params: number[] } {
  const degrees = `(${radiusColumn} * ${double(WIDEN / KM_PER_DEGREE)})`;
  const angle = `(${radiusColumn} * ${double((WIDEN * 1000) / MEAN_EARTH_RADIUS_M)})`;
  const cosLat = Math.cos((center.lat * Math.PI) / 180);
  const sql = `(ABS(${lat} - ?) <= ${degrees} AND (${degrees} >= ? OR ${degrees} >= ?
    OR LEAST(ABS(${lng} - ?), 360 - ABS(${lng} - ?)) <= DEGREES(ASIN(LEAST(1, SIN(${angle}) / ${double(cosLat)})))))`;
  // reaching a pole: lat + degrees >= 90, lat - degrees <= -90
  return { sql, params: [center.lat, 90 - center.lat, 90 + center.lat, center.lng, center.lng] };
}
