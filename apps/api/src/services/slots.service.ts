// Bookable start times of an approved partner for one service type at the customer's location:
// the offer's duration, the technicians assigned to it with their working hours and the bookings
// that occupy them, and the organisation's base, through the pure slot engine.
import {
  computeSlots,
  isInServiceArea,
  SLOT_LIST_LIMIT,
  type GeoPoint,
  type PartnerSlots,
  type SlotTechnician,
  type SlotsQuery,
} from '@emberline/domain';
import { DateTime } from 'luxon';
import type { ServiceContext } from '../lib/context';
import { NotFound, ValidationFailed } from '../lib/errors';
import { approvedPartnersQuery } from './partners.service';
import { occupiedTimes, slotWindow } from './occupied-times';
import { offerTechnicians } from './offer-technicians';

export async function partnerSlots(ctx: ServiceContext, partnerId: string, q: SlotsQuery, now: Date): Promise<PartnerSlots> {
  const partner: { id: string; base_lat: number; base_lng: number; radius_km: number | null } | undefined = await approvedPartnersQuery(ctx.manager)
    .andWhere('o.id = :partnerId', { partnerId })
    .select(['o.id AS id', 'p.base_lat AS base_lat', 'p.base_lng AS base_lng', 'p.radius_km AS radius_km'])
    .getRawOne();
  if (!partner) throw NotFound('There is no such partner.');
  const base = { lat: Number(partner.base_lat), lng: Number(partner.base_lng) };
  const customer = { lat: q.lat, lng: q.lng };
  // a workshop-only partner has no radius: the customer comes to the base
  const radiusM = partner.radius_km === null ? 0 : Number(partner.radius_km) * 1000;
  if (!isInServiceArea(customer, base, radiusM)) {
    const message = `This place is outside the partner's service area (${partner.radius_km ?? 0} km around its base)`;
    throw ValidationFailed('Please correct the highlighted fields.', [
      { path: 'query.lat', message },
      { path: 'query.lng', message },
    ]);
  }
  const [offer]: { id: string; duration_minutes: number }[] = await ctx.manager.query(
    'SELECT o.id, o.duration_minutes FROM offer o JOIN service_type st ON st.id = o.service_type_id WHERE o.organisation_id = ? AND st.code = ? AND st.retired = 0',
    [partner.id, q.serviceType],
  );
  if (!offer) throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'query.serviceType', message: `This partner does not offer "${q.serviceType}"` }]);
  const team = (await offerTechnicians(ctx.manager, [offer.id])).get(offer.id) ?? [];
  const durationMinutes = Number(offer.duration_minutes);
  const empty = { partnerId: partner.id, serviceTypeCode: q.serviceType, durationMinutes, organisation: [], technicians: [], truncated: false };
  if (!team.length) return { ...empty, timeZone: 'UTC' };
  const from = q.from && Date.parse(q.from) > now.getTime() ? q.from : now;
  const window = slotWindow(new Date(from), q.days);
  const busy = await occupiedTimes(ctx.manager, team.map((t) => t.id), window.from, window.to, now);
  const technicians: SlotTechnician[] = team.map((t) => ({ ...t, base, bookings: busy.get(t.id) ?? [] }));
  const result = computeSlots({ technicians, durationMinutes, customer, now, from, days: q.days });
  const cut = <T>(list: T[]) => list.slice(0, SLOT_LIST_LIMIT);
  return {
    ...empty,
    timeZone: result.timeZone,
    organisation: cut(result.organisation),
    technicians: result.technicians.map((t) => ({ ...t, slots: cut(t.slots) })),
    truncated: result.organisation.length > SLOT_LIST_LIMIT || result.technicians.some((t) => t.slots.length > SLOT_LIST_LIMIT),
  };
}


/** The earliest bookable start of a job, with the zone its local time is written in. */
export interface FirstSlot {
  start: string;
  localStart: string;
  timeZone: string;
}

/** One partner's job for `firstSlots`: its technicians (the first one's zone labels the slot), where, how long, from when. */
export interface SlotJob {
  key: string;
  technicians: readonly SlotTechnician[];
  /** Where the job happens: the owner's place, or the workshop. */
  customer: GeoPoint;
  durationMinutes: number;
  from: Date;
}

const samePoint = (a: GeoPoint, b: GeoPoint) => a.lat === b.lat && a.lng === b.lng;

/**
 * A job in which nobody drives — every technician starts at the job's place and every booking in
 * their calendars is there too (a workshop and its technicians) — has the same slots wherever that
 * place is, so it is moved to `place` to share the engine run of the jobs there.
 */
function relocated(job: SlotJob, place: GeoPoint): SlotJob {
  if (samePoint(job.customer, place)) return job;
  const still = job.technicians.every((t) => samePoint(t.base, job.customer) && (t.bookings ?? []).every((b) => samePoint(b.location, job.customer)));
  if (!still) return job;
  return {
    ...job,
    customer: place,
    technicians: job.technicians.map((t) => ({ ...t, base: place, bookings: (t.bookings ?? []).map((b) => ({ ...b, location: place })) })),
  };
}

/**
 * Days searched before the whole window: today, then three days (for an evening or a weekend),
 * as most partners have a free start within them and a short search is much cheaper than a long one.
 */
const EARLY_PASS_DAYS = [1, 3];

/**
 * The earliest start of many partners' jobs, each the first of the partner's organisation slots
 * (as its slot list shows them), or null within `days` local days from the job's `from`. Jobs at
 * the same place, of the same length and start share one engine run, so the time-zone work is
 * done once for all the partners coming to the owner rather than once per partner (a workshop job
 * is at its own base, so it runs alone — unless nothing in it moves, see `relocated`). The
 * `EARLY_PASS_DAYS` are searched first: the engine's starts on those days do not depend on how
 * many days follow (it always looks into the day after the search for jobs that run late), so a
 * start found there is the earliest.
 */
export function firstSlots(jobs: readonly SlotJob[], q: { now: Date; days: number; place?: GeoPoint }): Map<string, FirstSlot | null> {
  const found = new Map<string, FirstSlot | null>();
  const groups = new Map<string, SlotJob[]>();
  for (const original of jobs) {
    if (!original.technicians.length) {
      found.set(original.key, null);
      continue;
    }
    const job = q.place ? relocated(original, q.place) : original;
    const key = `${job.customer.lat}|${job.customer.lng}|${job.durationMinutes}|${job.from.getTime()}`;
    groups.set(key, [...(groups.get(key) ?? []), job]);
  }
  const run = (group: SlotJob[], days: number) => {
    // a technician may work for two partners: the engine needs ids unique within the run
    const owner: SlotJob[] = [];
    const technicians = group.flatMap((job) => job.technicians.map((t) => (owner.push(job), { ...t, id: `${owner.length - 1}` })));
    const first = group[0]!;
    // only each technician's first start is used
    const result = computeSlots({ technicians, durationMinutes: first.durationMinutes, customer: first.customer, now: q.now, from: first.from, days, maxSlotsPerTechnician: 1 });
    const earliest = new Map<SlotJob, { start: string; localStart: string; zone: string }>();
    result.technicians.forEach((t, i) => {
      const slot = t.slots[0];
      const job = owner[i]!;
      const best = earliest.get(job);
      if (slot && (!best || slot.start < best.start)) earliest.set(job, { start: slot.start, localStart: slot.localStart, zone: t.timeZone });
    });
    for (const job of group) {
      const slot = earliest.get(job);
      if (!slot) continue;
      const zone = job.technicians[0]!.hours.timeZone;
      // labelled in the partner's zone, as its slot list labels it
      const localStart = slot.zone === zone ? slot.localStart : DateTime.fromISO(slot.start, { zone }).toFormat("yyyy-MM-dd'T'HH:mmZZ");
      found.set(job.key, { start: slot.start, localStart, timeZone: zone });
    }
  };
  for (const group of groups.values()) {
    for (const days of [...EARLY_PASS_DAYS.filter((d) => d < q.days), q.days]) {
      const rest = group.filter((job) => !found.has(job.key));
      if (!rest.length) break;
      run(rest, days);
    }
    for (const job of group) if (!found.has(job.key)) found.set(job.key, null);
  }
  return found;
}
