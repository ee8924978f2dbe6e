// Whether a partner can do a job at a place and what the drive costs: the one rule the search, the quote and the booking share.
import { DomainInputError } from '../errors';
import type { Currency } from '../schemas/offers';
import type { WorkMode } from '../schemas/onboarding';
import { assertGeoPoint, greatCircleDistanceM, isInServiceArea, type GeoPoint } from './distance';
import { travelFeeForDistance, type TravelFee, type TravelFeePolicy } from './travel-fee';

/** What of a partner decides where it works: base, mode, how far it comes (whole km) and its travel price. */
export interface PlacementPartner {
  base: GeoPoint;
  mode: WorkMode;
  /** How far the partner comes to customers, km; null when it does not come. */
  radiusKm: number | null;
  travelPolicy: (TravelFeePolicy & { currency: Currency }) | null;
}

/** Why a partner cannot do the job there, in the order they are checked. */
export type PlacementRefusal =
  /** the owner wants the partner to come, the partner works only at its workshop */
  | 'workshop-only'
  /** the owner wants to come to the workshop, the partner has none */
  | 'mobile-only'
  /** a job at the owner's place needs the place */
  | 'no-place'
  /** the place is beyond the partner's radius (or it has none) */
  | 'outside-area'
  /** no travel policy, or one in another currency than the offer's: the trip cannot be priced */
  | 'no-travel-price'
  /** the estimated road distance is longer than the policy's longest */
  | 'beyond-reach';

export interface JobPlacement<Distance extends number | null = number | null> {
  jobAt: 'owner' | 'workshop';
  /** True when the partner can do the job there; `reason` says why not. */
  possible: boolean;
  reason: PlacementRefusal | null;
  /** Straight-line km between the base and the place (not rounded); null when no place was given. */
  distanceKm: Distance;
  /** The drive to the owner's place, once the partner comes there and has a price for it (also when beyond reach). */
  travel: TravelFee | null;
  /** What the drive adds to the price, integer minor units: 0 at the workshop. */
  travelFeeMinor: number;
}

/**
 * Where `partner` would do a job priced in `currency`: at the owner's `place` when the place is
 * inside its radius (the boundary counts, as `isInServiceArea` says) and the road distance within
 * its travel policy's reach, with the fee of `travelFeeForDistance`; at its workshop when it has
 * one. The place may be null for a workshop job (nobody needs to say where the owner starts).
 */
export function placeJob(partner: PlacementPartner, place: GeoPoint, jobAt: 'owner' | 'workshop', currency: Currency): JobPlacement<number>;
export function placeJob(partner: PlacementPartner, place: GeoPoint | null, jobAt: 'owner' | 'workshop', currency: Currency): JobPlacement;
export function placeJob(partner: PlacementPartner, place: GeoPoint | null, jobAt: 'owner' | 'workshop', currency: Currency): JobPlacement {
  assertGeoPoint(partner.base, 'base');
  if (place) assertGeoPoint(place, 'place');
  if (partner.radiusKm !== null && !(Number.isFinite(partner.radiusKm) && partner.radiusKm >= 0)) throw new DomainInputError(`radius must be a finite number of km ≥ 0 or none, got ${partner.radiusKm}`);
  const distanceKm = place ? greatCircleDistanceM(partner.base, place) / 1000 : null;
  const refuse = (reason: PlacementRefusal, travel: TravelFee | null = null): JobPlacement => ({ jobAt, possible: false, reason, distanceKm, travel, travelFeeMinor: 0 });

  if (jobAt === 'workshop') {
    if (partner.mode === 'mobile') return refuse('mobile-only');
    return { jobAt, possible: true, reason: null, distanceKm, travel: null, travelFeeMinor: 0 };
  }
  if (partner.mode === 'workshop') return refuse('workshop-only');
  if (!place || distanceKm === null) return refuse('no-place');
  if (partner.radiusKm === null || !isInServiceArea(place, partner.base, partner.radiusKm * 1000)) return refuse('outside-area');
  const policy = partner.travelPolicy;
  if (!policy || policy.currency !== currency) return refuse('no-travel-price');
  const travel = travelFeeForDistance(policy, distanceKm);
  if (!travel.withinReach) return refuse('beyond-reach', travel);
  return { jobAt, possible: true, reason: null, distanceKm, travel, travelFeeMinor: travel.feeMinor };
}
