// Which decisions a partner may take on a booking, read from the domain's one lifecycle table;
// how a status looks is shared with the Directory (packages/ui).
import { canTransition, type Booking, type BookingStatus } from '@emberline/domain';

export { STATUS_LOOKS, type StatusLook } from '@emberline/ui';

/** Bookings the week calendar draws: those holding the technician's time, and what happened to them. */
export const CALENDAR_STATUSES: readonly BookingStatus[] = ['held', 'requested', 'confirmed', 'in_progress', 'completed', 'no_show'];

export type PartnerAction = 'accept' | 'decline' | 'start' | 'complete' | 'no-show' | 'cancel' | 'reschedule';

/** The status each decision leads to (reschedule keeps the booking confirmed). */
const ACTION_TARGET: Record<Exclude<PartnerAction, 'reschedule'>, BookingStatus> = {
  accept: 'confirmed',
  decline: 'declined',
  start: 'in_progress',
  complete: 'completed',
  'no-show': 'no_show',
  cancel: 'cancelled_by_partner',
};

/**
 * The decisions a partner may take now, in the order the page shows them. A no-show can only be
 * recorded once the start has passed; a booking moves to another time only while it is confirmed
 * (the same window in which the partner may still cancel it).
 */
export function partnerActions(booking: Pick<Booking, 'status' | 'start'>, now: Date = new Date()): PartnerAction[] {
  const out: PartnerAction[] = [];
  for (const action of ['accept', 'decline', 'start', 'complete', 'reschedule', 'no-show', 'cancel'] as const) {
    if (action === 'reschedule') {
      if (booking.status === 'confirmed' && canTransition(booking.status, 'cancelled_by_partner', 'partner')) out.push(action);
      continue;
    }
    if (!canTransition(booking.status, ACTION_TARGET[action], 'partner')) continue;
    if (action === 'no-show' && now.getTime() < Date.parse(booking.start)) continue;
    out.push(action);
  }
  return out;
}
