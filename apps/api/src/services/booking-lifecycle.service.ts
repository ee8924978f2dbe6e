// The one owner of booking transitions: checks them against the domain's table, writes the
// history and the audit log, and sends the e-mails; and the payment moves that go with them
// (each with an idempotency key derived from the booking), and the check that a start is free.
import type { EntityManager } from 'typeorm';
import {
  canTransition,
  checkJobStart,
  computeSlots,
  WorkingHoursSchema,
  type BookingActor,
  type BookingStatus,
  type GeoPoint,
  type WorkingHours,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { createError } from '../lib/errors';
import type { Logger } from '../lib/logger';
import { enqueueMail } from '../mail/outbox';
import type { MailMoney, MailTemplateData, MailWhen } from '../mail/render';
import { senderAddressOf } from '../mail/sender';
import type { PaymentGateway } from '../payments/gateway';
import { PaymentRejected } from '../payments/errors';
import { audit } from './audit.service';
import { bookingCalendar } from './booking-calendar';
import { customerOf, findBookingRow, kitOf, minor, placeOf, type BookingRow, type PaymentStatus } from './booking-records';
import { json } from '../lib/json-column';
import { jobStartWindowMinutes } from './network-settings';
import { occupiedTimes, slotWindow } from './occupied-times';
import { consoleLinks, directoryLinks } from './recipients';

export const BookingStateConflict = createError('BOOKING_STATE', 409, 'The booking cannot change like this');
export const SlotTaken = createError('SLOT_TAKEN', 409, 'This time is not free');
const StartTooEarly = createError('START_TOO_EARLY', 409, 'The job cannot be started yet');
const StartDayOver = createError('START_DAY_OVER', 409, 'The day of this job is over');
const NotStarted = createError('NOT_STARTED', 409, 'The job has not been started');

/** What every booking change needs besides the transaction and the actor. */
export interface BookingContext extends ServiceContext {
  payments: PaymentGateway;
  publicUrl: string;
  now: Date;
  logger?: Logger;
}

const STATUS_WORDS: Record<BookingStatus, string> = {
  held: 'held for payment',
  released: 'released',
  requested: 'waiting for the partner',
  confirmed: 'confirmed',
  in_progress: 'in progress',
  completed: 'completed',
  declined: 'declined',
  expired: 'expired',
  cancelled_by_owner: 'cancelled by the owner',
  cancelled_by_partner: 'cancelled by the partner',
  no_show: 'recorded as a no-show',
};

/** 409 unless the domain's table lets `by` move the booking from its status to `to`. */
export function assertTransition(row: BookingRow, to: BookingStatus, by: BookingActor): void {
  if (!canTransition(row.status, to, by)) {
    throw BookingStateConflict(`Booking ${row.reference} is ${STATUS_WORDS[row.status]}; it cannot become ${STATUS_WORDS[to]} now.`);
  }
}

const localTime = (at: Date, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone, timeZoneName: 'short' }).format(at);

/**
 * 409 unless the partner may start the job now: a confirmed booking, inside the network's start
 * window on the appointment's local day (the domain's checkJobStart). Answers the earliest start.
 */
export async function assertStartAllowed(ctx: BookingContext, row: BookingRow): Promise<void> {
  assertTransition(row, 'in_progress', 'partner');
  const check = checkJobStart(new Date(row.start_at), row.time_zone, await jobStartWindowMinutes(ctx.manager), ctx.now);
  if (check.allowed) return;
  if (check.reason === 'day-over') {
    throw StartDayOver(`Booking ${row.reference} was due on a day that has ended; record a no-show or cancel it instead.`);
  }
  const err = StartTooEarly(`Booking ${row.reference} can be started from ${localTime(check.from, row.time_zone)}, not before.`);
  err.extensions = { earliestStart: check.from.toISOString() };
  throw err;
}

/** 409 unless the job was started: only a job under way can be marked as done (and its money taken). */
export function assertCompletable(row: BookingRow): void {
  if (row.status === 'confirmed') throw NotStarted(`Booking ${row.reference} has not been started; start the job first, then mark it as done when it is finished.`);
  assertTransition(row, 'completed', 'partner');
}

/** Columns a transition may set along with the status. */
export type BookingColumns = Partial<{
  payment_status: PaymentStatus;
  payment_intent_id: string | null;
  authorised_minor: number;
  captured_minor: number;
  refunded_minor: number;
  hold_expires_at: Date | null;
}>;

export interface TransitionOptions {
  set?: BookingColumns;
  /** Fee and release of an owner's cancellation, for the e-mails. */
  money?: { feeMinor: number; refundMinor: number };
  /** False leaves the owner's e-mail out (an auto-confirmed booking gets only the confirmation). */
  notifyOwner?: boolean;
}

async function updateColumns(manager: EntityManager, id: string, set: Record<string, unknown>): Promise<void> {
  const keys = Object.keys(set);
  if (!keys.length) return;
  await manager.query(`UPDATE booking SET ${keys.map((k) => `${k} = ?`).join(', ')} WHERE id = ?`, [...keys.map((k) => set[k]), id]);
}

export async function recordEvent(ctx: BookingContext, row: BookingRow, from: BookingStatus | null, to: BookingStatus, by: BookingActor, note: string | null): Promise<void> {
  await ctx.manager.query('INSERT INTO booking_event (booking_id, from_status, to_status, actor, actor_user_id, note, at) VALUES (?, ?, ?, ?, ?, ?, ?)', [
    row.id,
    from,
    to,
    by,
    by === 'system' ? null : ctx.actor.userId,
    note ? note.slice(0, 500) : null,
    ctx.now,
  ]);
}

/**
 * Moves a booking to `to` as `by` (owner, partner or the system), with `note` in its history.
 * Locks the row, checks the transition, writes the status and `o.set`, the history, the audit
 * log and the e-mails, in the caller's transaction. Answers the booking as it is now.
 */
export async function transition(ctx: BookingContext, bookingId: string, to: BookingStatus, by: BookingActor, note: string | null, o: TransitionOptions = {}): Promise<BookingRow> {
  const before = await findBookingRow(ctx.manager, bookingId, {}, true);
  assertTransition(before, to, by);
  await updateColumns(ctx.manager, bookingId, { status: to, ...o.set });
  await recordEvent(ctx, before, before.status, to, by, note);
  const after = await findBookingRow(ctx.manager, bookingId, {});
  await audit(ctx, {
    action: `booking.${to.replace(/_/g, '-')}`,
    entityType: 'booking',
    entityId: bookingId,
    organisationId: after.organisation_id,
    before: { status: before.status, paymentStatus: before.payment_status, capturedMinor: minor(before.captured_minor) },
    after: { status: after.status, paymentStatus: after.payment_status, capturedMinor: minor(after.captured_minor), note },
  });
  await notify(ctx, after, to, note, o);
  return after;
}

/** Records a new start (status unchanged) in the history and the audit log, and tells the owner and the partner. */
export async function recordReschedule(ctx: BookingContext, before: BookingRow, after: BookingRow, by: BookingActor): Promise<void> {
  const note = `Moved from ${new Date(before.start_at).toISOString()} to ${new Date(after.start_at).toISOString()}`;
  await recordEvent(ctx, after, after.status, after.status, by, note);
  await audit(ctx, {
    action: 'booking.reschedule',
    entityType: 'booking',
    entityId: after.id,
    organisationId: after.organisation_id,
    before: { start: new Date(before.start_at).toISOString(), technicianUserId: before.technician_user_id },
    after: { start: new Date(after.start_at).toISOString(), technicianUserId: after.technician_user_id },
  });
  const previousStart = whenOf(before);
  await mailOwner(ctx, after, 'booking-rescheduled', (owner) => ({ ...common(after, owner.name), partnerName: after.partner_name, start: whenOf(after), previousStart, link: directoryLinks.booking(ctx.publicUrl, after.id) }), {
    calendar: after.status === 'confirmed',
  });
  for (const person of await partnerPeople(ctx.manager, after)) {
    await enqueueMail(ctx.manager, {
      to: person.email,
      template: 'partner-booking-rescheduled',
      locale: person.locale,
      data: { ...common(after, person.name), start: whenOf(after), previousStart, customerName: customerOf(after).name, link: consoleLinks.booking(ctx.publicUrl, after.id) },
    });
  }
}

// ---- e-mails ----

const whenOf = (r: BookingRow): MailWhen => ({ at: new Date(r.start_at).toISOString(), timeZone: r.time_zone });
const money = (r: BookingRow, amount: number): MailMoney => ({ minor: amount, currency: r.currency });
const common = (r: BookingRow, name: string) => ({ name, reference: r.reference, serviceName: r.service_name });

interface Person {
  id: string;
  name: string;
  email: string;
  locale: string;
}

async function ownerOf(manager: EntityManager, r: BookingRow): Promise<Person> {
  const [owner]: Person[] = await manager.query('SELECT id, name, email, locale FROM user_account WHERE id = ?', [r.owner_user_id]);
  return owner!;
}

/** The organisation's partner admins and the technician on the job, each once. */
async function partnerPeople(manager: EntityManager, r: BookingRow): Promise<Person[]> {
  return manager.query(
    `SELECT u.id, u.name, u.email, u.locale FROM user_account u
     WHERE u.id IN (SELECT m.user_id FROM membership m WHERE m.organisation_id = ? AND (m.role = 'partner_admin' OR m.user_id = ?))
     ORDER BY u.created_at, u.id`,
    [r.organisation_id, r.technician_user_id],
  );
}

/** The calendar invitation of a booking as an e-mail attachment. */
export function calendarText(manager: EntityManager, r: BookingRow, publicUrl: string): string {
  return bookingCalendar({
    id: r.id,
    reference: r.reference,
    status: r.status,
    start: new Date(r.start_at),
    end: new Date(r.end_at),
    serviceName: r.service_name,
    partnerName: r.partner_name,
    organizerEmail: senderAddressOf(manager),
    place: placeOf(r),
    location: { lat: Number(r.job_lat), lng: Number(r.job_lng) },
    sequence: Number(r.calendar_sequence),
    link: directoryLinks.booking(publicUrl, r.id),
  });
}

type OwnerTemplate = 'booking-requested' | 'booking-confirmed' | 'booking-reminder' | 'booking-rescheduled' | 'booking-cancelled' | 'booking-declined' | 'booking-expired' | 'booking-completed';

async function mailOwner<T extends OwnerTemplate>(
  ctx: { manager: EntityManager; publicUrl: string },
  r: BookingRow,
  template: T,
  data: (owner: Person) => MailTemplateData[T],
  o: { calendar?: boolean } = {},
): Promise<void> {
  const owner = await ownerOf(ctx.manager, r);
  await enqueueMail(ctx.manager, {
    to: owner.email,
    template,
    locale: owner.locale,
    data: data(owner),
    attachments: o.calendar ? [{ filename: `booking-${r.reference}.ics`, contentType: 'text/calendar; charset=utf-8; method=PUBLISH', content: Buffer.from(calendarText(ctx.manager, r, ctx.publicUrl), 'utf8').toString('base64') }] : undefined,
  });
}

/** The reminder a day before the start (the booking-reminders job). */
export function mailReminder(ctx: { manager: EntityManager; publicUrl: string }, r: BookingRow): Promise<void> {
  return mailOwner(ctx, r, 'booking-reminder', (owner) => ({ ...common(r, owner.name), partnerName: r.partner_name, start: whenOf(r), place: placeOf(r), link: directoryLinks.booking(ctx.publicUrl, r.id) }));
}

async function notify(ctx: BookingContext, r: BookingRow, to: BookingStatus, note: string | null, o: TransitionOptions): Promise<void> {
  const link = directoryLinks.booking(ctx.publicUrl, r.id);
  const owner = o.notifyOwner !== false;
  const authorised = minor(r.authorised_minor);
  switch (to) {
    case 'requested':
      if (owner) await mailOwner(ctx, r, 'booking-requested', (p) => ({ ...common(r, p.name), partnerName: r.partner_name, start: whenOf(r), amount: money(r, authorised), link }));
      for (const person of await partnerPeople(ctx.manager, r)) {
        await enqueueMail(ctx.manager, {
          to: person.email,
          template: 'partner-booking-new',
          locale: person.locale,
          data: { ...common(r, person.name), start: whenOf(r), customerName: customerOf(r).name, place: placeOf(r), link: consoleLinks.booking(ctx.publicUrl, r.id) },
        });
      }
      return;
    case 'confirmed':
      if (owner) await mailOwner(ctx, r, 'booking-confirmed', (p) => ({ ...common(r, p.name), partnerName: r.partner_name, start: whenOf(r), place: placeOf(r), link }), { calendar: true });
      return;
    case 'declined':
    case 'cancelled_by_partner':
      if (owner) {
        await mailOwner(ctx, r, 'booking-declined', (p) => ({ ...common(r, p.name), partnerName: r.partner_name, start: whenOf(r), reason: note ?? '–', amount: money(r, authorised), link }));
      }
      return;
    case 'completed':
      // the receipt: what was taken, when, by whom
      if (owner) {
        await mailOwner(ctx, r, 'booking-completed', (p) => ({ ...common(r, p.name), partnerName: r.partner_name, start: whenOf(r), completedAt: { at: ctx.now.toISOString(), timeZone: r.time_zone }, amount: money(r, minor(r.captured_minor)), link }));
      }
      return;
    case 'expired':
      if (owner) await mailOwner(ctx, r, 'booking-expired', (p) => ({ ...common(r, p.name), partnerName: r.partner_name, start: whenOf(r), amount: money(r, authorised), link }));
      return;
    case 'cancelled_by_owner': {
      const fee = o.money?.feeMinor ?? 0;
      const refund = o.money?.refundMinor ?? authorised;
      if (owner) await mailOwner(ctx, r, 'booking-cancelled', (p) => ({ ...common(r, p.name), start: whenOf(r), fee: money(r, fee), refund: money(r, refund), link }));
      for (const person of await partnerPeople(ctx.manager, r)) {
        await enqueueMail(ctx.manager, {
          to: person.email,
          template: 'partner-booking-cancelled',
          locale: person.locale,
          data: { ...common(r, person.name), start: whenOf(r), customerName: customerOf(r).name, fee: money(r, fee), link: consoleLinks.booking(ctx.publicUrl, r.id) },
        });
      }
      return;
    }
    default:
      return;
  }
}

// ---- payments ----

/**
 * Demo bookings from the seed carry made-up payment ids (`seed_…`) that the provider has never
 * seen; their money moves are recorded without calling it.
 */
const isSeedPayment = (id: string | null) => !!id && id.startsWith('seed_');

/** Releases a hold that was never captured; no money moves. Answers the columns to set. */
export async function releaseHold(ctx: BookingContext, r: BookingRow): Promise<BookingColumns> {
  if (!r.payment_intent_id || r.payment_status !== 'authorised') return {};
  if (!isSeedPayment(r.payment_intent_id)) {
    try {
      await ctx.payments.cancelAuthorization(r.payment_intent_id, `booking:${r.id}:cancel-authorisation`);
    } catch (err) {
      // already cancelled at the provider (e.g. it lapsed there): our record follows
      if (!(err instanceof PaymentRejected)) throw err;
      ctx.logger?.warn({ bookingId: r.id, error: err.message }, 'the hold could not be cancelled; it is no longer held at the provider');
    }
  }
  return { payment_status: 'cancelled' };
}

/** Takes `amountMinor` of the held money (the rest of the hold is released). `purpose` names the key. */
export async function captureHeld(ctx: BookingContext, r: BookingRow, amountMinor: number, purpose: 'capture' | 'capture-cancellation-fee' | 'capture-no-show-fee'): Promise<BookingColumns> {
  if (!r.payment_intent_id || r.payment_status !== 'authorised') throw BookingStateConflict(`Booking ${r.reference} has no authorised payment to take.`);
  let captured = amountMinor;
  if (!isSeedPayment(r.payment_intent_id)) {
    const pi = await ctx.payments.capture(r.payment_intent_id, amountMinor, `booking:${r.id}:${purpose}`);
    captured = pi.amountReceivedMinor;
  }
  return { payment_status: 'captured', captured_minor: captured };
}

/** Ends the open payment page of a held booking so that it can no longer be paid; false when it was paid already. */
export async function closeCheckout(ctx: BookingContext, r: BookingRow): Promise<boolean> {
  if (!r.checkout_session_id) return true;
  try {
    await ctx.payments.expireCheckout(r.checkout_session_id, `booking:${r.id}:expire-checkout`);
    return true;
  } catch (err) {
    if (!(err instanceof PaymentRejected)) throw err;
    // not open any more: expired already (fine) or completed (paid)
    const status = await ctx.payments.getCheckout(r.checkout_session_id);
    return status.status !== 'complete';
  }
}

/** Takes the parts of the kit recorded at booking out of stock, never below 0. */
export async function takeKitFromStock(manager: EntityManager, r: BookingRow): Promise<void> {
  for (const line of kitOf(r)) {
    await manager.query('UPDATE part SET stock = stock - LEAST(stock, ?) WHERE id = ? AND organisation_id = ?', [line.quantity, line.partId, r.organisation_id]);
  }
}

// ---- is a start free ----

export interface SlotTechnicianHours {
  id: string;
  hours: WorkingHours;
}

/**
 * Locks the technicians' calendars (their working-hours rows, in a fixed order so two bookings
 * never wait on each other) until the transaction ends: every booking, move or late payment for
 * them checks and writes one after the other.
 */
export async function lockTechnicians(manager: EntityManager, organisationId: string, technicianIds: readonly string[]): Promise<void> {
  if (!technicianIds.length) return;
  await manager.query('SELECT user_id FROM working_hours WHERE organisation_id = ? AND user_id IN (?) ORDER BY user_id FOR UPDATE', [organisationId, [...technicianIds]]);
}

/** The saved hours of members of an organisation (invalid ones left out), read after the lock. */
export async function technicianHours(manager: EntityManager, organisationId: string, ids: readonly string[]): Promise<SlotTechnicianHours[]> {
  if (!ids.length) return [];
  const rows: { user_id: string; hours: unknown }[] = await manager.query(
    'SELECT wh.user_id, wh.hours FROM working_hours wh JOIN membership m ON m.organisation_id = wh.organisation_id AND m.user_id = wh.user_id WHERE wh.organisation_id = ? AND wh.user_id IN (?) ORDER BY wh.user_id',
    [organisationId, [...ids]],
  );
  return rows.flatMap((r) => {
    const parsed = WorkingHoursSchema.safeParse(json(r.hours));
    return parsed.success ? [{ id: r.user_id, hours: parsed.data }] : [];
  });
}

/**
 * The first of `technicians` (in their order) for whom a job of `durationMinutes` at `location`
 * can start at `start` — the same engine and the same bookings as the public slots — or null.
 * Call it with the technicians locked.
 */
export async function freeTechnician(
  manager: EntityManager,
  q: { technicians: readonly SlotTechnicianHours[]; base: GeoPoint; location: GeoPoint; durationMinutes: number; start: Date; now: Date; excludeBookingId?: string },
): Promise<{ id: string; timeZone: string } | null> {
  if (!q.technicians.length || q.durationMinutes > 1440) return null;
  const window = slotWindow(q.start, 1);
  const busy = await occupiedTimes(manager, q.technicians.map((t) => t.id), window.from, window.to, q.now, { excludeBookingId: q.excludeBookingId });
  const result = computeSlots({
    technicians: q.technicians.map((t) => ({ id: t.id, hours: t.hours, base: q.base, bookings: busy.get(t.id) ?? [] })),
    durationMinutes: q.durationMinutes,
    customer: q.location,
    now: q.now,
    from: q.start,
    days: 1,
  });
  const at = q.start.getTime();
  const free = result.technicians.find((t) => t.slots.some((s) => Date.parse(s.start) === at));
  return free ? { id: free.technicianId, timeZone: free.timeZone } : null;
}

/** The partner's base a booking's technician starts from (the job's place if the profile has none). */
export const baseOf = (r: BookingRow): GeoPoint =>
  r.base_lat === null || r.base_lng === null ? { lat: Number(r.job_lat), lng: Number(r.job_lng) } : { lat: Number(r.base_lat), lng: Number(r.base_lng) };

/** The message for a start that cannot be booked (taken meanwhile, outside the hours, too soon). */
export const SLOT_TAKEN_MESSAGE = 'This start time is not available (any more). Please choose another time from the list.';
