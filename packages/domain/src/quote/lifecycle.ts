// The one table of allowed booking transitions and who may make each; when a job may start; and
// what cancelling costs under an offer's policy.
import { DateTime } from 'luxon';
import { DomainInputError } from '../errors';
import type { BookingActor, BookingStatus } from '../schemas/bookings';

export interface Transition {
  to: BookingStatus;
  by: readonly BookingActor[];
}

export const BOOKING_TRANSITIONS: Readonly<Record<BookingStatus, readonly Transition[]>> = Object.freeze({
  held: [
    { to: 'requested', by: ['system'] }, // payment authorised
    { to: 'released', by: ['system', 'owner'] }, // payment failed, timed out or abandoned
  ],
  released: [],
  requested: [
    { to: 'confirmed', by: ['partner', 'system'] }, // accepted, or the auto-confirm setting
    { to: 'declined', by: ['partner'] },
    { to: 'expired', by: ['system'] }, // not accepted before the start or the authorisation lapsed
    { to: 'cancelled_by_owner', by: ['owner'] },
  ],
  confirmed: [
    { to: 'in_progress', by: ['partner'] },
    { to: 'cancelled_by_owner', by: ['owner'] },
    { to: 'cancelled_by_partner', by: ['partner'] },
    { to: 'no_show', by: ['partner'] },
  ],
  in_progress: [{ to: 'completed', by: ['partner'] }],
  completed: [],
  declined: [],
  expired: [],
  cancelled_by_owner: [],
  cancelled_by_partner: [],
  no_show: [],
});

export function canTransition(from: BookingStatus, to: BookingStatus, actor: BookingActor): boolean {
  return BOOKING_TRANSITIONS[from].some((t) => t.to === to && t.by.includes(actor));
}

/**
 * What an owner's cancellation costs: free until `freeUntilHours` before the start, then the
 * fee (never more than what was paid); nothing can be cancelled once the job has started.
 */
export function ownerCancellation(policy: { freeUntilHours: number; feeMinor: number }, paidMinor: number, start: Date | string, now: Date): { allowed: boolean; feeMinor: number; refundMinor: number } {
  const startMs = typeof start === 'string' ? Date.parse(start) : start.getTime();
  if (now.getTime() >= startMs) return { allowed: false, feeMinor: 0, refundMinor: 0 };
  const free = startMs - now.getTime() >= policy.freeUntilHours * 3_600_000;
  const feeMinor = free ? 0 : Math.min(policy.feeMinor, paidMinor);
  return { allowed: true, feeMinor, refundMinor: paidMinor - feeMinor };
}

/** The network's default for how long before the appointment a job may be started. */
export const DEFAULT_JOB_START_WINDOW_MINUTES = 120;

/**
 * When a confirmed job may be started: from `windowMinutes` before its start, but never before the
 * appointment's local day begins in the partner's zone, until that day ends. Starting early let a
 * job be "done" days ahead and its money taken with nobody on site.
 */
export function jobStartWindow(start: Date | string, timeZone: string, windowMinutes: number): { from: Date; until: Date } {
  const startDt = DateTime.fromJSDate(typeof start === 'string' ? new Date(start) : start, { zone: timeZone });
  if (!startDt.isValid) throw new DomainInputError(`Cannot place ${String(start)} in the zone ${timeZone}`);
  if (!Number.isInteger(windowMinutes) || windowMinutes < 0) throw new DomainInputError(`A start window of ${windowMinutes} minutes is not a whole number of minutes`);
  const dayStart = startDt.startOf('day');
  // plus({ days: 1 }) keeps the wall clock, so a 23- or 25-hour day ends at the next local midnight
  const dayEnd = dayStart.plus({ days: 1 });
  const early = startDt.minus({ minutes: windowMinutes });
  return { from: (early < dayStart ? dayStart : early).toJSDate(), until: dayEnd.toJSDate() };
}

export type JobStartCheck = { allowed: true } | { allowed: false; reason: 'too-early' | 'day-over'; from: Date; until: Date };

/** Whether a confirmed job may be started at `now` (see jobStartWindow). */
export function checkJobStart(start: Date | string, timeZone: string, windowMinutes: number, now: Date): JobStartCheck {
  const w = jobStartWindow(start, timeZone, windowMinutes);
  if (now.getTime() < w.from.getTime()) return { allowed: false, reason: 'too-early', ...w };
  if (now.getTime() >= w.until.getTime()) return { allowed: false, reason: 'day-over', ...w };
  return { allowed: true };
}

/** Statuses in which an appointment may still be moved, by the owner or the partner. */
export const MOVABLE_STATUSES: readonly BookingStatus[] = Object.freeze(['requested', 'confirmed']);

export type OwnerRescheduleCheck = { allowed: true } | { allowed: false; reason: 'status' | 'too-late'; hoursLeft: number };

/**
 * Whether the owner may move a booking at `now`: while it is requested or confirmed, and only
 * while cancelling it would still be free (the same boundary as ownerCancellation: at least
 * `freeUntilHours` before the start, and never once it has begun), so moving never dodges the fee.
 */
export function ownerReschedule(status: BookingStatus, start: Date | string, freeUntilHours: number, now: Date): OwnerRescheduleCheck {
  const startMs = typeof start === 'string' ? Date.parse(start) : start.getTime();
  if (!Number.isFinite(startMs)) throw new DomainInputError(`Cannot read the start ${String(start)}`);
  if (!Number.isInteger(freeUntilHours) || freeUntilHours < 0) throw new DomainInputError(`Free cancellation of ${freeUntilHours} hours is not a whole number of hours ≥ 0`);
  const leftMs = startMs - now.getTime();
  const hoursLeft = leftMs / 3_600_000;
  if (!MOVABLE_STATUSES.includes(status)) return { allowed: false, reason: 'status', hoursLeft };
  if (leftMs <= 0 || leftMs < freeUntilHours * 3_600_000) return { allowed: false, reason: 'too-late', hoursLeft };
  return { allowed: true };
}
