// What a job with a partner would be and cost: the approved partner, its offer for the service
// type, whether the vehicle is eligible, where the work happens (travel fee from the partner's
// base), and the quote through the domain's computeQuote. The quote preview and the booking share
// it, so the owner books exactly what they were shown.
import type { EntityManager } from 'typeorm';
import { DateTime } from 'luxon';
import {
  computeQuote,
  evaluateEligibility,
  isValidVatId,
  placeJob,
  VatUndecidableError,
  type Cancellation,
  type Currency,
  type Deposit,
  type EligibilityResult,
  type FieldError,
  type GeoPoint,
  type JobPlacement,
  type Quote,
  type QuoteInput,
  type TravelFee,
  type VehicleProfile,
  type WorkingHours,
  type WorkMode,
} from '@emberline/domain';
import { ValidationFailed, VatUndecidable } from '../lib/errors';
import { activeRules } from './eligibility-rules.service';
import { json } from '../lib/json-column';
import { APPROVED_PARTNER_SQL } from './partners.service';
import { offerTechnicians } from './offer-technicians';
import type { QuoteSettings } from './network-settings';

export interface JobInput {
  partnerId: string;
  serviceType: string;
  vehicle: VehicleProfile;
  jobAt: 'owner' | 'workshop';
  /** The owner's place, for work there. */
  place?: { lat: number; lng: number };
  /** The country of the owner's place (ISO alpha-2). */
  placeCountry?: string;
}

/** Where each kind of problem is reported: query parameters for the preview, body fields for a booking. */
export interface FieldPaths {
  serviceType: string;
  jobAt: string;
  lat: string;
  lng: string;
}
export const QUERY_PATHS: FieldPaths = { serviceType: 'query.serviceType', jobAt: 'query.jobAt', lat: 'query.lat', lng: 'query.lng' };
export const BODY_PATHS: FieldPaths = { serviceType: 'serviceType', jobAt: 'jobAt', lat: 'address.lat', lng: 'address.lng' };

export interface KitLine {
  partId: string;
  name: string;
  quantity: number;
  unitPriceMinor: number;
}

export interface JobPlan {
  partner: { id: string; name: string; country: string | null; base: GeoPoint; mode: WorkMode; radiusKm: number | null; workshopAddress: string | null; autoConfirm: boolean };
  serviceType: { id: number; code: string; name: string };
  offer: { id: string; priceMinor: number; currency: Currency; durationMinutes: number; deposit: Deposit; cancellation: Cancellation };
  kit: KitLine[];
  partsMinor: number;
  eligibility: EligibilityResult;
  /** The offer's duration plus what the vehicle's rules add. */
  durationMinutes: number;
  jobAt: 'owner' | 'workshop';
  /** Where the work is done: the owner's place or the partner's base. */
  location: GeoPoint;
  travel: (TravelFee & { freeWithinKm: number }) | null;
  /** Where the work is physically done, for VAT; null when nobody said (the VAT rules decide whether that matters). */
  workCountry: string | null;
  /** Technicians on the offer with valid hours (the first one's zone dates the supply). */
  technicians: { id: string; hours: WorkingHours }[];
}

const invalid = (errors: FieldError[]) => ValidationFailed('Please correct the highlighted fields.', errors);

/** The field errors that say why the partner cannot do the job where the owner asked. */
function placementErrors(p: JobPlacement, radiusKm: number | null, maxDistanceKm: number, paths: FieldPaths): FieldError[] {
  const atPlace = (message: string) => [{ path: paths.lat, message }, { path: paths.lng, message }];
  switch (p.reason!) {
    case 'workshop-only':
      return [{ path: paths.jobAt, message: 'This partner works only at its workshop: choose the workshop' }];
    case 'mobile-only':
      return [{ path: paths.jobAt, message: 'This partner comes to you and has no workshop: choose your place' }];
    case 'no-place':
      return atPlace('Put the pin where the vehicle will be');
    case 'outside-area':
      return atPlace(`This place is outside the partner's service area (${radiusKm ?? 0} km around its base)`);
    case 'no-travel-price':
      return [{ path: paths.jobAt, message: 'This partner has no travel price yet: choose the workshop or another partner' }];
    case 'beyond-reach':
      return atPlace(`By road this place is about ${p.travel?.roadKm} km from the partner's base; they drive at most ${maxDistanceKm} km`);
  }
}

/**
 * Plans a job with an approved partner, or throws field errors (at `paths`) that say what does not
 * fit; `missingPartner` is thrown when the partner is not (or no longer) listed.
 */
export async function planJob(manager: EntityManager, input: JobInput, paths: FieldPaths, missingPartner: () => Error): Promise<JobPlan> {
  const [p]: {
    id: string;
    name: string;
    country: string | null;
    base_lat: number;
    base_lng: number;
    mode: WorkMode;
    radius_km: number | null;
    workshop_address: string | null;
    auto_confirm_bookings: number;
  }[] = await manager.query(
    `SELECT o.id, COALESCE(p.trading_name, o.name) AS name, p.country, p.base_lat, p.base_lng, p.mode, p.radius_km, p.workshop_address, o.auto_confirm_bookings
     FROM organisation o JOIN partner_profile p ON p.organisation_id = o.id WHERE ${APPROVED_PARTNER_SQL} AND o.id = ?`,
    [input.partnerId],
  );
  if (!p) throw missingPartner();
  const partner = {
    id: p.id,
    name: p.name,
    country: p.country,
    base: { lat: Number(p.base_lat), lng: Number(p.base_lng) },
    mode: p.mode,
    radiusKm: p.radius_km === null ? null : Number(p.radius_km),
    workshopAddress: p.workshop_address,
    autoConfirm: Boolean(Number(p.auto_confirm_bookings)),
  };

  const [offer]: { id: string; service_type_id: number; code: string; name: string; default_duration_minutes: number; price_minor: string | number; currency: Currency; duration_minutes: number; deposit: unknown; cancellation: unknown }[] =
    await manager.query(
      `SELECT f.id, f.service_type_id, st.code, st.name, st.default_duration_minutes, f.price_minor, f.currency, f.duration_minutes, f.deposit, f.cancellation
       FROM offer f JOIN service_type st ON st.id = f.service_type_id WHERE f.organisation_id = ? AND st.code = ? AND st.retired = 0`,
      [partner.id, input.serviceType],
    );
  if (!offer) throw invalid([{ path: paths.serviceType, message: `This partner does not offer "${input.serviceType}"` }]);

  const [required, held, rules, kitRows, policies, teams] = await Promise.all([
    manager.query('SELECT c.code FROM service_type_capability stc JOIN capability c ON c.id = stc.capability_id WHERE stc.service_type_id = ?', [offer.service_type_id]) as Promise<{ code: string }[]>,
    manager.query('SELECT c.code FROM organisation_capability oc JOIN capability c ON c.id = oc.capability_id WHERE oc.organisation_id = ?', [partner.id]) as Promise<{ code: string }[]>,
    activeRules(manager),
    manager.query(
      'SELECT op.part_id, op.quantity, pt.name, pt.unit_price_minor FROM offer_part op JOIN part pt ON pt.id = op.part_id WHERE op.offer_id = ? ORDER BY pt.name, pt.id',
      [offer.id],
    ) as Promise<{ part_id: string; quantity: number; name: string; unit_price_minor: string | number }[]>,
    manager.query('SELECT free_within_km, rate_per_km_minor, currency, max_distance_km FROM travel_policy WHERE organisation_id = ?', [partner.id]) as Promise<
      { free_within_km: number; rate_per_km_minor: string | number; currency: Currency; max_distance_km: number }[]
    >,
    offerTechnicians(manager, [offer.id]),
  ]);

  const eligibility = evaluateEligibility({ code: offer.code, defaultDurationMinutes: Number(offer.default_duration_minutes), requiredCapabilities: required.map((r) => r.code) }, input.vehicle, rules);
  if (!eligibility.eligible) {
    const block = eligibility.warnings.find((w) => w.severity === 'block');
    throw invalid([{ path: paths.serviceType, message: block?.message ?? 'This service does not fit this vehicle' }]);
  }
  const holds = new Set(held.map((h) => h.code));
  const missing = eligibility.requiredCapabilities.filter((c) => !holds.has(c));
  if (missing.length) throw invalid([{ path: paths.serviceType, message: `For this vehicle the job needs equipment this partner does not list: ${missing.join(', ')}` }]);

  const policy = policies[0];
  const travelPolicy = policy ? { freeWithinKm: Number(policy.free_within_km), ratePerKmMinor: Number(policy.rate_per_km_minor), maxDistanceKm: Number(policy.max_distance_km), currency: policy.currency } : null;
  const place = input.jobAt === 'owner' && input.place ? { lat: input.place.lat, lng: input.place.lng } : null;
  const placement = placeJob({ base: partner.base, mode: partner.mode, radiusKm: partner.radiusKm, travelPolicy }, place, input.jobAt, offer.currency);
  if (!placement.possible) throw invalid(placementErrors(placement, partner.radiusKm, travelPolicy?.maxDistanceKm ?? 0, paths));
  // a job at the owner's place is possible only with the place; at the workshop the work is done
  // in the partner's own country, but never take that country for the owner's place: across a
  // border it would be the wrong VAT
  const location: GeoPoint = place ?? partner.base;
  const travel: JobPlan['travel'] = placement.travel && travelPolicy ? { ...placement.travel, freeWithinKm: travelPolicy.freeWithinKm } : null;
  const workCountry = place ? (input.placeCountry ?? null) : partner.country;

  const kit = kitRows.map((k) => ({ partId: k.part_id, name: k.name, quantity: Number(k.quantity), unitPriceMinor: Number(k.unit_price_minor) }));
  return {
    partner,
    serviceType: { id: Number(offer.service_type_id), code: offer.code, name: offer.name },
    offer: {
      id: offer.id,
      priceMinor: Number(offer.price_minor),
      currency: offer.currency,
      durationMinutes: Number(offer.duration_minutes),
      deposit: json<Deposit>(offer.deposit),
      cancellation: json<Cancellation>(offer.cancellation),
    },
    kit,
    partsMinor: kit.reduce((sum, k) => sum + k.quantity * k.unitPriceMinor, 0),
    eligibility,
    durationMinutes: Number(offer.duration_minutes) + eligibility.extraMinutes,
    jobAt: input.jobAt,
    location,
    travel,
    workCountry,
    technicians: teams.get(offer.id) ?? [],
  };
}

/** The local date (YYYY-MM-DD) of `at` in `zone`: the day of the supply, which picks the VAT rate. */
export const localDate = (at: Date, zone: string) => DateTime.fromJSDate(at, { zone }).toISODate()!;

/**
 * The quote of a planned job: labour, the parts kit and the travel, with VAT by the domain's case
 * table; 422 VAT_UNDECIDABLE when a country it needs is missing, rather than a guessed one.
 */
export function quoteFor(plan: JobPlan, settings: QuoteSettings, o: { vatId?: string | null; supplyDate: string }): Quote {
  const lines: QuoteInput['lines'][number][] = [{ kind: 'labour', description: plan.serviceType.name, netMinor: plan.offer.priceMinor }];
  if (plan.kit.length) lines.push({ kind: 'parts', description: `Parts kit (${plan.kit.reduce((n, k) => n + k.quantity, 0)} pieces)`, netMinor: plan.partsMinor });
  if (plan.travel) lines.push({ kind: 'travel', description: `Travel, ${plan.travel.roadKm} km by road (${plan.travel.freeWithinKm} km free)`, netMinor: plan.travel.feeMinor });
  try {
    return computeQuote({
      currency: plan.offer.currency,
      lines,
      workCountry: plan.workCountry,
      supplierCountry: plan.partner.country,
      customer: o.vatId ? { kind: 'business', vatId: o.vatId } : { kind: 'consumer' },
      supplyDate: o.supplyDate,
      deposit: plan.offer.deposit,
      cancellation: plan.offer.cancellation,
      commissionBp: settings.commissionBp,
      processingFee: settings.processingFee,
    });
  } catch (err) {
    if (err instanceof VatUndecidableError) throw VatUndecidable(VAT_UNDECIDABLE_DETAIL[err.reason]);
    throw err;
  }
}

const VAT_UNDECIDABLE_DETAIL: Record<VatUndecidableError['reason'], string> = {
  'work-country-missing': 'Say in which country the vehicle will be (the country of the address): for a private customer the VAT is that of the country where the work is done.',
  'supplier-country-missing': 'This partner has not said in which country it is established, so the VAT cannot be worked out. Choose another partner.',
  'customer-country-missing': 'The VAT ID does not say which country the business is in.',
  'country-unknown': 'There are no VAT rates for this country, so no price can be given there.',
};

/** Checks a VAT ID given as a query parameter (the booking's schema checks its own). */
export function checkVatId(vatId: string | undefined, path: string): void {
  if (vatId && !isValidVatId(vatId.replace(/[\s.-]/g, '').toUpperCase())) throw invalid([{ path, message: 'This VAT ID does not have a valid format for its country' }]);
}
