// Bookable start times of an approved partner for one service type at the customer's location:
// the offer's duration, the technicians assigned to it with their working hours, and the
// organisation's base, through the pure slot engine. No bookings exist yet.
import {
  computeSlots,
  isInServiceArea,
  SLOT_LIST_LIMIT,
  WorkingHoursSchema,
  type PartnerSlots,
  type SlotTechnician,
  type SlotsQuery,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { NotFound, ValidationFailed } from '../lib/errors';
import { approvedPartnersQuery } from './partners.service';
import { json } from './offers.service';

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
  // assigned technicians who are still members and have saved hours
  const rows: { user_id: string; hours: unknown }[] = await ctx.manager.query(
    `SELECT ot.user_id, wh.hours FROM offer_technician ot
     JOIN membership m ON m.organisation_id = ot.organisation_id AND m.user_id = ot.user_id
     JOIN working_hours wh ON wh.organisation_id = ot.organisation_id AND wh.user_id = ot.user_id
     WHERE ot.offer_id = ? ORDER BY ot.user_id`,
    [offer.id],
  );
  const technicians: SlotTechnician[] = [];
  for (const r of rows) {
    const hours = WorkingHoursSchema.safeParse(json(r.hours));
    if (hours.success) technicians.push({ id: r.user_id, hours: hours.data, base, bookings: [] });
  }
  const durationMinutes = Number(offer.duration_minutes);
  const empty = { partnerId: partner.id, serviceTypeCode: q.serviceType, durationMinutes, organisation: [], technicians: [], truncated: false };
  if (!technicians.length) return { ...empty, timeZone: 'UTC' };
  const from = q.from && Date.parse(q.from) > now.getTime() ? q.from : now;
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
