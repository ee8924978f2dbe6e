// The Directory's search: which approved partners can do a service for this vehicle at this
// place, at what price and how soon. The partners, their offers, areas, travel policies and
// technicians' hours come from the in-memory search index (search-index.ts: one query to learn
// whether it is up to date), the catalogue and the active rules from memory too
// (search-catalogue.ts); the candidates' bookings are one query, whatever the number of partners.
// When nobody covers the place, the anonymous gap row is written.
import { DateTime } from 'luxon';
import {
  bestMatchScore,
  boundingBox,
  compareResults,
  evaluateEligibility,
  searchDateProblem,
  greatCircleDistanceM,
  MEAN_EARTH_RADIUS_M,
  MAX_SEARCH_RADIUS_KM,
  placeJob,
  SEARCH_SLOT_DAYS,
  vehicleClassOf,
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
import { LATITUDE_BANDS_PER_DEGREE, latitudeBands } from '../lib/sql-geo';
import { lowerBound } from '../lib/sorted';
import { recordGap } from './coverage.service';
import { searchCatalogue } from './search-catalogue';
import { searchIndexFor, type IndexedOffer, type IndexedPartner, type LogState, type SearchIndexCheck, type SearchIndexSnapshot } from './search-index';
import { firstSlots, type FirstSlot, type SlotJob } from './slots.service';
import { occupiedTimesWith, slotWindow } from './occupied-times';

const MINUTES_PER_DAY = 1440;
/** Searches run again at most this often while the index catches up with changes made meanwhile. */
const SEARCH_ATTEMPTS = 3;

/** A partner in reach that offers the service type and holds every required capability. */
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
  travelPolicy: IndexedPartner['policy'];
  technicians: IndexedOffer['technicians'];
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
 * Where a candidate would do the job, or null when it cannot: the domain's placeJob decides for
 * each place of work; the owner's radius is the owner's filter on the drive to a workshop. "any"
 * prefers the job at the owner's place when the partner can come.
 */
function placementOf(c: Candidate, place: GeoPoint, mode: SearchQuery['mode'], ownerRadiusKm: number): Placement | null {
  if (mode !== 'workshop') {
    const owner = placeJob(c, place, 'owner', c.currency);
    if (owner.possible) return { jobAt: 'owner', distanceKm: owner.distanceKm, travelFeeMinor: owner.travelFeeMinor };
  }
  if (mode !== 'mobile') {
    const workshop = placeJob(c, place, 'workshop', c.currency);
    if (workshop.possible && workshop.distanceKm <= ownerRadiusKm) return { jobAt: 'workshop', distanceKm: workshop.distanceKm, travelFeeMinor: 0 };
  }
  return null;
}

const roundKm = (km: number) => Math.round(km * 10) / 10;

/**
 * Approved partners that offer the service type, hold every one of `capabilityIds`, have their
 * base inside the box of MAX_SEARCH_RADIUS_KM around the place (from the index's latitude bands)
 * and are within reach of it in some mode: the place inside their radius, or their workshop
 * inside the owner's: a pre-filter, as km ≤ radius holds whenever placeJob's metres ≤ radius × 1000 do.
 * Fee, travel reach and the owner's mode are decided afterwards (placementOf).
 */
export function candidatesOf(index: SearchIndexSnapshot, serviceTypeId: number, capabilityIds: number[], place: GeoPoint, ownerRadiusKm: number): Candidate[] {
  const bands = index.byService.get(serviceTypeId);
  if (!bands) return [];
  // nobody further than the largest radius a partner comes within, or the owner's, can be in
  // reach: the box of that (at most MAX_SEARCH_RADIUS_KM) holds every candidate
  const reachKm = Math.min(MAX_SEARCH_RADIUS_KM, Math.max(index.maxComesKm.get(serviceTypeId) ?? 0, ownerRadiusKm));
  const box = boundingBox(place, reachKm * 1000);
  const candidates: Candidate[] = [];
  // the box's longitudes as ranges (two when it crosses the antimeridian)
  const ranges: [number, number][] = box.west <= box.east ? [[box.west, box.east]] : [[box.west, 180], [-180, box.east]];
  const at = { lat: 0, lng: 0 };
  for (const bandNo of latitudeBands(box)) {
    const band = bands.get(bandNo);
    if (!band) continue;
    const { lats, lngs, comesKm, hosts } = band;
    for (const [west, east] of ranges) {
      for (let i = lowerBound(lngs, west); i < lngs.length && lngs[i]! <= east; i++) {
        at.lat = lats[i]!;
        if (at.lat < box.south || at.lat > box.north) continue;
        at.lng = lngs[i]!;
        const straightKm = greatCircleDistanceM(at, place) / 1000;
        // in reach in some mode: the place inside its radius, or its workshop inside the owner's
        if (!(straightKm <= comesKm[i]! || (hosts[i] === 1 && straightKm <= ownerRadiusKm))) continue;
        const p = band.partners[i]!;
        let holdsAll = true;
        for (const id of capabilityIds) if (!p.capabilityIds.has(id)) holdsAll = false;
        if (!holdsAll) continue;
        const offer = p.offers.get(serviceTypeId)!;
        candidates.push({
          partnerId: p.partnerId,
          name: p.name,
          city: p.city,
          base: p.base,
          mode: p.mode,
          radiusKm: p.radiusKm,
          offerId: offer.offerId,
          currency: offer.currency,
          labourMinor: offer.labourMinor,
          partsMinor: offer.partsMinor,
          offerMinutes: offer.offerMinutes,
          travelPolicy: p.policy,
          technicians: offer.technicians,
        });
      }
    }
  }
  return candidates;
}

const NEAREST_COUNT = 3;
/** The least distance between two latitudes one band apart, km (along a meridian). */
const KM_PER_BAND = ((MEAN_EARTH_RADIUS_M / 1000) * Math.PI) / 180 / LATITUDE_BANDS_PER_DEGREE;

/**
 * Up to three approved partners offering the service type, nearest first (then by id), leaving
 * out `exclude`. The index's latitude bands are visited outwards from the place's own; a band k
 * bands away is at least (k − 1) band heights away, so the walk stops once that exceeds the third
 * nearest found.
 */
export function nearestOffering(index: SearchIndexSnapshot, serviceTypeId: number, place: GeoPoint, exclude: ReadonlySet<string>): SearchResponse['meta']['nearestOutside'] {
  const bands = index.byService.get(serviceTypeId);
  if (!bands?.size) return [];
  const home = Math.floor(place.lat * LATITUDE_BANDS_PER_DEGREE);
  const keys = [...bands.keys()];
  const reach = Math.max(...keys.map((k) => Math.abs(k - home)));
  const best: { p: { partnerId: string; name: string; city: string | null; base: GeoPoint }; km: number }[] = [];
  const before = (a: (typeof best)[number], b: (typeof best)[number]) => a.km - b.km || (a.p.partnerId < b.p.partnerId ? -1 : 1);
  for (let k = 0; k <= reach; k++) {
    if (best.length === NEAREST_COUNT && (k - 1) * KM_PER_BAND > best[NEAREST_COUNT - 1]!.km) break;
    for (const band of k ? [home - k, home + k] : [home]) {
      for (const p of bands.get(band)?.partners ?? []) {
        if (exclude.has(p.partnerId)) continue;
        best.push({ p, km: greatCircleDistanceM(p.base, place) / 1000 });
        best.sort(before);
        if (best.length > NEAREST_COUNT) best.pop();
      }
    }
  }
  return best.map(({ p, km }) => ({ partnerId: p.partnerId, name: p.name, city: p.city, baseLat: p.base.lat, baseLng: p.base.lng, distanceKm: roundKm(km) }));
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
  const dateProblem = q.date ? searchDateProblem(q.date, now) : null;
  if (dateProblem) throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'query.date', message: dateProblem }]);
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
    matchedCapabilities: [],
    nearestOutside: [],
    gapRecorded: false,
  };
  if (!eligibility.eligible) return { data: [], meta };

  const capabilities = eligibility.requiredCapabilities.map((code) => catalogue.capabilities.get(code));
  meta.matchedCapabilities = capabilities.filter((c) => c !== undefined).map((c) => ({ code: c.code, name: c.name }));
  // a rule may ask for a capability the catalogue does not have: nobody can hold it
  const capabilityIds = capabilities.every((c) => c !== undefined) ? capabilities.map((c) => Number(c!.id)) : null;
  const searchIndex = searchIndexFor(manager);
  // The index as last checked, and the check sent along with the bookings (or alone when there are
  // none to read): one round trip when nothing changed. When something did, the index catches up
  // and the search runs again; the last attempt trusts the index it has just brought up to date.
  for (let attempt = 1; ; attempt++) {
    const check = await searchIndex.check(manager);
    const answer = await answerFrom(check, attempt === SEARCH_ATTEMPTS);
    if (answer) return answer;
    await searchIndex.current(manager);
  }

  /** The answer from one state of the index, or null when the check shows the index was behind. */
  async function answerFrom(check: SearchIndexCheck, trust: boolean): Promise<SearchResponse | null> {
    const index = check.snapshot;
    const candidates = capabilityIds ? candidatesOf(index, serviceType!.id, capabilityIds, place, q.radiusKm) : [];

    // who covers the place at all (coverage), then who fits the owner's mode, price and date
    const covering = new Set<string>();
    let matches: Match[] = [];
    for (const c of candidates) {
      const anywhere = placementOf(c, place, 'any', q.radiusKm);
      if (!anywhere) continue;
      covering.add(c.partnerId);
      const placement = q.mode === 'any' ? anywhere : placementOf(c, place, q.mode, q.radiusKm);
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
      // every candidate technician's bookings in one query, over any window the slot searches below look at
      const window = slotWindow(now, Math.max(SEARCH_SLOT_DAYS, q.date ? Math.ceil((Date.parse(`${q.date}T00:00:00Z`) - now.getTime()) / 86_400_000) + 2 : 0));
      const technicianIds = matches.flatMap((m) => m.candidate.technicians.map((t) => t.id));
      const { busy, state } = await occupiedTimesWith<LogState>(manager, check, technicianIds, window.from, window.to, now);
      if (!check.isCurrent(state) && !trust) return null;
      const job = (m: Match, from: Date): SlotJob => {
        const base = m.candidate.base;
        const technicians = m.candidate.technicians.map((t) => ({ id: t.id, hours: t.hours, base, bookings: busy.get(t.id) ?? [] }));
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
            const zone = m.candidate.technicians[0]?.hours.timeZone;
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
      const data = rank(matches, q, now, (list) => fill(list, () => now, SEARCH_SLOT_DAYS));
      if (data.length) return { data, meta };
    } else {
      const [state] = await manager.query(check.sql, check.params);
      if (!check.isCurrent(state) && !trust) return null;
    }

    meta.nearestOutside = nearestOffering(index, serviceType!.id, place, covering);
    if (!covering.size) {
      await recordGap(manager, place, serviceType!.code, vehicleClassOf(vehicle));
      meta.gapRecorded = true;
    }
    return { data: [], meta };
  }
}

/**
 * Scores, orders and cuts the matches. The next slot is the costly part, so it is computed only
 * where it can change the page: for "best", a page-sized batch at a time in order of the best
 * score a match could reach with a slot right now, until no further match can beat the last one
 * on the page; for "distance" and "price" only for the page; for "soonest" (and with a date,
 * already done) for every match.
 */
function rank(matches: Match[], q: SearchQuery, now: Date, fillSlots: (list: Match[]) => void): SearchResult[] {
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
