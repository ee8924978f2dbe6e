// Bookings: the request an owner sends, the booking as both apps see it, and the lifecycle.
import { z } from 'zod';
import { IdSchema } from './accounts';
import { CatalogueCodeSchema } from './catalogue';
import { VehicleProfileSchema } from './eligibility';
import { InstantSchema } from './hours';
import { CountrySchema, isValidVatId } from './onboarding';
import { CurrencySchema } from './offers';
import { queryNumber } from './query';
import { VAT_RULE_CODES, VAT_TREATMENTS } from '../quote/vat-rules';

/** Minutes a slot is held while the owner pays. */
export const HOLD_MINUTES = 10;

export const BOOKING_STATUSES = [
  'held',
  'released',
  'requested',
  'confirmed',
  'in_progress',
  'completed',
  'declined',
  'expired',
  'cancelled_by_owner',
  'cancelled_by_partner',
  'no_show',
] as const;
export const BookingStatusSchema = z.enum(BOOKING_STATUSES);
export type BookingStatus = z.infer<typeof BookingStatusSchema>;

/**
 * Statuses that keep the technician's time taken (a held slot only until its hold expires). A
 * completed job keeps its time too: finishing early must not offer the rest of it to someone else.
 */
export const OCCUPYING_STATUSES: readonly BookingStatus[] = ['held', 'requested', 'confirmed', 'in_progress', 'completed'];

export const BOOKING_ACTORS = ['owner', 'partner', 'system'] as const;
export type BookingActor = (typeof BOOKING_ACTORS)[number];

export const BookingAddressSchema = z.object({
  line: z.string({ error: 'Enter the street and number' }).trim().min(3, 'Enter the street and number').max(160, 'Use at most 160 characters'),
  postalCode: z.string({ error: 'Enter the postal code' }).trim().min(3, 'Enter the postal code').max(16, 'Use at most 16 characters'),
  city: z.string({ error: 'Enter the town' }).trim().min(2, 'Enter the town').max(100, 'Use at most 100 characters'),
  country: CountrySchema,
  lat: z.number({ error: 'Put the pin where the vehicle will be' }).min(-90, 'Latitude is −90 to 90').max(90, 'Latitude is −90 to 90'),
  lng: z.number({ error: 'Put the pin where the vehicle will be' }).min(-180, 'Longitude is −180 to 180').max(180, 'Longitude is −180 to 180'),
});
export type BookingAddress = z.infer<typeof BookingAddressSchema>;

export const BookingCustomerSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('consumer') }),
    z.object({
      kind: z.literal('business'),
      companyName: z.string().trim().min(2, 'Enter the company name').max(160, 'Use at most 160 characters'),
      vatId: z
        .string({ error: 'Enter the VAT ID' })
        .trim()
        .refine((v) => isValidVatId(v), 'This VAT ID does not have a valid format for its country'),
    }),
  ],
  { error: 'Choose private or business' },
);
export type BookingCustomer = z.infer<typeof BookingCustomerSchema>;

export const BookingRequestSchema = z
  .object({
    partnerId: IdSchema,
    serviceType: CatalogueCodeSchema,
    start: InstantSchema,
    /** A technician from the slot's list; left out, the first free one is taken. */
    technicianId: IdSchema.optional(),
    jobAt: z.enum(['owner', 'workshop'], { error: 'Choose at your place or at the workshop' }),
    /** Where the vehicle is, for work at the owner's place. */
    address: BookingAddressSchema.optional(),
    vehicleId: IdSchema.optional(),
    vehicle: VehicleProfileSchema.extend({ model: z.string().trim().min(1, 'Enter the model').max(120, 'Use at most 120 characters') }),
    customer: BookingCustomerSchema,
    phone: z.string().trim().max(32, 'Use at most 32 characters').optional(),
    notes: z.string().trim().max(1000, 'Use at most 1000 characters').optional(),
  })
  .superRefine((v, ctx) => {
    if (v.jobAt === 'owner' && !v.address) ctx.addIssue({ code: 'custom', path: ['address'], message: 'Enter the address where the vehicle will be' });
  });
export type BookingRequest = z.input<typeof BookingRequestSchema>;

const VatRuleSchema = z.object({
  code: z.enum(VAT_RULE_CODES),
  article: z.string().describe('Articles of Council Directive 2006/112/EC'),
  params: z.object({
    customer: z.enum(['consumer', 'business']),
    supplierCountry: z.string(),
    workCountry: z.string().nullable(),
    customerCountry: z.string().nullable(),
    placeOfSupply: z.string(),
  }),
});
const QuoteLineSchema = z.object({ kind: z.enum(['labour', 'parts', 'travel']), description: z.string(), netMinor: z.number().int(), vatRateBp: z.number().int(), vatMinor: z.number().int(), grossMinor: z.number().int() });
export const QuoteSchema = z.object({
  currency: CurrencySchema,
  minorUnits: z.number().int(),
  lines: z.array(QuoteLineSchema),
  netMinor: z.number().int(),
  vatMinor: z.number().int(),
  grossMinor: z.number().int(),
  vat: z.object({
    treatment: z.enum(VAT_TREATMENTS),
    country: z.string(),
    rateBp: z.number().int(),
    validFrom: z.string().nullable(),
    note: z.string().nullable(),
    /** Which case of the VAT table applied (`VAT_CASES`); absent on quotes stored before it was recorded. */
    rule: VatRuleSchema.optional(),
  }),
  depositMinor: z.number().int(),
  cancellation: z.object({ freeUntilHours: z.number().int(), feeMinor: z.number().int() }),
  partner: z.object({ commissionBp: z.number().int(), commissionMinor: z.number().int(), partnerShareMinor: z.number().int(), processingFeeEstimateMinor: z.number().int() }),
});

/** What the owner may see of a quote (the partner's share and fees are for the Console). */
export const OwnerQuoteSchema = QuoteSchema.omit({ partner: true });

export const QuotePreviewQuerySchema = VehicleProfileSchema.extend({
  serviceType: CatalogueCodeSchema,
  jobAt: z.enum(['owner', 'workshop']),
  lat: queryNumber(z.number().min(-90, 'Latitude is −90 to 90').max(90, 'Latitude is −90 to 90'), 'Enter a latitude').optional(),
  lng: queryNumber(z.number().min(-180, 'Longitude is −180 to 180').max(180, 'Longitude is −180 to 180'), 'Enter a longitude').optional(),
  country: CountrySchema.optional().describe('Country of the work place; defaults to the partner\'s'),
  start: InstantSchema.optional().describe('Day of the work for the VAT rate; defaults to today'),
  vatId: z.string().trim().optional().describe('A business customer\'s VAT ID'),
});

export const BookingEventSchema = z.object({ at: z.string(), from: BookingStatusSchema.nullable(), to: BookingStatusSchema, actor: z.enum(BOOKING_ACTORS), note: z.string().nullable() });

export const BookingSchema = z.object({
  id: IdSchema,
  reference: z.string().describe('Short code for e-mails and phone calls'),
  status: BookingStatusSchema,
  /** `phone` and `email` (the first partner admin's) once the time is agreed, so the owner can reach them. */
  partner: z.object({ id: IdSchema, name: z.string(), phone: z.string().nullable().optional(), email: z.string().nullable().optional() }),
  serviceType: z.object({ code: CatalogueCodeSchema, name: z.string() }),
  start: z.string(),
  end: z.string(),
  timeZone: z.string(),
  technician: z.object({ id: IdSchema, name: z.string() }).nullable(),
  jobAt: z.enum(['owner', 'workshop']),
  address: BookingAddressSchema.nullable(),
  workshopAddress: z.string().nullable(),
  vehicle: VehicleProfileSchema,
  customer: z.object({ kind: z.enum(['consumer', 'business']), name: z.string(), email: z.string(), phone: z.string().nullable(), companyName: z.string().nullable(), vatId: z.string().nullable() }),
  notes: z.string().nullable(),
  quote: OwnerQuoteSchema,
  /** Only for partner members and network admins. */
  partnerQuote: QuoteSchema.shape.partner.nullable(),
  payment: z.object({ status: z.enum(['pending', 'authorised', 'captured', 'cancelled', 'refunded', 'partially_refunded', 'failed']), authorisedMinor: z.number().int(), capturedMinor: z.number().int(), refundedMinor: z.number().int() }),
  holdExpiresAt: z.string().nullable(),
  checkoutUrl: z.string().nullable(),
  /** What cancelling now would cost the owner under the policy. */
  cancellationNow: z.object({ allowed: z.boolean(), feeMinor: z.number().int(), refundMinor: z.number().int() }),
  /** Partner view of a confirmed job: when it may be started (jobStartWindow with the network's setting). */
  startWindow: z.object({ from: z.string(), until: z.string() }).nullable().optional(),
  history: z.array(BookingEventSchema),
  createdAt: z.string(),
});
export type Booking = z.infer<typeof BookingSchema>;

export const BookingListQuerySchema = z.object({
  status: BookingStatusSchema.optional(),
  from: InstantSchema.optional(),
  to: InstantSchema.optional(),
  technicianId: IdSchema.optional(),
  q: z.string().trim().max(80).optional().describe('Reference, customer name or e-mail'),
  limit: queryNumber(z.number().int().min(1).max(500)).default(100),
});

export const BookingDecisionSchema = z.discriminatedUnion('action', [
  z.object({ action: z.literal('accept') }),
  z.object({ action: z.literal('decline'), reason: z.string().trim().min(3, 'Say why, in a few words').max(500, 'Use at most 500 characters') }),
  z.object({ action: z.literal('start') }),
  z.object({ action: z.literal('complete') }),
  z.object({ action: z.literal('no-show') }),
  z.object({ action: z.literal('cancel'), reason: z.string().trim().min(3, 'Say why, in a few words').max(500, 'Use at most 500 characters') }),
  z.object({ action: z.literal('reschedule'), start: InstantSchema, technicianId: IdSchema.optional() }),
]);
export type BookingDecision = z.infer<typeof BookingDecisionSchema>;
