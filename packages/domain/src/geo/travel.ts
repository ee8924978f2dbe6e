// Estimated driving time between two points: great-circle distance stretched by a road factor.
import { DomainInputError } from '../errors';
import { greatCircleDistanceM, type GeoPoint } from './distance';

/** How the slot engine turns a straight-line distance into driving time. */
export interface TravelAssumptions {
  /** Road distance ÷ great-circle distance; 1 means driving in a straight line. */
  roadFactor: number;
  /** Average driving speed over the whole trip, km/h. */
  averageSpeedKmh: number;
}

/**
 * Defaults when an organisation has not set its own: roads about 30 % longer than the straight
 * line and 60 km/h on average across town and country roads (common practice, no source).
 */
export const DEFAULT_TRAVEL_ASSUMPTIONS: Readonly<TravelAssumptions> = Object.freeze({ roadFactor: 1.3, averageSpeedKmh: 60 });

/** Throws unless the road factor is at least 1 and the speed positive (both finite). */
export function assertTravelAssumptions(a: TravelAssumptions): void {
  if (!Number.isFinite(a.roadFactor) || a.roadFactor < 1) throw new DomainInputError(`road factor must be 1 or more, got ${a.roadFactor}`);
  if (!Number.isFinite(a.averageSpeedKmh) || a.averageSpeedKmh <= 0) throw new DomainInputError(`average speed must be more than 0 km/h, got ${a.averageSpeedKmh}`);
}

/** Driving minutes for a straight-line distance: distance × road factor ÷ average speed. */
export function travelMinutesForDistance(distanceM: number, assumptions: TravelAssumptions = DEFAULT_TRAVEL_ASSUMPTIONS): number {
  return ((distanceM / 1000) * assumptions.roadFactor * 60) / assumptions.averageSpeedKmh;
}

/** Driving minutes from `from` to `to` (not rounded). */
export function travelMinutes(from: GeoPoint, to: GeoPoint, assumptions: TravelAssumptions = DEFAULT_TRAVEL_ASSUMPTIONS): number {
  return travelMinutesForDistance(greatCircleDistanceM(from, to), assumptions);
}
