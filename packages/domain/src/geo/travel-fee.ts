// What a mobile job's driving costs the customer, from the organisation's travel policy.
import { DomainInputError } from '../errors';
import { assertGeoPoint, greatCircleDistanceM, type GeoPoint } from './distance';
import { assertTravelAssumptions, DEFAULT_TRAVEL_ASSUMPTIONS, type TravelAssumptions } from './travel';

/** The parts of a travel policy the fee needs (integer minor units per km). */
export interface TravelFeePolicy {
  freeWithinKm: number;
  ratePerKmMinor: number;
  maxDistanceKm: number;
}

export interface TravelFee {
  /** Straight-line distance base → customer, km (not rounded). */
  straightKm: number;
  /** Estimated road distance one way, rounded up to whole km: straight line × road factor. */
  roadKm: number;
  /** Road km beyond the free distance. */
  chargeableKm: number;
  /** Chargeable km × rate, integer minor units; 0 when `withinReach` is false. */
  feeMinor: number;
  /** False when the road distance is beyond the policy's longest distance. */
  withinReach: boolean;
}

/**
 * Travel fee for a job at `customer` done from `base`. The rule, stated once for every screen
 * and the quote: the road distance is estimated as the great-circle distance × the road factor
 * (the same assumption the slot engine drives with), rounded up to whole kilometres (a started
 * kilometre counts, common practice, no source); the first `freeWithinKm` are free; every further
 * kilometre costs `ratePerKmMinor`. One way, once per job. The product of two integers needs
 * no rounding.
 */
export function travelFee(policy: TravelFeePolicy, base: GeoPoint, customer: GeoPoint, assumptions: TravelAssumptions = DEFAULT_TRAVEL_ASSUMPTIONS): TravelFee {
  assertGeoPoint(base, 'base');
  assertGeoPoint(customer, 'customer');
  return travelFeeForDistance(policy, greatCircleDistanceM(base, customer) / 1000, assumptions);
}

/** As `travelFee`, from a straight-line distance in km. */
export function travelFeeForDistance(policy: TravelFeePolicy, straightKm: number, assumptions: TravelAssumptions = DEFAULT_TRAVEL_ASSUMPTIONS): TravelFee {
  if (!Number.isFinite(straightKm) || straightKm < 0) throw new DomainInputError(`distance must be a finite number of km ≥ 0, got ${straightKm}`);
  if (!Number.isSafeInteger(policy.ratePerKmMinor) || policy.ratePerKmMinor < 0) throw new DomainInputError(`rate per km must be whole minor units ≥ 0, got ${policy.ratePerKmMinor}`);
  // whole km, as the travel policy form takes them: the fee counts started kilometres
  if (!Number.isSafeInteger(policy.freeWithinKm) || policy.freeWithinKm < 0) throw new DomainInputError(`free distance must be whole km ≥ 0, got ${policy.freeWithinKm}`);
  if (!Number.isSafeInteger(policy.maxDistanceKm) || policy.maxDistanceKm < 0) throw new DomainInputError(`longest distance must be whole km ≥ 0, got ${policy.maxDistanceKm}`);
  assertTravelAssumptions(assumptions);
  // a hair of float noise (e.g. 20.000000000004) must not start another kilometre
  const roadKm = Math.ceil(Number((straightKm * assumptions.roadFactor).toFixed(6)));
  const withinReach = roadKm <= policy.maxDistanceKm;
  const chargeableKm = Math.max(0, roadKm - policy.freeWithinKm);
  return { straightKm, roadKm, chargeableKm, feeMinor: withinReach ? chargeableKm * policy.ratePerKmMinor : 0, withinReach };
}
