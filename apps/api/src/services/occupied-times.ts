// The one place that says which bookings keep a technician's time taken: the public slots, the
// search's next slot and the booking check all read it, so they can never disagree.
import type { EntityManager } from 'typeorm';
import { OCCUPYING_STATUSES, type ExistingBooking } from '@emberline/domain';

/** Occupying statuses other than `held`, which only counts until its hold expires. */
const FIRM = OCCUPYING_STATUSES.filter((s) => s !== 'held');

/**
 * Per technician, the jobs in their calendar that overlap [from, to): requested, confirmed and in
 * progress bookings, and held ones whose hold has not expired at `now` — in the engine's shape
 * (start, end, job location), in one query for any number of technicians. A technician's calendar
 * is theirs across organisations. `excludeBookingId` leaves one booking out (the one being moved).
 */
export async function occupiedTimes(
  manager: EntityManager,
  technicianIds: readonly string[],
  from: Date,
  to: Date,
  now: Date,
  o: { excludeBookingId?: string } = {},
): Promise<Map<string, ExistingBooking[]>> {
  const byTechnician = new Map<string, ExistingBooking[]>();
  const ids = [...new Set(technicianIds)];
  if (!ids.length) return byTechnician;
  const rows: { id: string; technician_user_id: string; start_at: Date; end_at: Date; job_lat: number; job_lng: number }[] = await manager.query(
    `SELECT id, technician_user_id, start_at, end_at, job_lat, job_lng FROM booking
     WHERE technician_user_id IN (?) AND start_at < ? AND end_at > ?
       AND (status IN (?) OR (status = 'held' AND hold_expires_at > ?))${o.excludeBookingId ? ' AND id <> ?' : ''}
     ORDER BY technician_user_id, start_at`,
    [ids, to, from, FIRM, now, ...(o.excludeBookingId ? [o.excludeBookingId] : [])],
  );
  for (const r of rows) {
    const list = byTechnician.get(r.technician_user_id) ?? [];
    list.push({ id: r.id, start: new Date(r.start_at), end: new Date(r.end_at), location: { lat: Number(r.job_lat), lng: Number(r.job_lng) } });
    byTechnician.set(r.technician_user_id, list);
  }
  return byTechnician;
}

const DAY_MS = 86_400_000;

/**
 * The window of bookings a slot search from `from` over `days` local days must see: a day before
 * (a job the evening before sets where the technician starts) to two days after (local days are
 * not 24 hours everywhere, and the engine looks into the day after the search).
 */
export function slotWindow(from: Date, days: number): { from: Date; to: Date } {
  return { from: new Date(from.getTime() - DAY_MS), to: new Date(from.getTime() + (days + 2) * DAY_MS) };
}
