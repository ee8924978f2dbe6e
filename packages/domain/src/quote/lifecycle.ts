// The one table of allowed booking transitions and who may make each; and what cancelling
// costs under an offer's policy.
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
