// Quotes and bookings: the public quote preview, the owner's bookings under /bookings, and the
// partner's under /orgs/:orgId/bookings (list, detail, CSV export, decisions).
import { z } from 'zod';
import {
  BookingDecisionSchema,
  BookingListQuerySchema,
  BookingRequestSchema,
  BookingSchema,
  HOLD_MINUTES,
  IdSchema,
  InstantSchema,
  OwnerQuoteSchema,
  QuotePreviewQuerySchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { bookingsController } from '../controllers/bookings.controller';

const BookingParams = z.object({ bookingId: IdSchema });
const OrgParams = z.object({ orgId: IdSchema });
const OrgBookingParams = OrgParams.extend({ bookingId: IdSchema });
const One = z.object({ data: BookingSchema });
const Many = z.object({ data: z.array(BookingSchema) });

export function registerBookingRoutes(api: ApiRouter, app: AppContext): void {
  const c = bookingsController(app);

  api.route(
    {
      method: 'get',
      path: '/partners/:partnerId/quote',
      summary: 'What a service with an approved partner would cost',
      description:
        'Labour (the offer), the parts kit and, for work at the owner\'s place (`lat`, `lng` inside the partner\'s area and within its travel reach, else 400 on both), the travel fee from the partner\'s base; VAT per line by the case table, named in `vat.rule`: a private customer pays the VAT of the country where the work is done (`country` of the place, the workshop\'s for work there; Council Directive 2006/112/EC Art. 54(2)(b)), a business (`vatId`) that of the country it is established in (Art. 44), by reverse charge when that is another country than the partner\'s (Art. 196), and no EU VAT outside the EU. When a country the VAT needs is missing the answer is 422 VAT_UNDECIDABLE, never a guessed country. A vehicle the service does not fit is 400 on `serviceType` with the rule\'s message. The same computation prices the booking.',
      tags: ['Bookings'],
      params: z.object({ partnerId: IdSchema }),
      query: QuotePreviewQuerySchema,
      response: z.object({ data: OwnerQuoteSchema }),
      problems: [404, 422],
    },
    c.previewQuote,
  );

  let tags = ['Bookings'];
  const owner = { roles: ['owner' as const] };
  api.route(
    {
      method: 'post',
      path: '/bookings',
      summary: 'Book a start and open the payment page',
      description: `Checks the start like the slot list (the technician's hours, notice, bookings and driving): taken meanwhile is 409 SLOT_TAKEN. The booking is \`held\` for ${HOLD_MINUTES} minutes while the owner pays at \`checkoutUrl\`; the payment is authorised, not taken, until the job is done. Payments unavailable is 503 and nothing is saved.`,
      tags,
      ...owner,
      body: BookingRequestSchema,
      response: One,
      status: 201,
      problems: [409, 422, 503],
    },
    c.create,
  );
  api.route({ method: 'get', path: '/bookings', summary: 'The signed-in owner\'s bookings, latest start first', tags, ...owner, response: Many }, c.listMine);
  api.route({ method: 'get', path: '/bookings/:bookingId', summary: 'One of the owner\'s bookings', tags, ...owner, params: BookingParams, response: One, problems: [404] }, c.getMine);
  api.route(
    {
      method: 'get',
      path: '/bookings/:bookingId/calendar.ics',
      summary: 'The booking as a calendar event (iCalendar, RFC 5545)',
      tags,
      ...owner,
      params: BookingParams,
      produces: ['text/calendar'],
      problems: [404],
    },
    c.calendar,
  );
  api.route(
    {
      method: 'post',
      path: '/bookings/:bookingId/cancel',
      summary: 'Cancel a requested or confirmed booking',
      description: 'Free while the partner has not confirmed; a confirmed booking follows the cancellation policy of its quote (`cancellationNow` says what it costs): the fee is taken from the held payment and the rest released. Once the job has started it is 409.',
      tags,
      ...owner,
      params: BookingParams,
      body: z.object({ reason: z.string().trim().max(500, 'Use at most 500 characters').optional() }),
      response: One,
      problems: [404, 409, 503],
    },
    c.cancel,
  );
  api.route(
    {
      method: 'post',
      path: '/bookings/:bookingId/reschedule',
      summary: 'Move a booking to another start',
      description: 'Possible while cancelling would still be free (until the policy\'s hours before the start), else 409 RESCHEDULE_CLOSED with the reason; the new start is checked like a new booking for the same technician (409 SLOT_TAKEN).',
      tags,
      ...owner,
      params: BookingParams,
      body: z.object({ start: InstantSchema }),
      response: One,
      problems: [404, 409],
    },
    c.reschedule,
  );
  api.route(
    {
      method: 'post',
      path: '/bookings/:bookingId/release',
      summary: 'Give up a held slot (the owner left the payment page)',
      description: 'Closes the payment page and frees the slot. Already paid is 409 BOOKING_PAID; an already released booking is answered as it is.',
      tags,
      ...owner,
      params: BookingParams,
      response: One,
      problems: [404, 409, 503],
    },
    c.release,
  );

  tags = ['Partner bookings'];
  const readers = { org: true, roles: ['partner_admin' as const, 'technician' as const, 'network_admin' as const] };
  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/bookings',
      summary: 'The organisation\'s bookings, by start',
      description:
        'Partner admins (and network admins) see every booking of the organisation, a technician only the jobs assigned to them. Held and released bookings (payment pages) only when asked for by `status`. `from`/`to` keep bookings overlapping that time; `q` searches the reference and the customer\'s name and e-mail.',
      tags,
      ...readers,
      params: OrgParams,
      query: BookingListQuerySchema,
      response: Many,
    },
    c.listOrg,
  );
  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/bookings.csv',
      summary: 'The organisation\'s bookings as CSV (RFC 4180)',
      description: 'The list\'s bookings (a technician\'s own jobs only) and filters; one row per booking under a header row, amounts in major units with a dot, times in UTC and local.',
      tags,
      ...readers,
      params: OrgParams,
      query: BookingListQuerySchema.omit({ limit: true }),
      produces: ['text/csv'],
    },
    c.exportCsv,
  );
  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/bookings/:bookingId',
      summary: 'One booking of the organisation',
      description: 'A technician gets the jobs assigned to them; another technician\'s booking is 404, like another organisation\'s.',
      tags,
      ...readers,
      params: OrgBookingParams,
      response: One,
    },
    c.getOrg,
  );
  api.route(
    {
      method: 'post',
      path: '/orgs/:orgId/bookings/:bookingId/decision',
      summary: 'Accept, decline, start, complete, record a no-show, cancel or move a booking',
      description:
        'Partner admins decide on any booking, technicians on those assigned to them. Declining or cancelling releases the held payment; completing takes it and the kit\'s parts out of stock; a no-show (after the start) takes the cancellation fee only. Moving checks the new start like a new booking. A decision the booking\'s status does not allow is 409 BOOKING_STATE.',
      tags,
      org: true,
      roles: ['partner_admin', 'technician'],
      params: OrgBookingParams,
      body: BookingDecisionSchema,
      response: One,
      problems: [409, 503],
    },
    c.decide,
  );
}
