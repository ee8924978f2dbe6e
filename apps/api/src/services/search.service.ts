// The Directory's search: which approved partners can do a service for this vehicle at this
// place, at what price and how soon. A fixed number of queries whatever the number of partners:
// the candidates (with offer, parts total and travel policy) around the place, their
// technicians' hours and their bookings, after the catalogue and the active rules (from memory,
// see search-catalogue.ts); and when nobody covers the place, the nearest partners outside and
// the anonymous gap row.
import type { EntityManager } from 'typeorm';
import { DateTime } from 'luxon';
import {
  bestMatchScore,
  boundingBox,
  compareResults,
  evaluateEligibility,
  greatCircleDistanceM,
  MAX_SEARCH_RADIUS_KM,
  SEARCH_SLOT_DAYS,
  travelFee,
  vehicleClassOf,
  type CautionCode,
  type Currency,
  type GeoPoint,
  type SearchQuery,
  type SearchResponse,
  type SearchResult,
  type VehicleProfile,
  type WorkMode,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { ValidationFailed } from '../lib/errors';
import { boxCondition, latitudeBands, reachCondition } from '../lib/sql-geo';
import { recordGap } from './coverage.service';
import { APPROVED_PARTNER_SQL } from './partners.service';
import { searchCatalogue } from './search-catalogue';
import { firstSlots, offerTechnicians, type FirstSlot, type SlotJob } from './slots.service';
import { occupiedTimes, slotWindow } from './occupied-times';

const MINUTES_PER_DAY = 1440;

/** A partner in the bounding box that offers the service type and holds every required capability. */
interface Candidate {
  partnerId: string;
  name: string;
  city: string | null;
  base: GeoPoint;
  mode: WorkMode;
  radiusKm: number | null;
  offerId: string;
  currency: Currency;
  labourMinor: number;
  partsMinor: number;
  offerMinutes: number;
  policy: { freeWithinKm: number; ratePerKmMinor: number; maxDistanceKm: number; currency: Currency } | null;
}

/** Where and at what travel cost one candidate would do the job. */
interface Placement {
  jobAt: 'owner' | 'workshop';
  distanceKm: number;
  travelFeeMinor: number;
}

interface Match {
  candidate: Candidate;
  placement: Placement;
  totalMinor: number;
  durationMinutes: number;
  /** Distance that scores 0: the search radius for a workshop job, the partner's radius for a mobile one. */
  maxDistanceKm: number;
  slot?: FirstSlot | null;
}

const vehicleOf = (q: SearchQuery): VehicleProfile => ({
  model: q.model,
  fuel: q.fuel,
  factoryHeater: q.factoryHeater,
  climateControl: q.climateControl,
  electricalSystemV: q.electricalSystemV,
  year: q.year,
});

/**
 * Where a candidate would do the job, or null when it cannot. A mobile job needs the place inside
 * the partner's radius, a travel policy in the offer's currency and the road distance within the
 * policy's reach; a workshop job needs the base within the owner's radius. "any" prefers the job
 * at the owner's place when the partner can come.
 */
function placeJob(c: Candidate, place: GeoPoint, mode: SearchQuery['mode'], ownerRadiusKm: number): Placement | null {
  const straightKm = greatCircleDistanceM(c.base, place) / 1000;
  let owner: Placement | null = null;
  if (mode !== 'workshop' && (c.mode === 'mobile' || c.mode === 'both') && c.radiusKm !== null && straightKm <= c.radiusKm && c.policy && c.policy.currency === c.currency) {
    const fee = travelFee(c.policy, c.base, place);
    if (fee.withinReach) owner = { jobAt: 'owner', distanceKm: straightKm, travelFeeMinor: fee.feeMinor };
  }
  if (owner) return owner;
  if (mode !== 'mobile' && (c.mode === 'workshop' || c.mode === 'both') && straightKm <= ownerRadiusKm) return { jobAt: 'workshop', distanceKm: straightKm, travelFeeMinor: 0 };
  return null;
}

const roundKm = (km: number) => Math.round(km * 10) / 10;

/**
 * Approved partners that offer the service type, hold every one of `capabilityIds`, and may reach
 * the place: inside the fixed box of MAX_SEARCH_RADIUS_KM (index ranges over the latitude bands
 * it covers), and, row by row from the same index, inside the box of their own radius (mobile)
 * or of the owner's (workshop). The exact distance, fee and mode are decided afterwards, in the
 * domain. The index and the join order are fixed: with the OR of the two reaches the optimiser
 * otherwise estimates a full scan as cheaper (several times slower on 10,000 partners), and
 * joining the offer first drops the partners without one before anything else is read.
 */
async function loadCandidates(manager: EntityManager, serviceTypeId: number, capabilityIds: number[], place: GeoPoint, ownerRadiusKm: number): Promise<Candidate[]> {
  const box = boundingBox(place, MAX_SEARCH_RADIUS_KM * 1000);
  const inBox = boxCondition(box, 'p.base_lat', 'p.base_lng');
  const comes = reachCondition(place, 'p.base_lat', 'p.base_lng', 'p.radius_km');
  const hosts = boxCondition(boundingBox(place, ownerRadiusKm * 1000), 'p.base_lat', 'p.base_lng');
  const holdsAll = capabilityIds.length
    ? 'AND (SELECT COUNT(*) FROM organisation_capability oc WHERE oc.organisation_id = o.id AND oc.capability_id IN (?)) = ?'
    : '';
  const rows: {
    id: string;
    name: string;
    city: string | null;
    base_lat: number;
    base_lng: number;
    mode: WorkMode;
    radius_km: number | null;
    offer_id: string;
    price_minor: string | number;
    currency: Currency;
    duration_minutes: number;
    parts_minor: string | number;
    free_within_km: number | null;
    rate_per_km_minor: string | number | null;
    policy_currency: Currency | null;
    max_distance_km: number | null;
  }[] = await manager.query(
    `SELECT STRAIGHT_JOIN o.id, COALESCE(p.trading_name, o.name) AS name, p.city, p.base_lat, p.base_lng, p.mode, p.radius_km,
       f.id AS offer_id, f.price_minor, f.currency, f.duration_minutes,
       (SELECT COALESCE(SUM(op.quantity * pt.unit_price_minor), 0) FROM offer_part op JOIN part pt ON pt.id = op.part_id WHERE op.offer_id = f.id) AS parts_minor,
       tp.free_within_km, tp.rate_per_km_minor, tp.currency AS policy_currency, tp.max_distance_km
     FROM partner_profile p FORCE INDEX (ix_partner_profile_band)
     JOIN offer f ON f.organisation_id = p.organisation_id AND f.service_type_id = ?
     JOIN organisation o ON o.id = p.organisation_id
     LEFT JOIN travel_policy tp ON tp.organisation_id = p.organisation_id
     WHERE ${APPROVED_PARTNER_SQL} AND p.base_band IN (?) AND ${inBox.sql}
       AND ((p.mode <> 'workshop' AND p.radius_km IS NOT NULL AND ${comes.sql}) OR (p.mode <> 'mobile' AND ${hosts.sql}))
       ${holdsAll}`,
    [serviceTypeId, latitudeBands(box), ...inBox.params, ...comes.params, ...hosts.params, ...(capabilityIds.length ? [capabilityIds, capabilityIds.length] : [])],
  );
  return rows.map((r) => ({
    partnerId: r.id,
    name: r.name,
    city: r.city,
    base: { lat: Number(r.base_lat), lng: Number(r.base_lng) },
    mode: r.mode,
    radiusKm: r.radius_km === null ? null : Number(r.radius_km),
    offerId: r.offer_id,
    currency: r.currency,
    labourMinor: Number(r.price_minor),
    partsMinor: Number(r.parts_minor),
    offerMinutes: Number(r.duration_minutes),
    policy:
      r.free_within_km === null || r.policy_currency === null
        ? null
        : { freeWithinKm: Number(r.free_within_km), ratePerKmMinor: Number(r.rate_per_km_minor), maxDistanceKm: Number(r.max_distance_km), currency: r.policy_currency },
  }));
}

/** Boxes the nearest partners are looked for in, km: the search's own box, a wider one, then everywhere. */
const NEAREST_BOXES_KM = [MAX_SEARCH_RADIUS_KM, 1000, Number.POSITIVE_INFINITY];
const NEAREST_COUNT = 3;

/**
 * Up to three approved partners offering the service type, nearest first, leaving out `exclude`.
 * Looked for in growing boxes through the search index: the three nearest in a box are the three
 * nearest anywhere once the third is no further than the box's radius (so one indexed query, at
 * most three when the network is far away).
 */
async function nearestOffering(manager: EntityManager, serviceTypeId: number, place: GeoPoint, exclude: string[]): Promise<SearchResponse['meta']['nearestOutside']> {
  for (const km of NEAREST_BOXES_KM) {
    const box = Number.isFinite(km) ? boundingBox(place, km * 1000) : null;
    const inBox = box ? boxCondition(box, 'p.base_lat', 'p.base_lng') : null;
    // the haversine formula in SQL to order; the distance reported is the domain's
    const rows: { id: string; name: string; city: string | null; base_lat: number; base_lng: number }[] = await manager.query(
      `SELECT STRAIGHT_JOIN o.id, COALESCE(p.trading_name, o.name) AS name, p.city, p.base_lat, p.base_lng
       FROM partner_profile p${box ? ' FORCE INDEX (ix_partner_profile_band)' : ''}
       JOIN offer f ON f.organisation_id = p.organisation_id AND f.service_type_id = ?
       JOIN organisation o ON o.id = p.organisation_id
       WHERE ${APPROVED_PARTNER_SQL}${box ? ` AND p.base_band IN (?) AND ${inBox!.sql}` : ''}${exclude.length ? ' AND o.id NOT IN (?)' : ''}
       ORDER BY ASIN(SQRT(LEAST(1, POW(SIN(RADIANS(p.base_lat - ?) / 2), 2) + COS(RADIANS(?)) * COS(RADIANS(p.base_lat)) * POW(SIN(RADIANS(p.base_lng - ?) / 2), 2)))), o.id
       LIMIT ${NEAREST_COUNT}`,
      [serviceTypeId, ...(box ? [latitudeBands(box), ...inBox!.params] : []), ...(exclude.length ? [exclude] : []), place.lat, place.lat, place.lng],
    );
    const nearest = rows.map((r) => {
      const base = { lat: Number(r.base_lat), lng: Number(r.base_lng) };
      return { partnerId: r.id, name: r.name, city: r.city, exactKm: greatCircleDistanceM(base, place) / 1000, baseLat: base.lat, baseLng: base.lng };
    });
    if (!box || (nearest.length === NEAREST_COUNT && nearest[NEAREST_COUNT - 1]!.exactKm <= km)) {
      return nearest.map(({ exactKm, ...n }) => ({ ...n, distanceKm: roundKm(exactKm) }));
    }
  }
  return [];
}

/** The instant the local `date` starts in `zone`. */
const startOfLocalDate = (date: string, zone: string) => DateTime.fromISO(date, { zone }).startOf('day').toJSDate();

/**
 * Searches. A search that nobody can answer for this service, vehicle and place — whatever the
 * owner's mode, price and date filters — is recorded as an anonymous coverage gap; one emptied
 * only by those filters is not (partners are there), and neither is a service the vehicle is not
 * eligible for (the owner asked for the wrong service).
 */
export async function search(ctx: ServiceContext, q: SearchQuery, now: Date): Promise<SearchResponse> {
  if (q.maxPriceMinor !== undefined && !q.currency) {
    throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'query.currency', message: 'Choose the currency of the maximum price' }]);
  }
  const manager = ctx.manager;
  const place = { lat: q.lat, lng: q.lng };
  const vehicle = vehicleOf(q);
  const catalogue = await searchCatalogue(manager);
  const serviceType = catalogue.serviceTypes.get(q.serviceType);
  if (!serviceType) throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'query.serviceType', message: `There is no service type "${q.serviceType}" in the catalogue` }]);
  if (serviceType.retired) throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'query.serviceType', message: `The service type "${q.serviceType}" is no longer offered` }]);
  const eligibility = evaluateEligibility(serviceType, vehicle, catalogue.rules);
  const meta: SearchResponse['meta'] = {
    total: 0,
    serviceType: { code: serviceType.code, name: serviceType.name, cautions: serviceType.cautions },
    eligibility,
    nearestOutside: [],
    gapRecorded: false,
  };
  if (!eligibility.eligible) return { data: [], meta };

  const capabilities = eligibility.requiredCapabilities.map((code) => catalogue.capabilities.get(code));
  const matchedCapabilities = capabilities.filter((c) => c !== undefined).map((c) => ({ code: c.code, name: c.name }));
  // a rule may ask for a capability the catalogue does not have: nobody can hold it
  const candidates = capabilities.every((c) => c !== undefined)
    ? await loadCandidates(manager, serviceType.id, capabilities.map((c) => Number(c!.id)), place, q.radiusKm)
    : [];

  // who covers the place at all (coverage), then who fits the owner's mode, price and date
  const covering = new Set<string>();
  let matches: Match[] = [];
  for (const c of candidates) {
    if (!placeJob(c, place, 'any', q.radiusKm)) continue;
    covering.add(c.partnerId);
    const placement = placeJob(c, place, q.mode, q.radiusKm);
    if (!placement) continue;
    const totalMinor = c.labourMinor + c.partsMinor + placement.travelFeeMinor;
    if (q.maxPriceMinor !== undefined && (c.currency !== q.currency || totalMinor > q.maxPriceMinor)) continue;
    matches.push({
      candidate: c,
      placement,
      totalMinor,
      durationMinutes: c.offerMinutes + eligibility.extraMinutes,
      maxDistanceKm: placement.jobAt === 'workshop' ? q.radiusKm : (c.radiusKm ?? q.radiusKm),
    });
  }

  if (matches.length) {
    const teams = await offerTechnicians(manager, matches.map((m) => m.candidate.offerId));
    // every candidate technician's bookings in one query, over any window the slot searches below look at
    const window = slotWindow(now, Math.max(SEARCH_SLOT_DAYS, q.date ? Math.ceil((Date.parse(`${q.date}T00:00:00Z`) - now.getTime()) / 86_400_000) + 2 : 0));
    const busy = await occupiedTimes(manager, [...teams.values()].flat().map((t) => t.id), window.from, window.to, now);
    const job = (m: Match, from: Date): SlotJob => {
      const base = m.candidate.base;
      const technicians = (teams.get(m.candidate.offerId) ?? []).map((t) => ({ id: t.id, hours: t.hours, base, bookings: busy.get(t.id) ?? [] }));
      return { key: m.candidate.partnerId, technicians, customer: m.placement.jobAt === 'owner' ? place : base, durationMinutes: m.durationMinutes, from };
    };
    /** Fills in the next slot of the matches that have none yet, in as few engine runs as possible. */
    const fill = (list: Match[], from: (m: Match) => Date | null, days: number) => {
      const todo: Match[] = [];
      for (const m of list) {
        if (m.slot !== undefined) continue;
        // a job longer than a day, or a partner without hours, cannot be booked through the slot engine
        if (m.durationMinutes > MINUTES_PER_DAY || !from(m)) m.slot = null;
        else todo.push(m);
      }
      const found = firstSlots(
        todo.map((m) => job(m, from(m)!)),
        { now, days, place },
      );
      for (const m of todo) m.slot = found.get(m.candidate.partnerId) ?? null;
    };
    if (q.date) {
      const date = q.date;
      // that day in the partner's zone (its first technician's), from now on if it is today
      fill(
        matches,
        (m) => {
          const zone = teams.get(m.candidate.offerId)?.[0]?.hours.timeZone;
          if (!zone) return null;
          const dayStart = startOfLocalDate(date, zone);
          return dayStart.getTime() + MINUTES_PER_DAY * 60_000 <= now.getTime() ? null : dayStart > now ? dayStart : now;
        },
        1,
      );
      for (const m of matches) if (m.slot && !m.slot.localStart.startsWith(date)) m.slot = null;
      matches = matches.filter((m) => m.slot);
    }
    meta.total = matches.length;
    const data = rank(matches, q, now, (list) => fill(list, () => now, SEARCH_SLOT_DAYS), matchedCapabilities);
    if (data.length) return { data, meta };
  }

  meta.nearestOutside = await nearestOffering(manager, serviceType.id, place, [...covering]);
  if (!covering.size) {
    await recordGap(manager, place, serviceType.code, vehicleClassOf(vehicle));
    meta.gapRecorded = true;
  }
  return { data: [], meta };
}

/**
 * Scores, orders and cuts the matches. The next slot is the costly part, so it is computed only
 * where it can change the page: for "best", a page-sized batch at a time in order of the best
 * score a match could reach with a slot right now, until no further match can beat the last one
 * on the page; for "distance" and "price" only for the page; for "soonest" (and with a date,
 * already done) for every match.
 */
function rank(matches: Match[], q: SearchQuery, now: Date, fillSlots: (list: Match[]) => void, matchedCapabilities: SearchResult['matchedCapabilities']): SearchResult[] {
  const cheapest = new Map<Currency, number>();
  for (const m of matches) cheapest.set(m.candidate.currency, Math.min(cheapest.get(m.candidate.currency) ?? Number.POSITIVE_INFINITY, m.totalMinor));
  const windowMinutes = SEARCH_SLOT_DAYS * MINUTES_PER_DAY;
  const scoreOf = (m: Match, slot: FirstSlot | null) =>
    bestMatchScore({
      distanceKm: m.placement.distanceKm,
      maxDistanceKm: m.maxDistanceKm,
      totalMinor: m.totalMinor,
      cheapestMinor: cheapest.get(m.candidate.currency)!,
      rating: null,
      minutesToSlot: slot ? Math.max(0, (Date.parse(slot.start) - now.getTime()) / 60_000) : null,
      windowMinutes,
    });
  const toResult = (m: Match): SearchResult => {
    const c = m.candidate;
    const slot = m.slot ?? null;
    return {
      partnerId: c.partnerId,
      name: c.name,
      city: c.city,
      baseLat: c.base.lat,
      baseLng: c.base.lng,
      mode: c.mode,
      radiusKm: c.radiusKm,
      jobAt: m.placement.jobAt,
      distanceKm: roundKm(m.placement.distanceKm),
      currency: c.currency,
      labourMinor: c.labourMinor,
      partsMinor: c.partsMinor,
      travelFeeMinor: m.placement.travelFeeMinor,
      totalMinor: m.totalMinor,
      durationMinutes: m.durationMinutes,
      rating: null,
      reviewCount: 0,
      nextSlot: slot,
      matchedCapabilities,
      score: scoreOf(m, slot),
    };
  };
  // what compareResults needs before the slot is known
  const sketch = (m: Match, score: number) => ({ partnerId: m.candidate.partnerId, score, distanceKm: roundKm(m.placement.distanceKm), totalMinor: m.totalMinor, nextSlot: null, m });
  const order = compareResults(q.sort);

  if (q.sort === 'distance' || q.sort === 'price') {
    const page = matches.map((m) => sketch(m, 0)).sort(order).slice(0, q.limit).map((s) => s.m);
    fillSlots(page);
    return page.map(toResult);
  }
  if (q.sort === 'soonest' || q.date) {
    fillSlots(matches);
    return matches.map(toResult).sort(order).slice(0, q.limit);
  }

  // best: the score with a slot right now is an upper bound of the real score
  const bounded = matches.map((m) => sketch(m, scoreOf(m, { start: now.toISOString(), localStart: '', timeZone: 'UTC' }))).sort(order);
  const page: SearchResult[] = [];
  for (let i = 0; i < bounded.length; i += q.limit) {
    if (page.length >= q.limit && bounded[i]!.score < page[q.limit - 1]!.score) break;
    const batch = bounded.slice(i, i + q.limit).map((b) => b.m);
    fillSlots(batch);
    page.push(...batch.map(toResult));
    page.sort(order);
  }
  return page.slice(0, q.limit);
}
