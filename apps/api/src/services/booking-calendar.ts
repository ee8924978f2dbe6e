// A booking as an iCalendar event (RFC 5545) through the `ics` package: the same UID for every
// version of one booking, and a SEQUENCE that grows when it moves, so calendars update the event
// instead of adding another.
import { createEvent, type EventStatus } from 'ics';
import type { BookingStatus } from '@emberline/domain';

export interface CalendarBooking {
  id: string;
  reference: string;
  status: BookingStatus;
  start: Date;
  end: Date;
  serviceName: string;
  partnerName: string;
  /** The address ORGANIZER names (the partner, reached through the network's no-reply sender). */
  organizerEmail: string;
  place: string;
  location: { lat: number; lng: number };
  sequence: number;
  link: string;
}

/** A stable UID per booking (RFC 5545, 3.8.4.7: globally unique, kept across updates). */
export const calendarUid = (bookingId: string) => `${bookingId}@bookings.emberline`;

function statusOf(status: BookingStatus): EventStatus {
  if (status === 'confirmed' || status === 'in_progress' || status === 'completed') return 'CONFIRMED';
  if (status === 'held' || status === 'requested') return 'TENTATIVE';
  return 'CANCELLED';
}

export function bookingCalendar(b: CalendarBooking): string {
  const { error, value } = createEvent({
    uid: calendarUid(b.id),
    productId: 'emberline/bookings',
    method: 'PUBLISH',
    // RFC 5546 §3.2.1: a PUBLISH event must name its ORGANIZER
    // a parameter value may hold no DQUOTE (RFC 5545 §3.1), and the writer would escape it wrongly
    organizer: { name: b.partnerName.replaceAll('"', "'"), email: b.organizerEmail },
    // instants in UTC ("…Z"): the reader shows them in its own zone
    start: b.start.getTime(),
    startInputType: 'utc',
    startOutputType: 'utc',
    end: b.end.getTime(),
    endInputType: 'utc',
    endOutputType: 'utc',
    title: `${b.serviceName} – ${b.partnerName}`,
    description: `Emberline booking ${b.reference}\n${b.link}`,
    location: b.place,
    geo: { lat: b.location.lat, lon: b.location.lng },
    url: b.link,
    status: statusOf(b.status),
    sequence: b.sequence,
  });
  if (error || !value) throw error ?? new Error('The calendar event could not be written');
  return value;
}
