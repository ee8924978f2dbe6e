// Quotes and bookings: the public quote preview, booking a start (held while the owner pays),
// the owner's and the partner's lists, and what each side may do with a booking. Changes of
// status go through the lifecycle service; money moves through the payment gateway.
import { randomInt } from 'node:crypto';
import { z } from 'zod';
import {
  HOLD_MINUTES,
  MOVABLE_STATUSES,
  ownerReschedule,
  seesAllOrganisationBookings,
  toMajorString,
  type Booking,
  type BookingDecision,
  type BookingListQuerySchema,
  type BookingRequestSchema,
  type OwnerQuoteSchema,
  type QuotePreviewQuerySchema,
  type VehicleProfile,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound, ValidationFailed } from '../lib/errors';
import { newId } from '../lib/secure-token';
import { audit } from './audit.service';
import {
  assertCompletable,
  assertStartAllowed,
  assertTransition,
  baseOf,
  BookingStateConflict,
  calendarText,
  captureHeld,
  closeCheckout,
  freeTechnician,
  lockTechnicians,
  recordReschedule,
  releaseHold,
  SLOT_TAKEN_MESSAGE,
  SlotTaken,
  takeKitFromStock,
  technicianHours,
  transition,
  type BookingContext,
} from './booking-lifecycle.service';
import { addressOf, BOOKING_SELECT, cancellationNow, customerOf, findBookingRow, minor, quoteOf, shapeBookings, type BookingRow, type BookingView } from './booking-records';
import { quoteSettings } from './network-settings';
import { directoryLinks } from './recipients';
import { BODY_PATHS, checkVatId, localDate, planJob, QUERY_PATHS, quoteFor } from './quote.service';
import { offerTechnicians } from './offer-technicians';

export const BookingPaid = createError('BOOKING_PAID', 409, 'The booking is paid already');
export const RescheduleClosed = createError('RESCHEDULE_CLOSED', 409, 'The booking can no longer be moved');
export const NotCancellable = createError('NOT_CANCELLABLE', 409, 'The booking can no longer be cancelled');
const Forbidden = createError('FORBIDDEN', 403, 'You are not allowed to do this');

type QuotePreviewQuery = z.output<typeof QuotePreviewQuerySchema>;
type BookingRequest = z.output<typeof BookingRequestSchema>;
type BookingListQuery = z.output<typeof BookingListQuerySchema>;
type OwnerQuote = z.infer<typeof OwnerQuoteSchema>;

/** The provider's shortest payment page (30 minutes) plus a minute for clocks and the request itself. */
const CHECKOUT_LIFETIME_MS = 31 * 60_000;
const MINUTE_MS = 60_000;

const invalid = (path: string, message: string) => ValidationFailed('Please correct the highlighted fields.', [{ path, message }]);

const profileOf = (v: VehicleProfile): VehicleProfile => ({
  model: v.model,
  fuel: v.fuel,
  factoryHeater: v.factoryHeater,
  climateControl: v.climateControl,
  electricalSystemV: v.electricalSystemV,
  year: v.year,
});

// ---- quote preview ----

/** What the owner would pay an approved partner for a service at a place (no partner share). */
export async function previewQuote(ctx: ServiceContext, partnerId: string, q: QuotePreviewQuery, now: Date): Promise<OwnerQuote> {
  checkVatId(q.vatId, 'query.vatId');
  const place = q.lat !== undefined && q.lng !== undefined ? { lat: q.lat, lng: q.lng } : undefined;
  const plan = await planJob(
    ctx.manager,
    { partnerId, serviceType: q.serviceType, vehicle: profileOf(q), jobAt: q.jobAt, place, placeCountry: q.country },
    QUERY_PATHS,
    () => NotFound('There is no such partner.'),
  );
  const zone = plan.technicians[0]?.hours.timeZone ?? 'UTC';
  const quote = quoteFor(plan, await quoteSettings(ctx.manager), { vatId: q.vatId || null, supplyDate: localDate(q.start ? new Date(q.start) : now, zone) });
  const { partner: _share, ...owner } = quote;
  return owner;
}

// ---- booking ----

/** Short codes people can read out: no 0/O, 1/I/L. */
const REFERENCE_ALPHABET = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789';
const newReference = () => `EMB-${Array.from({ length: 6 }, () => REFERENCE_ALPHABET[randomInt(REFERENCE_ALPHABET.length)]).join('')}`;

/**
 * Books a start for the signed-in owner, in the caller's transaction: plans the job as the preview
 * does, locks the technicians' calendars, checks the start with the slot engine against their
 * bookings (409 SLOT_TAKEN when it is not free), stores the booking as `held` with the quote
 * snapshot for HOLD_MINUTES, and opens the payment page. If the payments provider fails the
 * transaction rolls back and nothing is left behind.
 */
export async function createBooking(ctx: BookingContext, body: BookingRequest): Promise<Booking> {
  const { manager, now } = ctx;
  const ownerId = ctx.actor.userId!;
  const [account]: { name: string; email: string; locale: string }[] = await manager.query('SELECT name, email, locale FROM user_account WHERE id = ?', [ownerId]);
  if (!account) throw NotFound('There is no such account.');
  if (body.vehicleId) {
    const [vehicle]: unknown[] = await manager.query('SELECT id FROM vehicle WHERE id = ? AND owner_user_id = ?', [body.vehicleId, ownerId]);
    if (!vehicle) throw invalid('vehicleId', 'This vehicle is not in your garage');
  }
  const address = body.jobAt === 'owner' ? (body.address ?? null) : null;
  const plan = await planJob(
    manager,
    { partnerId: body.partnerId, serviceType: body.serviceType, vehicle: profileOf(body.vehicle), jobAt: body.jobAt, place: address ?? undefined, placeCountry: address?.country },
    BODY_PATHS,
    () => invalid('partnerId', 'This partner is not in the Directory'),
  );
  if (body.technicianId && !plan.technicians.some((t) => t.id === body.technicianId)) throw invalid('technicianId', 'This technician does not do this service');
  const candidates = body.technicianId ? [body.technicianId] : plan.technicians.map((t) => t.id);
  const settings = await quoteSettings(manager);
  const start = new Date(body.start);

  const resumed = await resumeOwnHold(ctx, body, plan, settings, start, address);
  if (resumed) return resumed;

  // from here until the commit, nobody else books these technicians
  await lockTechnicians(manager, plan.partner.id, candidates);
  const technicians = await technicianHours(manager, plan.partner.id, candidates);
  const chosen = await freeTechnician(manager, { technicians, base: plan.partner.base, location: plan.location, durationMinutes: plan.durationMinutes, start, now });
  if (!chosen) throw SlotTaken(SLOT_TAKEN_MESSAGE);

  const quote = quoteFor(plan, settings, {
    vatId: body.customer.kind === 'business' ? body.customer.vatId : null,
    supplyDate: localDate(start, chosen.timeZone),
  });
  const id = newId();
  const holdExpiresAt = new Date(now.getTime() + HOLD_MINUTES * MINUTE_MS);
  let reference = '';
  for (let attempt = 0; !reference; attempt++) {
    const candidate = newReference();
    try {
      await manager.query(
        `INSERT INTO booking (id, reference, organisation_id, technician_user_id, owner_user_id, offer_id, service_type_id, status, start_at, end_at, time_zone,
           job_at, job_lat, job_lng, address, vehicle, customer, phone, notes, quote, kit, currency, gross_minor, payment_status, hold_expires_at, created_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, 'held', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'pending', ?, ?)`,
        [
          id,
          candidate,
          plan.partner.id,
          chosen.id,
          ownerId,
          plan.offer.id,
          plan.serviceType.id,
          start,
          new Date(start.getTime() + plan.durationMinutes * MINUTE_MS),
          chosen.timeZone,
          body.jobAt,
          plan.location.lat,
          plan.location.lng,
          ...ownerEntries(body, plan, quote, address, account),
          quote.currency,
          quote.grossMinor,
          holdExpiresAt,
          now,
        ],
      );
      reference = candidate;
    } catch (err) {
      // one in a billion: another booking has the code; draw again
      if ((err as { code?: string }).code !== 'ER_DUP_ENTRY' || !String((err as Error).message).includes('uq_booking_reference') || attempt >= 3) throw err;
    }
  }
  await manager.query("INSERT INTO booking_event (booking_id, from_status, to_status, actor, actor_user_id, note, at) VALUES (?, NULL, 'held', 'owner', ?, NULL, ?)", [id, ownerId, now]);
  await audit(ctx, {
    action: 'booking.create',
    entityType: 'booking',
    entityId: id,
    organisationId: plan.partner.id,
    after: { reference, status: 'held', start: start.toISOString(), technicianUserId: chosen.id, grossMinor: quote.grossMinor, currency: quote.currency },
  });

  const link = directoryLinks.booking(ctx.publicUrl, id);
  const checkout = await ctx.payments.createCheckout({
    bookingId: id,
    amountMinor: quote.grossMinor,
    currency: quote.currency,
    description: `${plan.serviceType.name} – ${plan.partner.name} (${reference})`,
    customerEmail: account.email,
    successUrl: `${link}?paid=1`,
    cancelUrl: `${link}?cancelled=1`,
    // our hold is HOLD_MINUTES; the expire-holds job closes the page when it lapses
    expiresAt: new Date(now.getTime() + CHECKOUT_LIFETIME_MS),
    metadata: { reference },
    idempotencyKey: `booking:${id}:checkout`,
  });
  await manager.query('UPDATE booking SET checkout_session_id = ?, checkout_url = ? WHERE id = ?', [checkout.sessionId, checkout.url, id]);
  return (await shapeBookings(manager, [await findBookingRow(manager, id, {})], 'owner', now))[0]!;
}

type JobPlan = Awaited<ReturnType<typeof planJob>>;

/** The columns the owner's entries fill (address … kit, in that order), alike for a new hold and a resumed one. */
function ownerEntries(body: BookingRequest, plan: JobPlan, quote: ReturnType<typeof quoteFor>, address: BookingRequest['address'] | null, account: { name: string; email: string; locale: string }) {
  const business = body.customer.kind === 'business' ? body.customer : null;
  const customer = { kind: body.customer.kind, name: account.name, email: account.email, locale: account.locale, companyName: business?.companyName ?? null, vatId: business?.vatId ?? null };
  return [
    address ? JSON.stringify(address) : null,
    JSON.stringify({ ...profileOf(body.vehicle), vehicleId: body.vehicleId ?? null }),
    JSON.stringify(customer),
    body.phone || null,
    body.notes || null,
    JSON.stringify(quote),
    JSON.stringify(plan.kit),
  ];
}

/**
 * The owner asks again for a time she holds herself (back from the payment page, or "try again"
 * after a declined card): that is her hold, not a race. Same partner, service and start, hold not
 * lapsed: the same booking and payment page come back, with the details she may have corrected.
 * When the correction changes the price, the place or the technician, the old hold is given up
 * and the start is booked afresh (and checked like any booking). Answers null when there is none.
 */
async function resumeOwnHold(ctx: BookingContext, body: BookingRequest, plan: JobPlan, settings: Awaited<ReturnType<typeof quoteSettings>>, start: Date, address: BookingRequest['address'] | null): Promise<Booking | null> {
  const { manager, now } = ctx;
  const ownerId = ctx.actor.userId!;
  const [held]: { id: string }[] = await manager.query(
    "SELECT id FROM booking WHERE owner_user_id = ? AND organisation_id = ? AND offer_id = ? AND start_at = ? AND status = 'held' AND hold_expires_at > ? ORDER BY created_at DESC LIMIT 1 FOR UPDATE",
    [ownerId, plan.partner.id, plan.offer.id, start, now],
  );
  if (!held) return null;
  const row = await findBookingRow(manager, held.id, { ownerUserId: ownerId }, true);
  const quote = quoteFor(plan, settings, {
    vatId: body.customer.kind === 'business' ? body.customer.vatId : null,
    supplyDate: localDate(start, row.time_zone),
  });
  const samePlace = row.job_at === body.jobAt && Number(row.job_lat) === plan.location.lat && Number(row.job_lng) === plan.location.lng;
  const sameTechnician = !body.technicianId || body.technicianId === row.technician_user_id;
  if (samePlace && sameTechnician && quote.grossMinor === minor(row.gross_minor) && quote.currency === row.currency && row.checkout_url) {
    await manager.query('UPDATE booking SET address = ?, vehicle = ?, customer = ?, phone = ?, notes = ?, quote = ?, kit = ? WHERE id = ?', [
      ...ownerEntries(body, plan, quote, address, customerOf(row)),
      row.id,
    ]);
    await audit(ctx, { action: 'booking.resume-hold', entityType: 'booking', entityId: row.id, organisationId: row.organisation_id, after: { reference: row.reference } });
    return one(ctx, await findBookingRow(manager, row.id, {}), 'owner', now);
  }
  // paid meanwhile: the booking has moved on, and the start is checked like anyone else's
  if (!(await closeCheckout(ctx, row))) return null;
  await transition(ctx, row.id, 'released', 'owner', 'The owner changed the details before paying and booked again', { set: { payment_status: 'cancelled' } });
  return null;
}

// ---- the owner's side ----

const ownerScope = (ctx: ServiceContext) => ({ ownerUserId: ctx.actor.userId! });
const one = async (ctx: { manager: ServiceContext['manager'] }, row: BookingRow, view: BookingView, now: Date) => (await shapeBookings(ctx.manager, [row], view, now))[0]!;

export async function listOwnerBookings(ctx: ServiceContext, now: Date): Promise<Booking[]> {
  // an abandoned payment page is not a booking the owner needs to see again
  const rows: BookingRow[] = await ctx.manager.query(`${BOOKING_SELECT} WHERE b.owner_user_id = ? AND b.status <> 'released' ORDER BY b.start_at DESC, b.id LIMIT 500`, [ctx.actor.userId]);
  return shapeBookings(ctx.manager, rows, 'owner', now);
}

export async function getOwnerBooking(ctx: ServiceContext, id: string, now: Date): Promise<Booking> {
  return one(ctx, await findBookingRow(ctx.manager, id, ownerScope(ctx)), 'owner', now);
}

/** The booking as an iCalendar file for the owner. */
export async function ownerCalendar(ctx: ServiceContext, id: string, publicUrl: string): Promise<{ reference: string; text: string }> {
  const row = await findBookingRow(ctx.manager, id, ownerScope(ctx));
  return { reference: row.reference, text: calendarText(ctx.manager, row, publicUrl) };
}

/**
 * The owner cancels a requested or confirmed booking before the start. A requested booking is
 * free; a confirmed one follows the policy of the quote: no fee releases the hold, a fee is
 * captured (only that amount; the rest of the hold is released).
 */
export async function cancelByOwner(ctx: BookingContext, id: string, reason: string | undefined): Promise<Booking> {
  const row = await findBookingRow(ctx.manager, id, ownerScope(ctx), true);
  assertTransition(row, 'cancelled_by_owner', 'owner');
  const terms = cancellationNow(row, ctx.now);
  if (!terms.allowed) throw NotCancellable('The job has started, so the booking can no longer be cancelled here. Please call the partner.');
  const set = terms.feeMinor > 0 ? await captureHeld(ctx, row, terms.feeMinor, 'capture-cancellation-fee') : await releaseHold(ctx, row);
  const after = await transition(ctx, id, 'cancelled_by_owner', 'owner', reason?.trim() || null, { set, money: terms });
  return one(ctx, after, 'owner', ctx.now);
}

/** The owner moves a requested or confirmed booking, while cancelling would still be free. */
export async function rescheduleByOwner(ctx: BookingContext, id: string, start: string): Promise<Booking> {
  const row = await findBookingRow(ctx.manager, id, ownerScope(ctx), true);
  const freeHours = quoteOf(row).cancellation.freeUntilHours;
  const may = ownerReschedule(row.status, row.start_at, freeHours, ctx.now);
  if (!may.allowed && may.reason === 'status') throw BookingStateConflict(`Booking ${row.reference} can be moved only while it is requested or confirmed.`);
  if (!may.allowed) {
    throw RescheduleClosed(
      `A booking can be moved until ${freeHours} hours before its start; this one starts in ${Math.max(0, Math.floor(may.hoursLeft))} hours. You can still cancel it under the partner's policy, or call the partner.`,
    );
  }
  return one(ctx, await moveBooking(ctx, row, new Date(start), [row.technician_user_id], 'owner'), 'owner', ctx.now);
}

/** The owner leaves the payment page (the cancel URL): the held slot is given back. */
export async function releaseByOwner(ctx: BookingContext, id: string): Promise<Booking> {
  const row = await findBookingRow(ctx.manager, id, ownerScope(ctx), true);
  if (row.status === 'released') return one(ctx, row, 'owner', ctx.now);
  assertTransition(row, 'released', 'owner');
  if (!(await closeCheckout(ctx, row))) {
    throw BookingPaid('This booking is paid already and waits for the partner; cancel it instead if you no longer want it.');
  }
  const after = await transition(ctx, id, 'released', 'owner', 'The owner left the payment page', { set: { payment_status: 'cancelled' } });
  return one(ctx, after, 'owner', ctx.now);
}

/** Moves a booking to `start` for the first free of `technicianIds` (checked like a new booking). */
async function moveBooking(ctx: BookingContext, row: BookingRow, start: Date, technicianIds: string[], by: 'owner' | 'partner'): Promise<BookingRow> {
  await lockTechnicians(ctx.manager, row.organisation_id, technicianIds);
  const technicians = await technicianHours(ctx.manager, row.organisation_id, technicianIds);
  const durationMinutes = Math.round((new Date(row.end_at).getTime() - new Date(row.start_at).getTime()) / MINUTE_MS);
  const chosen = await freeTechnician(ctx.manager, {
    technicians,
    base: baseOf(row),
    location: { lat: Number(row.job_lat), lng: Number(row.job_lng) },
    durationMinutes,
    start,
    now: ctx.now,
    excludeBookingId: row.id,
  });
  if (!chosen) throw SlotTaken(SLOT_TAKEN_MESSAGE);
  await ctx.manager.query(
    'UPDATE booking SET start_at = ?, end_at = ?, technician_user_id = ?, time_zone = ?, calendar_sequence = calendar_sequence + 1, reminder_sent_at = NULL WHERE id = ?',
    [start, new Date(start.getTime() + durationMinutes * MINUTE_MS), chosen.id, chosen.timeZone, row.id],
  );
  const after = await findBookingRow(ctx.manager, row.id, {});
  await recordReschedule(ctx, row, after, by);
  return after;
}

// ---- the partner's side ----

const orgScope = (ctx: ServiceContext) => {
  if (!ctx.actor.organisationId) throw new Error('bookings service called outside an organisation scope');
  return { organisationId: ctx.actor.organisationId };
};

/** The technician whose jobs alone the caller may read, or null for every booking of the organisation. */
function assignedTechnician(ctx: ServiceContext): string | null {
  const { roles, userId } = ctx.actor;
  if (seesAllOrganisationBookings(roles)) return null;
  if (!userId) throw new Error('bookings service called without a signed-in caller');
  return userId;
}

/** SQL conditions of the partner's list filters (without a status, held and released bookings are left out). */
function listConditions(ctx: ServiceContext, q: Omit<BookingListQuery, 'limit'>): { sql: string; params: unknown[] } {
  const where = ['b.organisation_id = ?'];
  const params: unknown[] = [orgScope(ctx).organisationId];
  const assigned = assignedTechnician(ctx);
  if (assigned) {
    where.push('b.technician_user_id = ?');
    params.push(assigned);
  }
  if (q.status) {
    where.push('b.status = ?');
    params.push(q.status);
  } else where.push("b.status NOT IN ('held', 'released')");
  // a booking is in [from, to) when any of it is
  if (q.from) {
    where.push('b.end_at > ?');
    params.push(new Date(q.from));
  }
  if (q.to) {
    where.push('b.start_at < ?');
    params.push(new Date(q.to));
  }
  if (q.technicianId) {
    where.push('b.technician_user_id = ?');
    params.push(q.technicianId);
  }
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push("(b.reference LIKE ? OR JSON_UNQUOTE(JSON_EXTRACT(b.customer, '$.name')) LIKE ? OR JSON_UNQUOTE(JSON_EXTRACT(b.customer, '$.email')) LIKE ?)");
    params.push(like, like, like);
  }
  return { sql: where.join(' AND '), params };
}

export async function listOrgBookings(ctx: ServiceContext, q: BookingListQuery, now: Date): Promise<Booking[]> {
  const c = listConditions(ctx, q);
  const rows: BookingRow[] = await ctx.manager.query(`${BOOKING_SELECT} WHERE ${c.sql} ORDER BY b.start_at, b.id LIMIT ?`, [...c.params, q.limit]);
  return shapeBookings(ctx.manager, rows, 'partner', now);
}

export async function getOrgBooking(ctx: ServiceContext, id: string, now: Date): Promise<Booking> {
  const row = await findBookingRow(ctx.manager, id, orgScope(ctx));
  const assigned = assignedTechnician(ctx);
  // another technician's job answers as if it were not there, like another organisation's
  if (assigned && row.technician_user_id !== assigned) throw NotFound('There is no such booking.');
  return one(ctx, row, 'partner', now);
}

/** At most this many rows in one CSV export. */
export const CSV_MAX_ROWS = 10_000;

/** RFC 4180: fields with a comma, quote or line break in double quotes, quotes doubled, lines ended by CRLF. */
function csvField(value: string | number | null): string {
  if (value === null) return '';
  let text = String(value);
  // a text starting like a formula would run in a spreadsheet (OWASP: CSV injection)
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const CSV_HEADER = [
  'reference',
  'status',
  'start_utc',
  'end_utc',
  'local_start',
  'time_zone',
  'service_type',
  'technician',
  'customer_name',
  'customer_email',
  'customer_phone',
  'customer_kind',
  'company_name',
  'vat_id',
  'job_at',
  'address',
  'currency',
  'net',
  'vat',
  'gross',
  'payment_status',
  'authorised',
  'captured',
  'refunded',
  'created_utc',
];

/** The partner's bookings (the list's filters) as CSV, one row per booking under a header row. */
export async function exportOrgBookings(ctx: ServiceContext, q: Omit<BookingListQuery, 'limit'>): Promise<string> {
  const c = listConditions(ctx, q);
  const rows: BookingRow[] = await ctx.manager.query(`${BOOKING_SELECT} WHERE ${c.sql} ORDER BY b.start_at, b.id LIMIT ?`, [...c.params, CSV_MAX_ROWS]);
  const lines = [CSV_HEADER.join(',')];
  for (const r of rows) {
    const quote = quoteOf(r);
    const major = (amountMinor: number) => toMajorString(amountMinor, quote.currency, quote.minorUnits);
    const customer = customerOf(r);
    const address = addressOf(r);
    const start = new Date(r.start_at);
    const local = new Intl.DateTimeFormat('sv-SE', { timeZone: r.time_zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' }).format(start);
    lines.push(
      [
        r.reference,
        r.status,
        start.toISOString(),
        new Date(r.end_at).toISOString(),
        local,
        r.time_zone,
        r.service_name,
        r.technician_name,
        customer.name,
        customer.email,
        r.phone,
        customer.kind,
        customer.companyName,
        customer.vatId,
        r.job_at,
        address ? `${address.line}, ${address.postalCode} ${address.city}, ${address.country}` : r.workshop_address,
        quote.currency,
        major(quote.netMinor),
        major(quote.vatMinor),
        major(quote.grossMinor),
        r.payment_status,
        major(minor(r.authorised_minor)),
        major(minor(r.captured_minor)),
        major(minor(r.refunded_minor)),
        new Date(r.created_at).toISOString(),
      ]
        .map(csvField)
        .join(','),
    );
  }
  return `${lines.join('\r\n')}\r\n`;
}

/**
 * A partner decision. Partner admins decide on any booking of the organisation; a technician only
 * on the bookings assigned to them.
 */
export async function decide(ctx: BookingContext, id: string, d: BookingDecision): Promise<Booking> {
  const row = await findBookingRow(ctx.manager, id, orgScope(ctx), true);
  if (!ctx.actor.roles.includes('partner_admin') && row.technician_user_id !== ctx.actor.userId) {
    throw Forbidden('Only a partner admin or the technician assigned to this booking can decide on it.');
  }
  let after: BookingRow;
  switch (d.action) {
    case 'accept':
      after = await transition(ctx, id, 'confirmed', 'partner', null);
      break;
    case 'decline':
      assertTransition(row, 'declined', 'partner');
      after = await transition(ctx, id, 'declined', 'partner', d.reason, { set: await releaseHold(ctx, row) });
      break;
    case 'start':
      await assertStartAllowed(ctx, row);
      after = await transition(ctx, id, 'in_progress', 'partner', null);
      break;
    case 'complete': {
      assertCompletable(row);
      const set = await captureHeld(ctx, row, minor(row.authorised_minor), 'capture');
      await takeKitFromStock(ctx.manager, row);
      after = await transition(ctx, id, 'completed', 'partner', null, { set });
      break;
    }
    case 'no-show': {
      assertTransition(row, 'no_show', 'partner');
      if (ctx.now < new Date(row.start_at)) throw BookingStateConflict('A no-show can be recorded once the start time has passed.');
      const fee = Math.min(quoteOf(row).cancellation.feeMinor, minor(row.authorised_minor));
      const set = fee > 0 ? await captureHeld(ctx, row, fee, 'capture-no-show-fee') : await releaseHold(ctx, row);
      after = await transition(ctx, id, 'no_show', 'partner', fee > 0 ? 'The customer was not there; the cancellation fee was taken' : 'The customer was not there', { set });
      break;
    }
    case 'cancel':
      assertTransition(row, 'cancelled_by_partner', 'partner');
      after = await transition(ctx, id, 'cancelled_by_partner', 'partner', d.reason, { set: await releaseHold(ctx, row) });
      break;
    case 'reschedule': {
      if (!MOVABLE_STATUSES.includes(row.status)) throw BookingStateConflict(`Booking ${row.reference} can be moved only while it is requested or confirmed.`);
      let technicianIds = [row.technician_user_id];
      if (d.technicianId) {
        const team = row.offer_id ? ((await offerTechnicians(ctx.manager, [row.offer_id])).get(row.offer_id) ?? []) : [];
        if (d.technicianId !== row.technician_user_id && !team.some((t) => t.id === d.technicianId)) throw invalid('technicianId', 'This technician does not do this service');
        technicianIds = [d.technicianId];
      }
      after = await moveBooking(ctx, row, new Date(d.start), technicianIds, 'partner');
      break;
    }
  }
  return one(ctx, after, 'partner', ctx.now);
}
