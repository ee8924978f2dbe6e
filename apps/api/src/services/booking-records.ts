// Booking rows as the database keeps them, and as both apps see them: the owner's view (no
// partner share) and the partner's (with it). Reading only; changes go through the lifecycle.
import type { EntityManager } from 'typeorm';
import {
  jobStartWindow,
  ownerCancellation,
  type Booking,
  type BookingActor,
  type BookingAddress,
  type BookingStatus,
  type Quote,
  type VehicleProfile,
} from '@emberline/domain';
import { NotFound } from '../lib/errors';
import { json } from '../lib/json-column';
import { jobStartWindowMinutes } from './network-settings';
import type { KitLine } from './quote.service';

export type PaymentStatus = Booking['payment']['status'];

export interface BookingRow {
  id: string;
  reference: string;
  organisation_id: string;
  technician_user_id: string;
  owner_user_id: string;
  offer_id: string | null;
  service_type_id: number;
  status: BookingStatus;
  start_at: Date;
  end_at: Date;
  time_zone: string;
  job_at: 'owner' | 'workshop';
  job_lat: number;
  job_lng: number;
  address: unknown;
  vehicle: unknown;
  customer: unknown;
  phone: string | null;
  notes: string | null;
  quote: unknown;
  kit: unknown;
  currency: string;
  gross_minor: string | number;
  checkout_session_id: string | null;
  checkout_url: string | null;
  payment_intent_id: string | null;
  payment_status: PaymentStatus;
  authorised_minor: string | number;
  captured_minor: string | number;
  refunded_minor: string | number;
  hold_expires_at: Date | null;
  reminder_sent_at: Date | null;
  calendar_sequence: number;
  created_at: Date;
  updated_at: Date;
  // joined
  partner_name: string;
  partner_phone: string | null;
  partner_email: string | null;
  workshop_address: string | null;
  base_lat: number | null;
  base_lng: number | null;
  service_code: string;
  service_name: string;
  technician_name: string | null;
}

/** The customer as recorded at booking (name and e-mail from the owner's account then). */
export interface BookingCustomerRecord {
  kind: 'consumer' | 'business';
  name: string;
  email: string;
  locale: string;
  companyName: string | null;
  vatId: string | null;
}

export const BOOKING_SELECT = `SELECT b.*, COALESCE(p.trading_name, o.name) AS partner_name, p.phone AS partner_phone,
    (SELECT u.email FROM membership m JOIN user_account u ON u.id = m.user_id WHERE m.organisation_id = b.organisation_id AND m.role = 'partner_admin' ORDER BY m.created_at, m.user_id LIMIT 1) AS partner_email,
    p.workshop_address, p.base_lat, p.base_lng,
    st.code AS service_code, st.name AS service_name, t.name AS technician_name
  FROM booking b
  JOIN organisation o ON o.id = b.organisation_id
  LEFT JOIN partner_profile p ON p.organisation_id = b.organisation_id
  JOIN service_type st ON st.id = b.service_type_id
  LEFT JOIN user_account t ON t.id = b.technician_user_id`;

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString();
export const minor = (v: string | number) => Number(v);
export const quoteOf = (r: BookingRow) => json<Quote>(r.quote);
export const customerOf = (r: BookingRow) => json<BookingCustomerRecord>(r.customer);
export const kitOf = (r: BookingRow) => json<KitLine[]>(r.kit);
export const addressOf = (r: BookingRow) => (r.address === null ? null : json<BookingAddress>(r.address));

/** Where the job happens, in words: the owner's address or the partner's workshop. */
export function placeOf(r: BookingRow): string {
  const address = addressOf(r);
  if (r.job_at === 'owner' && address) return `${address.line}, ${address.postalCode} ${address.city}`;
  return r.workshop_address ?? r.partner_name;
}

/**
 * What cancelling now would cost the owner: a requested booking (the partner has not accepted)
 * is free until the start; a confirmed one follows the offer's policy of the quote snapshot.
 */
export function cancellationNow(r: BookingRow, now: Date): Booking['cancellationNow'] {
  const paid = minor(r.authorised_minor);
  const start = new Date(r.start_at);
  if (r.status === 'requested') return start > now ? { allowed: true, feeMinor: 0, refundMinor: paid } : { allowed: false, feeMinor: 0, refundMinor: 0 };
  if (r.status === 'confirmed') return ownerCancellation(quoteOf(r).cancellation, paid, start, now);
  return { allowed: false, feeMinor: 0, refundMinor: 0 };
}

interface EventRow {
  booking_id: string;
  from_status: BookingStatus | null;
  to_status: BookingStatus;
  actor: BookingActor;
  note: string | null;
  at: Date;
}

async function historyOf(manager: EntityManager, ids: string[]): Promise<Map<string, Booking['history']>> {
  const byBooking = new Map<string, Booking['history']>();
  if (!ids.length) return byBooking;
  const rows: EventRow[] = await manager.query('SELECT booking_id, from_status, to_status, actor, note, at FROM booking_event WHERE booking_id IN (?) ORDER BY booking_id, id', [ids]);
  for (const e of rows) {
    const list = byBooking.get(e.booking_id) ?? [];
    list.push({ at: iso(e.at), from: e.from_status, to: e.to_status, actor: e.actor, note: e.note });
    byBooking.set(e.booking_id, list);
  }
  return byBooking;
}

export type BookingView = 'owner' | 'partner';

/** Statuses in which the owner is given the partner's phone and e-mail: the time is agreed. */
const AGREED = new Set<BookingStatus>(['confirmed', 'in_progress', 'completed']);

function toBooking(r: BookingRow, history: Booking['history'], view: BookingView, now: Date, startWindowMinutes: number | null): Booking {
  const quote = quoteOf(r);
  const customer = customerOf(r);
  const vehicle = json<VehicleProfile & { vehicleId?: string }>(r.vehicle);
  const { partner, ...ownerQuote } = quote;
  const held = r.status === 'held';
  return {
    id: r.id,
    reference: r.reference,
    status: r.status,
    partner: { id: r.organisation_id, name: r.partner_name, ...(AGREED.has(r.status) ? { phone: r.partner_phone, email: r.partner_email } : {}) },
    serviceType: { code: r.service_code, name: r.service_name },
    start: iso(r.start_at),
    end: iso(r.end_at),
    timeZone: r.time_zone,
    technician: r.technician_name === null ? null : { id: r.technician_user_id, name: r.technician_name },
    jobAt: r.job_at,
    address: addressOf(r),
    workshopAddress: r.job_at === 'workshop' ? r.workshop_address : null,
    vehicle: {
      model: vehicle.model,
      fuel: vehicle.fuel,
      factoryHeater: vehicle.factoryHeater,
      climateControl: vehicle.climateControl,
      electricalSystemV: vehicle.electricalSystemV,
      year: vehicle.year,
    },
    customer: { kind: customer.kind, name: customer.name, email: customer.email, phone: r.phone, companyName: customer.companyName, vatId: customer.vatId },
    notes: r.notes,
    quote: ownerQuote,
    partnerQuote: view === 'partner' ? partner : null,
    payment: { status: r.payment_status, authorisedMinor: minor(r.authorised_minor), capturedMinor: minor(r.captured_minor), refundedMinor: minor(r.refunded_minor) },
    holdExpiresAt: held && r.hold_expires_at ? iso(r.hold_expires_at) : null,
    // the payment page only while the slot is held, and only for the owner who pays
    checkoutUrl: held && view === 'owner' ? r.checkout_url : null,
    cancellationNow: cancellationNow(r, now),
    startWindow: startWindowMinutes !== null && r.status === 'confirmed' ? windowOf(r, startWindowMinutes) : null,
    history,
    createdAt: iso(r.created_at),
  };
}

export async function shapeBookings(manager: EntityManager, rows: BookingRow[], view: BookingView, now: Date): Promise<Booking[]> {
  const history = await historyOf(manager, rows.map((r) => r.id));
  // the Console greys out "Start" outside the window the API enforces
  const minutes = view === 'partner' && rows.some((r) => r.status === 'confirmed') ? await jobStartWindowMinutes(manager) : null;
  return rows.map((r) => toBooking(r, history.get(r.id) ?? [], view, now, minutes));
}

function windowOf(r: BookingRow, minutes: number): { from: string; until: string } {
  const w = jobStartWindow(new Date(r.start_at), r.time_zone, minutes);
  return { from: w.from.toISOString(), until: w.until.toISOString() };
}

/** One booking by id within a scope (owner or organisation); 404 outside it. `lock` takes the row for the transaction. */
export async function findBookingRow(manager: EntityManager, id: string, scope: { ownerUserId?: string; organisationId?: string }, lock = false): Promise<BookingRow> {
  const where: string[] = ['b.id = ?'];
  const params: unknown[] = [id];
  if (scope.ownerUserId) {
    where.push('b.owner_user_id = ?');
    params.push(scope.ownerUserId);
  }
  if (scope.organisationId) {
    where.push('b.organisation_id = ?');
    params.push(scope.organisationId);
  }
  // locking: the booking row alone (the joined rows stay free for everyone else), read by the
  // locking read itself, which sees the latest committed version whatever the snapshot
  const [locked]: Partial<BookingRow>[] = lock ? await manager.query(`SELECT b.* FROM booking b WHERE ${where.join(' AND ')} FOR UPDATE`, params) : [{}];
  if (!locked) throw NotFound('There is no such booking.');
  const [row]: BookingRow[] = await manager.query(`${BOOKING_SELECT} WHERE ${where.join(' AND ')}`, params);
  if (!row) throw NotFound('There is no such booking.');
  return { ...row, ...locked };
}
