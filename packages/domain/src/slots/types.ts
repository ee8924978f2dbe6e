// Input and output of the slot engine.
import type { GeoPoint, TravelAssumptions } from '../geo';
import type { WorkingHours } from '../schemas/hours';

/**
 * An instant: epoch milliseconds, a Date, or an ISO 8601 string with `Z` or a UTC offset.
 * Strings without an offset are refused, because they would be read in the machine's zone.
 */
export type Instant = number | string | Date;

/** A job already in a technician's calendar, [start, end), at the customer's location. */
export interface ExistingBooking {
  id?: string;
  start: Instant;
  end: Instant;
  location: GeoPoint;
}

export interface SlotTechnician {
  id: string;
  /** Validated by `WorkingHoursSchema`; buffer, notice and horizon come from here. */
  hours: WorkingHours;
  /** Where the technician starts the working day. */
  base: GeoPoint;
  bookings?: readonly ExistingBooking[];
}

export interface SlotQuery {
  technicians: readonly SlotTechnician[];
  /** Length of the job to book, a multiple of 5 minutes. */
  durationMinutes: number;
  /** Where the job takes place. */
  customer: GeoPoint;
  /** The current instant; the engine never reads the clock itself. */
  now: Instant;
  /** Earliest start to offer; local days are counted from its date in each technician's zone. */
  from: Instant;
  /** How many local days from `from`'s date to search (1–366). */
  days: number;
  /** Start times fall on local wall-clock multiples of this (default 15; must divide 1440). */
  gridMinutes?: number;
  /** Defaults to `DEFAULT_TRAVEL_ASSUMPTIONS`. */
  travel?: Partial<TravelAssumptions>;
  /** Zone of the organisation-wide labels; defaults to the first technician's zone. */
  timeZone?: string;
  /**
   * At most this many slots per technician, the earliest (default: all). A caller that needs only
   * the next free start asks for 1, and the engine stops at it instead of labelling every slot.
   */
  maxSlotsPerTechnician?: number;
}

export interface BookableSlot {
  /** Start instant, ISO 8601 UTC, e.g. 2026-03-29T07:00:00.000Z. */
  start: string;
  /** End instant of the job (start + duration), ISO 8601 UTC. */
  end: string;
  /** Start as local wall-clock time with its offset, e.g. 2026-03-29T09:00+02:00. */
  localStart: string;
}

export interface TechnicianSlots {
  technicianId: string;
  timeZone: string;
  slots: BookableSlot[];
}

export interface OrganisationSlot extends BookableSlot {
  /** Technicians free for this start, in the order of the query. */
  technicianIds: string[];
}

export interface SlotResult {
  technicians: TechnicianSlots[];
  /** Union over all technicians, ordered by start; `localStart` in `timeZone`. */
  organisation: OrganisationSlot[];
  timeZone: string;
}
