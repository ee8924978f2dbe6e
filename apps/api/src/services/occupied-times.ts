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
  const ids = [...new Set(technicianIds)];
  if (!ids.length) return new Map();
  const where = occupying('b', ids, from, to, now, o);
  const rows: OccupiedRow[] = await manager.query(
    `SELECT b.id, b.technician_user_id, b.start_at, b.end_at, b.job_lat, b.job_lng FROM booking b WHERE ${where.sql} ORDER BY b.technician_user_id, b.start_at`,
    where.params,
  );
  return byTechnician(rows);
}

/**
 * As occupiedTimes, read in the same statement as a one-row table of other facts (`state`, a
 * SELECT returning one row, e.g. the search index's change-log check), so both come in one round
 * trip and from one moment; that row is returned too.
 */
export async function occupiedTimesWith<S extends object>(
  manager: EntityManager,
  state: { sql: string; params: unknown[] },
  technicianIds: readonly string[],
  from: Date,
  to: Date,
  now: Date,
): Promise<{ busy: Map<string, ExistingBooking[]>; state: S }> {
  const ids = [...new Set(technicianIds)];
  const where = ids.length ? occupying('b', ids, from, to, now, {}) : { sql: 'FALSE', params: [] };
  const rows: (OccupiedRow & S)[] = await manager.query(
    `SELECT s.*, b.id, b.technician_user_id, b.start_at, b.end_at, b.job_lat, b.job_lng
     FROM (${state.sql}) s LEFT JOIN booking b ON ${where.sql}
     ORDER BY b.technician_user_id, b.start_at`,
    [...state.params, ...where.params],
  );
  return { busy: byTechnician(rows.filter((r) => r.id !== null)), state: rows[0]! };
}

interface OccupiedRow {
  id: string;
  technician_user_id: string;
  start_at: Date;
  end_at: Date;
  job_lat: number;
  job_lng: number;
}

/** The condition on `alias` (a booking) for "occupies one of these technicians within [from, to) at `now`". */
function occupying(alias: string, ids: readonly string[], from: Date, to: Date, now: Date, o: { excludeBookingId?: string }): { sql: string; params: unknown[] } {
  return {
    sql: `${alias}.technician_user_id IN (?) AND ${alias}.start_at < ? AND ${alias}.end_at > ?
      AND (${alias}.status IN (?) OR (${alias}.status = 'held' AND ${alias}.hold_expires_at > ?))${o.excludeBookingId ? ` AND ${alias}.id <> ?` : ''}`,
    params: [ids, to, from, FIRM, now, ...(o.excludeBookingId ? [o.excludeBookingId] : [])],
  };
}

function byTechnician(rows: readonly OccupiedRow[]): Map<string, ExistingBooking[]> {
  const grouped = new Map<string, ExistingBooking[]>();
  for (const r of rows) {
    const list = grouped.get(r.technician_user_id) ?? [];
    list.push({ id: r.id, start: new Date(r.start_at), end: new Date(r.end_at), location: { lat: Number(r.job_lat), lng: Number(r.job_lng) } });
    grouped.set(r.technician_user_id, list);
  }
  return grouped;
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
