// The bookings' scheduled work: holds that lapsed are released (and their payment pages closed),
// requested bookings nobody confirmed before the start expire (their hold on the card released),
// and owners get one reminder a day before the start. Each run holds a named lock, so with several
// API instances one runs at a time; each booking is changed in its own transaction.
import type { DataSource } from 'typeorm';
import { ANONYMOUS } from '../lib/context';
import type { Logger } from '../lib/logger';
import type { PaymentGateway } from '../payments/gateway';
import { PaymentsUnavailable } from '../payments/errors';
import { mailReminder, releaseHold, transition, type BookingContext } from './booking-lifecycle.service';
import { findBookingRow } from './booking-records';
import { checkoutCompleted } from './payment-events.service';

export const EXPIRE_HOLDS_LOCK = 'emberline.expire-holds';
export const BOOKING_REMINDERS_LOCK = 'emberline.booking-reminders';
/** The reminder goes out this long before the start. */
export const REMINDER_BEFORE_MS = 24 * 3_600_000;

export interface BookingJobOptions {
  dataSource: DataSource;
  publicUrl: string;
  now?: Date;
  logger?: Logger;
}

/** Runs `fn` while holding the named lock on one connection; answers null when another process holds it. */
async function withLock<T>(dataSource: DataSource, name: string, logger: Logger | undefined, fn: () => Promise<T>): Promise<T | null> {
  const runner = dataSource.createQueryRunner();
  let locked = false;
  try {
    await runner.connect();
    const rows: { locked: number | string | null }[] = await runner.query('SELECT GET_LOCK(?, 0) AS locked', [name]);
    locked = Number(rows[0]?.locked) === 1;
    if (!locked) return null;
    return await fn();
  } finally {
    if (locked) {
      await runner.query('SELECT RELEASE_LOCK(?)', [name]).catch((err: unknown) => logger?.warn({ lock: name, error: (err as Error).message }, 'could not release a job lock'));
    }
    await runner.release();
  }
}

export interface ExpireHoldsResult {
  released: number;
  /** Paid just before the hold lapsed: moved on as the webhook would have. */
  paid: number;
  expired: number;
  failed: number;
  skipped: boolean;
}

/**
 * Held bookings past their hold: if the owner paid meanwhile the payment is applied (the webhook
 * may still be on its way), otherwise the payment page is closed and the slot released — also when
 * the provider cannot be reached (a payment arriving later is released again by the webhook).
 * Requested bookings whose start has passed expire and their hold is cancelled.
 */
export async function runExpireHolds(o: BookingJobOptions & { payments: PaymentGateway }): Promise<ExpireHoldsResult> {
  const now = o.now ?? new Date();
  const result: ExpireHoldsResult = { released: 0, paid: 0, expired: 0, failed: 0, skipped: false };
  const ran = await withLock(o.dataSource, EXPIRE_HOLDS_LOCK, o.logger, async () => {
    const lapsed: { id: string }[] = await o.dataSource.query("SELECT id FROM booking WHERE status = 'held' AND hold_expires_at <= ? ORDER BY hold_expires_at LIMIT 500", [now]);
    for (const { id } of lapsed) {
      try {
        const outcome = await o.dataSource.transaction('READ COMMITTED', async (manager) => {
          const ctx: BookingContext = { manager, actor: ANONYMOUS, payments: o.payments, publicUrl: o.publicUrl, now, logger: o.logger };
          const row = await findBookingRow(manager, id, {}, true);
          if (row.status !== 'held') return null;
          if (row.checkout_session_id) {
            try {
              const checkout = await o.payments.getCheckout(row.checkout_session_id);
              if (checkout.status === 'complete') {
                await checkoutCompleted(ctx, id, checkout);
                return 'paid' as const;
              }
              if (checkout.status === 'open') await o.payments.expireCheckout(row.checkout_session_id, `booking:${id}:expire-checkout`);
            } catch (err) {
              if (!(err instanceof PaymentsUnavailable)) throw err;
              o.logger?.warn({ bookingId: id }, 'the payments provider is unreachable; the hold is released and its payment page left to expire');
            }
          }
          await transition(ctx, id, 'released', 'system', 'The hold lapsed before the payment', { set: { payment_status: 'cancelled' } });
          return 'released' as const;
        });
        if (outcome) result[outcome]++;
      } catch (err) {
        result.failed++;
        o.logger?.error({ bookingId: id, error: (err as Error).message }, 'a lapsed hold could not be released');
      }
    }

    const unanswered: { id: string }[] = await o.dataSource.query("SELECT id FROM booking WHERE status = 'requested' AND start_at <= ? ORDER BY start_at LIMIT 500", [now]);
    for (const { id } of unanswered) {
      try {
        const done = await o.dataSource.transaction('READ COMMITTED', async (manager) => {
          const ctx: BookingContext = { manager, actor: ANONYMOUS, payments: o.payments, publicUrl: o.publicUrl, now, logger: o.logger };
          const row = await findBookingRow(manager, id, {}, true);
          if (row.status !== 'requested') return false;
          await transition(ctx, id, 'expired', 'system', 'Not confirmed before the start', { set: await releaseHold(ctx, row) });
          return true;
        });
        if (done) result.expired++;
      } catch (err) {
        result.failed++;
        o.logger?.error({ bookingId: id, error: (err as Error).message }, 'an unanswered booking could not be expired');
      }
    }
  });
  return ran === null ? { ...result, skipped: true } : result;
}

/**
 * One reminder per confirmed booking, once it starts within REMINDER_BEFORE_MS: reminder_sent_at
 * is set in the same transaction as the e-mail is queued, and only where it is still empty.
 */
export async function runBookingReminders(o: BookingJobOptions): Promise<{ sent: number; skipped: boolean }> {
  const now = o.now ?? new Date();
  let sent = 0;
  const ran = await withLock(o.dataSource, BOOKING_REMINDERS_LOCK, o.logger, async () => {
    const due: { id: string }[] = await o.dataSource.query(
      "SELECT id FROM booking WHERE status = 'confirmed' AND reminder_sent_at IS NULL AND start_at > ? AND start_at <= ? ORDER BY start_at LIMIT 1000",
      [now, new Date(now.getTime() + REMINDER_BEFORE_MS)],
    );
    for (const { id } of due) {
      try {
        const done = await o.dataSource.transaction(async (manager) => {
          const marked = await manager.query("UPDATE booking SET reminder_sent_at = ? WHERE id = ? AND status = 'confirmed' AND reminder_sent_at IS NULL", [now, id]);
          if (Number((marked as { affectedRows?: number }).affectedRows ?? 0) !== 1) return false;
          await mailReminder({ manager, publicUrl: o.publicUrl }, await findBookingRow(manager, id, {}));
          return true;
        });
        if (done) sent++;
      } catch (err) {
        o.logger?.error({ bookingId: id, error: (err as Error).message }, 'a booking reminder could not be queued');
      }
    }
  });
  return { sent, skipped: ran === null };
}
