// Geographic prefilters: "inside this bounding box" on two columns in SQL, so an index on
// (lat, lng) narrows the rows before the exact great-circle check in the domain; and the
// half-degree latitude bands the search index (and partner_profile.base_band) sorts bases into.
import type { BoundingBox } from '@emberline/domain';

/** Latitude bands of the search index (as partner_profile.base_band = FLOOR(base_lat × 2)). */
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
