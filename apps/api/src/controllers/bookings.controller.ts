// Handlers for quotes and bookings: the owner's routes, the partner's under /orgs/:orgId, and the
// public quote preview. Changes run in one READ COMMITTED transaction each, so every read after a
// lock sees what the transactions before it committed.
import type { Response } from 'express';
import type { z } from 'zod';
import type { BookingDecision, BookingListQuerySchema, BookingRequestSchema, QuotePreviewQuerySchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as bookings from '../services/bookings.service';
import type { BookingContext } from '../services/booking-lifecycle.service';

type ListQuery = z.output<typeof BookingListQuerySchema>;

/** A file name header that survives any character in the reference (RFC 6266). */
const attachment = (name: string) => `attachment; filename="${name.replace(/[^\w.-]/g, '_')}"`;

export function bookingsController({ dataSource, payments, config, logger }: AppContext) {
  const tx = <T>(actor: Actor, fn: (ctx: BookingContext) => Promise<T>) =>
    dataSource.transaction('READ COMMITTED', (manager) => fn({ manager, actor, payments, publicUrl: config.publicUrl, now: new Date(), logger }));
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });

  return {
    previewQuote: async ({ params, query, actor }: { params: { partnerId: string }; query: z.output<typeof QuotePreviewQuerySchema>; actor: Actor }) => ({
      data: await bookings.previewQuote(read(actor), params.partnerId, query, new Date()),
    }),

    create: async ({ body, actor }: { body: z.output<typeof BookingRequestSchema>; actor: Actor }) => ({ data: await tx(actor, (ctx) => bookings.createBooking(ctx, body)) }),
    listMine: async ({ actor }: { actor: Actor }) => ({ data: await bookings.listOwnerBookings(read(actor), new Date()) }),
    getMine: async ({ params, actor }: { params: { bookingId: string }; actor: Actor }) => ({ data: await bookings.getOwnerBooking(read(actor), params.bookingId, new Date()) }),
    calendar: async ({ params, actor, res }: { params: { bookingId: string }; actor: Actor; res: Response }) => {
      const file = await bookings.ownerCalendar(read(actor), params.bookingId, config.publicUrl);
      res
        .status(200)
        .set({ 'content-type': 'text/calendar; charset=utf-8', 'content-disposition': attachment(`booking-${file.reference}.ics`), 'cache-control': 'private, no-store' })
        .send(file.text);
    },
    cancel: async ({ params, body, actor }: { params: { bookingId: string }; body: { reason?: string }; actor: Actor }) => ({
      data: await tx(actor, (ctx) => bookings.cancelByOwner(ctx, params.bookingId, body.reason)),
    }),
    reschedule: async ({ params, body, actor }: { params: { bookingId: string }; body: { start: string }; actor: Actor }) => ({
      data: await tx(actor, (ctx) => bookings.rescheduleByOwner(ctx, params.bookingId, body.start)),
    }),
    release: async ({ params, actor }: { params: { bookingId: string }; actor: Actor }) => ({ data: await tx(actor, (ctx) => bookings.releaseByOwner(ctx, params.bookingId)) }),

    listOrg: async ({ query, actor }: { query: ListQuery; actor: Actor }) => ({ data: await bookings.listOrgBookings(read(actor), query, new Date()) }),
    getOrg: async ({ params, actor }: { params: { bookingId: string }; actor: Actor }) => ({ data: await bookings.getOrgBooking(read(actor), params.bookingId, new Date()) }),
    exportCsv: async ({ query, actor, res }: { query: Omit<ListQuery, 'limit'>; actor: Actor; res: Response }) => {
      const csv = await bookings.exportOrgBookings(read(actor), query);
      res
        .status(200)
        .set({ 'content-type': 'text/csv; charset=utf-8; header=present', 'content-disposition': attachment(`bookings-${new Date().toISOString().slice(0, 10)}.csv`), 'cache-control': 'private, no-store' })
        .send(csv);
    },
    decide: async ({ params, body, actor }: { params: { bookingId: string }; body: BookingDecision; actor: Actor }) => ({
      data: await tx(actor, (ctx) => bookings.decide(ctx, params.bookingId, body)),
    }),
  };
}
