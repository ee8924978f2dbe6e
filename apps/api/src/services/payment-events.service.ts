// The payments provider's webhook events, each processed exactly once: its id goes into
// payment_event in the same transaction as its effect, so a replayed or concurrent delivery of
// the same event changes nothing. Events may arrive late and out of order, so the effect checks
// the booking's current status (and, for a completed checkout, the provider's current state).
import type { DataSource, EntityManager } from 'typeorm';
import { ANONYMOUS } from '../lib/context';
import type { Logger } from '../lib/logger';
import type { CheckoutStatus, PaymentEvent, PaymentGateway } from '../payments/gateway';
import { PaymentRejected } from '../payments/errors';
import { audit } from './audit.service';
import {
  baseOf,
  freeTechnician,
  lockTechnicians,
  recordEvent,
  technicianHours,
  transition,
  type BookingContext,
} from './booking-lifecycle.service';
import { findBookingRow, minor, type BookingRow } from './booking-records';

export interface PaymentEventDeps {
  dataSource: DataSource;
  payments: PaymentGateway;
  publicUrl: string;
  logger?: Logger;
}

type Obj = Record<string, unknown>;
const str = (v: unknown): string | null => (typeof v === 'string' && v ? v : null);
const metadataBookingId = (o: Obj) => str((o.metadata as Obj | undefined)?.booking_id);

/** The booking an event is about: our id in its metadata, else the payment intent we stored. */
async function bookingOf(manager: EntityManager, event: PaymentEvent): Promise<string | null> {
  const o = event.data.object as unknown as Obj;
  const candidates = [metadataBookingId(o), str(o.client_reference_id)].filter((id): id is string => !!id);
  if (candidates.length) {
    const [row]: { id: string }[] = await manager.query('SELECT id FROM booking WHERE id IN (?) LIMIT 1', [candidates]);
    if (row) return row.id;
  }
  const intent = o.object === 'payment_intent' ? str(o.id) : str(o.payment_intent);
  if (!intent) return null;
  const [row]: { id: string }[] = await manager.query('SELECT id FROM booking WHERE payment_intent_id = ? LIMIT 1', [intent]);
  return row?.id ?? null;
}

const insertedRows = (result: unknown) => (Array.isArray(result) ? result.length : Number((result as { affectedRows?: number })?.affectedRows ?? 0));

/**
 * Applies one verified event. Answers 'duplicate' when it was processed before (nothing changes).
 * Throws when the effect could not be applied (e.g. the provider is unreachable): nothing is
 * recorded then, and the provider delivers the event again.
 */
export async function processPaymentEvent(deps: PaymentEventDeps, event: PaymentEvent, now = new Date()): Promise<'processed' | 'duplicate'> {
  // a replay costs no call to the provider
  const [seen]: unknown[] = await deps.dataSource.query('SELECT 1 AS x FROM payment_event WHERE id = ?', [event.id]);
  if (seen) return 'duplicate';
  const o = event.data.object as unknown as Obj;
  // the event is a snapshot of its moment: what counts is the checkout's state now
  const checkout = event.type === 'checkout.session.completed' && str(o.id) ? await deps.payments.getCheckout(String(o.id)) : null;

  return deps.dataSource.transaction('READ COMMITTED', async (manager) => {
    const bookingId = await bookingOf(manager, event);
    const inserted = await manager.query('INSERT IGNORE INTO payment_event (id, type, booking_id, processed_at) VALUES (?, ?, ?, ?)', [event.id, event.type, bookingId, now]);
    if (insertedRows(inserted) !== 1) return 'duplicate';
    if (!bookingId) return 'processed';
    const ctx: BookingContext = { manager, actor: ANONYMOUS, payments: deps.payments, publicUrl: deps.publicUrl, now, logger: deps.logger };
    switch (event.type) {
      case 'checkout.session.completed':
        if (checkout) await checkoutCompleted(ctx, bookingId, checkout);
        break;
      case 'checkout.session.expired':
        await checkoutExpired(ctx, bookingId, String(o.id));
        break;
      case 'payment_intent.payment_failed':
        await paymentFailed(ctx, bookingId, o);
        break;
      case 'payment_intent.canceled':
        await manager.query("UPDATE booking SET payment_status = 'cancelled' WHERE id = ? AND payment_intent_id = ? AND payment_status = 'authorised'", [bookingId, str(o.id)]);
        break;
      case 'charge.refunded':
        await chargeRefunded(ctx, bookingId, o);
        break;
      default:
        // recorded, nothing to do (e.g. payment_intent.amount_capturable_updated, payment_intent.succeeded)
        break;
    }
    return 'processed';
  });
}

/**
 * The owner paid: the money is held. A held booking becomes requested (and confirmed at once if
 * the organisation auto-confirms). Paid after the hold lapsed, it is kept only if its time is still
 * free; paid after it was released, or too late, the hold on the card is cancelled at once.
 */
export async function checkoutCompleted(ctx: BookingContext, bookingId: string, checkout: CheckoutStatus): Promise<void> {
  if (checkout.status !== 'complete' || !checkout.paymentIntentId) return;
  const row = await findBookingRow(ctx.manager, bookingId, {}, true);
  if (row.checkout_session_id !== checkout.sessionId) return;
  const authorised = checkout.paymentIntentStatus === 'requires_capture' ? checkout.amountCapturableMinor : 0;
  if (!authorised) {
    ctx.logger?.warn({ bookingId, paymentIntentStatus: checkout.paymentIntentStatus }, 'a completed checkout holds no money; the booking is left as it is');
    return;
  }
  const intent = checkout.paymentIntentId;
  const lapsed = row.hold_expires_at !== null && new Date(row.hold_expires_at) <= ctx.now;
  if (row.status === 'held' && (!lapsed || (await stillFree(ctx, row)))) {
    const [org]: { auto_confirm_bookings: number }[] = await ctx.manager.query('SELECT auto_confirm_bookings FROM organisation WHERE id = ?', [row.organisation_id]);
    const autoConfirm = Boolean(Number(org?.auto_confirm_bookings));
    await transition(ctx, bookingId, 'requested', 'system', 'Payment authorised', {
      set: { payment_intent_id: intent, authorised_minor: authorised, payment_status: 'authorised' },
      notifyOwner: !autoConfirm,
    });
    if (autoConfirm) await transition(ctx, bookingId, 'confirmed', 'system', 'Confirmed automatically (the partner confirms every booking)');
    return;
  }
  if (row.status === 'held' || row.status === 'released') {
    await cancelLatePayment(ctx, intent, row);
    if (row.status === 'held') {
      await transition(ctx, bookingId, 'released', 'system', 'Paid after the hold lapsed and the time was taken meanwhile: the payment was released', {
        set: { payment_intent_id: intent, payment_status: 'cancelled' },
      });
    } else {
      await ctx.manager.query("UPDATE booking SET payment_intent_id = ?, payment_status = 'cancelled' WHERE id = ?", [intent, bookingId]);
      await recordEvent(ctx, row, 'released', 'released', 'system', 'Paid after the booking was released: the payment was released');
      await audit(ctx, { action: 'booking.late-payment-released', entityType: 'booking', entityId: bookingId, organisationId: row.organisation_id, after: { paymentIntentId: intent } });
    }
  }
  // any other status: an earlier delivery handled this payment already
}

async function cancelLatePayment(ctx: BookingContext, intent: string, row: BookingRow): Promise<void> {
  try {
    await ctx.payments.cancelAuthorization(intent, `booking:${row.id}:cancel-authorisation`);
  } catch (err) {
    if (!(err instanceof PaymentRejected)) throw err;
    ctx.logger?.warn({ bookingId: row.id, error: err.message }, 'a late payment could not be cancelled; it is no longer held at the provider');
  }
}

/** Whether a held booking's time is still free for its technician (the booking itself left out). */
async function stillFree(ctx: BookingContext, row: BookingRow): Promise<boolean> {
  await lockTechnicians(ctx.manager, row.organisation_id, [row.technician_user_id]);
  const technicians = await technicianHours(ctx.manager, row.organisation_id, [row.technician_user_id]);
  const durationMinutes = Math.round((new Date(row.end_at).getTime() - new Date(row.start_at).getTime()) / 60_000);
  const free = await freeTechnician(ctx.manager, {
    technicians,
    base: baseOf(row),
    location: { lat: Number(row.job_lat), lng: Number(row.job_lng) },
    durationMinutes,
    start: new Date(row.start_at),
    now: ctx.now,
    excludeBookingId: row.id,
  });
  return free !== null;
}

async function checkoutExpired(ctx: BookingContext, bookingId: string, sessionId: string): Promise<void> {
  const row = await findBookingRow(ctx.manager, bookingId, {}, true);
  if (row.status !== 'held' || row.checkout_session_id !== sessionId) return;
  await transition(ctx, bookingId, 'released', 'system', 'The payment page expired', { set: { payment_status: 'cancelled' } });
}

/**
 * A declined card: the hold and the payment page stay, so the owner can try another card until the
 * hold lapses (the expire-holds job then closes the page). The decline is noted in the history and
 * as the payment's status, which a later authorised payment replaces.
 */
async function paymentFailed(ctx: BookingContext, bookingId: string, intent: Obj): Promise<void> {
  const row = await findBookingRow(ctx.manager, bookingId, {}, true);
  // paid meanwhile with another card (or given up): nothing to note on a booking that moved on
  if (row.status !== 'held') return;
  const error = intent.last_payment_error as Obj | null | undefined;
  const why = str(error?.decline_code) ?? str(error?.code) ?? 'declined';
  await ctx.manager.query("UPDATE booking SET payment_status = 'failed', payment_intent_id = ? WHERE id = ? AND status = 'held'", [str(intent.id), bookingId]);
  await recordEvent(ctx, row, 'held', 'held', 'system', `The card was declined (${why}); the time stays held for another card`);
}

async function chargeRefunded(ctx: BookingContext, bookingId: string, charge: Obj): Promise<void> {
  const row = await findBookingRow(ctx.manager, bookingId, {}, true);
  const captured = minor(row.captured_minor);
  if (!captured) return;
  const refunded = Math.min(captured, Number(charge.amount_refunded ?? 0));
  if (refunded <= minor(row.refunded_minor)) return;
  await ctx.manager.query('UPDATE booking SET refunded_minor = ?, payment_status = ? WHERE id = ?', [refunded, refunded >= captured ? 'refunded' : 'partially_refunded', bookingId]);
  await audit(ctx, { action: 'booking.refund', entityType: 'booking', entityId: bookingId, organisationId: row.organisation_id, before: { refundedMinor: minor(row.refunded_minor) }, after: { refundedMinor: refunded } });
}
