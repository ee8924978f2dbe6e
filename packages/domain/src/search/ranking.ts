// Ranking of search results ("best match") and the anonymous location cell of a coverage gap.
import { MEAN_EARTH_RADIUS_M, type GeoPoint } from '../geo/distance';

/** Weights of the best-match score; they add up to 1. */
export const BEST_MATCH_WEIGHTS = Object.freeze({ distance: 0.35, price: 0.3, soonest: 0.2, rating: 0.15 });
/** A partner without reviews counts as this rating (out of 5) in the score: neither rewarded nor buried. */
export const NEUTRAL_RATING = 3.5;

export interface ScoreInput {
  distanceKm: number;
  /** The distance that scores 0 (the search radius, or the partner's reach). */
  maxDistanceKm: number;
  totalMinor: number;
  /** Cheapest total among the results in the same currency. */
  cheapestMinor: number;
  rating: number | null;
  /** Minutes from now to the next free slot; null when none in the window. */
  minutesToSlot: number | null;
  /** The slot window in minutes (a slot at its end scores 0). */
  windowMinutes: number;
}

const clamp01 = (v: number) => Math.min(1, Math.max(0, v));

/**
 * Best match, 0–1: 35 % nearness (1 at the place, 0 at the limit), 30 % price (cheapest total in
 * the currency ÷ this total), 20 % how soon (1 now, 0 at the end of the window or no slot) and
 * 15 % rating ((rating − 1) ÷ 4, unrated as 3.5). Our own weighting, documented in the
 * Directory's "how results are ordered" note; rounded to 4 decimals so ties are stable.
 */
export function bestMatchScore(s: ScoreInput): number {
  const w = BEST_MATCH_WEIGHTS;
  const distance = s.maxDistanceKm > 0 ? 1 - clamp01(s.distanceKm / s.maxDistanceKm) : 1;
  const price = s.totalMinor > 0 ? clamp01(s.cheapestMinor / s.totalMinor) : 1;
  const soonest = s.minutesToSlot === null || s.windowMinutes <= 0 ? 0 : 1 - clamp01(s.minutesToSlot / s.windowMinutes);
  const rating = clamp01(((s.rating ?? NEUTRAL_RATING) - 1) / 4);
  // a hair added so a float just under a half (0.51875 → 5187.4999…) rounds as written on paper
  return Math.round((w.distance * distance + w.price * price + w.soonest * soonest + w.rating * rating) * 10_000 + 1e-7) / 10_000;
}

export type SearchSort = 'best' | 'distance' | 'price' | 'soonest';

export interface Rankable {
  partnerId: string;
  score: number;
  distanceKm: number;
  totalMinor: number;
  nextSlot: { start: string } | null;
}

/** Order for each sort; ties fall back to distance, then the partner id, so pages are stable. */
export function compareResults(sort: SearchSort): (a: Rankable, b: Rankable) => number {
  const tie = (a: Rankable, b: Rankable) => a.distanceKm - b.distanceKm || (a.partnerId < b.partnerId ? -1 : a.partnerId > b.partnerId ? 1 : 0);
  const slot = (r: Rankable) => (r.nextSlot ? Date.parse(r.nextSlot.start) : Number.POSITIVE_INFINITY);
  switch (sort) {
    case 'best':
      return (a, b) => b.score - a.score || tie(a, b);
    case 'distance':
      return tie;
    case 'price':
      return (a, b) => a.totalMinor - b.totalMinor || tie(a, b);
    case 'soonest':
      return (a, b) => {
        const d = slot(a) - slot(b);
        return (Number.isNaN(d) ? 0 : d) || tie(a, b);
      };
  }
}

/** Side of a coverage-gap cell, km: places are kept only this coarsely. */
export const GAP_CELL_KM = 10;

/**
 * The centre of the ~10 km × 10 km cell a place lies in: latitude in steps of 10 km of meridian
 * arc on the mean sphere, longitude in steps that are 10 km wide at the cell's middle latitude.
 * Only this centre is stored for a search nobody answered, never the place itself.
 */
export function gapCell(point: GeoPoint, cellKm: number = GAP_CELL_KM): GeoPoint {
  const kmPerDegree = (MEAN_EARTH_RADIUS_M / 1000) * (Math.PI / 180);
  // whole numbers of rows and of columns per row, so the cells tile the globe without a sliver
  const rows = Math.max(1, Math.floor(180 / (cellKm / kmPerDegree)));
  const latStep = 180 / rows;
  const row = Math.min(Math.floor((point.lat + 90) / latStep), rows - 1);
  const lat = -90 + (row + 0.5) * latStep;
  const cols = Math.max(1, Math.floor((360 * Math.cos((lat * Math.PI) / 180)) / latStep));
  const lngStep = 360 / cols;
  const col = Math.min(Math.floor((point.lng + 180) / lngStep), cols - 1);
  const lng = -180 + (col + 0.5) * lngStep;
  return { lat: Math.round(lat * 10_000) / 10_000, lng: Math.round(lng * 10_000) / 10_000 };
}
