// What a partner organisation sells: offers (a service type at a price and duration, with the
// technicians who do it and the parts kit it uses), its parts, travel policy and working hours,
// and the bookable slots the public sees. Money is integer minor units plus an ISO 4217 code.
import { z } from 'zod';
import { IdSchema } from './accounts';
import { CatalogueCodeSchema } from './catalogue';
import { InstantSchema, JobDurationMinutesSchema, WorkingHoursSchema } from './hours';
import { AreaStepSchema } from './onboarding';
import { queryNumber } from './query';

export const CURRENCIES = ['EUR', 'SEK', 'NOK', 'DKK', 'CHF'] as const;
export const CurrencySchema = z.enum(CURRENCIES, { error: `Choose one of ${CURRENCIES.join(', ')}` });
export type Currency = z.infer<typeof CurrencySchema>;

/** Largest amount an offer, part or fee may carry: 100 000.00 in minor units. */
export const MAX_MINOR = 10_000_000;

export const MinorAmountSchema = z
  .number({ error: 'Enter an amount in minor units (cents, öre)' })
  .int('Enter a whole number of minor units (cents, öre)')
  .min(0, 'The amount cannot be negative')
  .max(MAX_MINOR, `The amount must be at most ${MAX_MINOR} minor units`);

export const DepositSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('none') }),
    z.object({ kind: z.literal('fixed'), amountMinor: MinorAmountSchema }),
    z.object({
      kind: z.literal('percent'),
      percent: z.number({ error: 'Enter a percentage' }).int('Enter a whole percentage').min(1, 'The deposit is 1 to 100 %').max(100, 'The deposit is 1 to 100 %'),
    }),
  ],
  { error: 'Choose no deposit, a fixed amount or a percentage' },
);
export type Deposit = z.infer<typeof DepositSchema>;

export const CancellationSchema = z.object({
  freeUntilHours: z.number({ error: 'Enter hours before the start' }).int('Enter whole hours').min(0, 'Use 0 to 336 hours').max(336, 'Use 0 to 336 hours (two weeks)'),
  feeMinor: MinorAmountSchema,
});
export type Cancellation = z.infer<typeof CancellationSchema>;

export const PartsKitLineSchema = z.object({
  partId: IdSchema,
  quantity: z.number({ error: 'Enter a quantity' }).int('Enter a whole quantity').min(1, 'Use 1 to 99').max(99, 'Use 1 to 99'),
});

const offerFields = {
  serviceTypeCode: CatalogueCodeSchema,
  priceMinor: MinorAmountSchema,
  currency: CurrencySchema,
  durationMinutes: JobDurationMinutesSchema,
  technicianUserIds: z.array(IdSchema).max(50, 'Assign at most 50 technicians'),
  partsKit: z.array(PartsKitLineSchema).max(50, 'Use at most 50 lines in a parts kit'),
  deposit: DepositSchema,
  cancellation: CancellationSchema,
  /** Says a price of 0 is meant: nothing is saved at 0 without it. */
  free: z.boolean({ error: 'Say true or false' }).optional(),
};

export const FREE_PRICE_NEEDS_TICK = 'Enter a price above 0, or tick that the service is free';
export const FREE_NEEDS_ZERO_PRICE = 'A free service has a price of 0';

/** A 0 price is a typing slip unless the partner says the service is free (and free means 0). */
function freeMeansZero(v: { priceMinor?: number; free?: boolean }, ctx: z.RefinementCtx): void {
  if (v.priceMinor === 0 && v.free !== true) ctx.addIssue({ code: 'custom', path: ['priceMinor'], message: FREE_PRICE_NEEDS_TICK });
  if (v.free === true && v.priceMinor !== 0) ctx.addIssue({ code: 'custom', path: ['free'], message: FREE_NEEDS_ZERO_PRICE });
}

function uniqueLists(v: { technicianUserIds?: string[]; partsKit?: { partId: string }[] }, ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  v.technicianUserIds?.forEach((id, i) => {
    if (seen.has(id)) ctx.addIssue({ code: 'custom', path: ['technicianUserIds', i], message: 'This technician is listed twice' });
    seen.add(id);
  });
  const parts = new Set<string>();
  v.partsKit?.forEach((line, i) => {
    if (parts.has(line.partId)) ctx.addIssue({ code: 'custom', path: ['partsKit', i, 'partId'], message: 'This part is listed twice: raise its quantity instead' });
    parts.add(line.partId);
  });
}

export const OfferInputSchema = z
  .object({ ...offerFields, technicianUserIds: offerFields.technicianUserIds.default([]), partsKit: offerFields.partsKit.default([]) })
  .superRefine(uniqueLists)
  .superRefine(freeMeansZero);
export type OfferInput = z.output<typeof OfferInputSchema>;

/** A change to an offer; the service type of an offer is fixed. */
export const OfferPatchSchema = z
  .object({
    priceMinor: offerFields.priceMinor.optional(),
    currency: offerFields.currency.optional(),
    durationMinutes: offerFields.durationMinutes.optional(),
    technicianUserIds: offerFields.technicianUserIds.optional(),
    partsKit: offerFields.partsKit.optional(),
    deposit: offerFields.deposit.optional(),
    cancellation: offerFields.cancellation.optional(),
    free: offerFields.free,
  })
  .superRefine(uniqueLists)
  .superRefine((v, ctx) => {
    // a change that leaves the price alone need not repeat whether the service is free
    if (v.priceMinor !== undefined || v.free !== undefined) freeMeansZero(v, ctx);
  });
export type OfferPatch = z.output<typeof OfferPatchSchema>;

export const OfferSchema = z.object({
  id: IdSchema,
  organisationId: IdSchema,
  serviceTypeCode: CatalogueCodeSchema,
  serviceTypeName: z.string(),
  priceMinor: z.number().int(),
  currency: CurrencySchema,
  durationMinutes: z.number().int(),
  technicianUserIds: z.array(IdSchema),
  partsKit: z.array(PartsKitLineSchema.extend({ name: z.string(), unitPriceMinor: z.number().int(), currency: CurrencySchema })),
  /** Sum of the kit's lines, in the offer's currency. */
  partsTotalMinor: z.number().int(),
  deposit: DepositSchema,
  cancellation: CancellationSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Offer = z.infer<typeof OfferSchema>;

export const PartInputSchema = z.object({
  name: z.string({ error: 'Enter a name' }).trim().min(2, 'Enter a name of at least 2 characters').max(120, 'Use at most 120 characters'),
  partType: z.string({ error: 'Enter a part type' }).trim().min(2, 'Enter a part type of at least 2 characters').max(60, 'Use at most 60 characters'),
  unitPriceMinor: MinorAmountSchema,
  currency: CurrencySchema,
  stock: z.number({ error: 'Enter the stock' }).int('Enter a whole number').min(0, 'Stock cannot be negative').max(1_000_000, 'Use at most 1 000 000'),
});
export type PartInput = z.output<typeof PartInputSchema>;
export const PartPatchSchema = PartInputSchema.partial();
export type PartPatch = z.output<typeof PartPatchSchema>;

export const PartSchema = PartInputSchema.extend({ id: IdSchema, organisationId: IdSchema, createdAt: z.string(), updatedAt: z.string() });
export type Part = z.infer<typeof PartSchema>;

/** A part with this many or fewer in stock is running low (the parts list tags it, the dashboard lists it). */
export const LOW_STOCK_THRESHOLD = 3;

export const TravelPolicyInputSchema = z
  .object({
    freeWithinKm: z.number({ error: 'Enter the free distance in km' }).int('Enter whole kilometres').min(0, 'Use 0 to 500 km').max(500, 'Use 0 to 500 km'),
    ratePerKmMinor: MinorAmountSchema,
    currency: CurrencySchema,
    maxDistanceKm: z.number({ error: 'Enter the longest distance in km' }).int('Enter whole kilometres').min(1, 'Use 1 to 500 km').max(500, 'Use 1 to 500 km'),
  })
  .superRefine((v, ctx) => {
    if (v.maxDistanceKm < v.freeWithinKm) ctx.addIssue({ code: 'custom', path: ['maxDistanceKm'], message: `The longest distance must not be shorter than the free distance (${v.freeWithinKm} km)` });
  });
export type TravelPolicyInput = z.output<typeof TravelPolicyInputSchema>;

export const TravelPolicySchema = z.object({
  organisationId: IdSchema,
  /** False while the organisation has not saved one; the fields are then null. */
  configured: z.boolean(),
  freeWithinKm: z.number().int().nullable(),
  ratePerKmMinor: z.number().int().nullable(),
  currency: CurrencySchema.nullable(),
  maxDistanceKm: z.number().int().nullable(),
});
export type TravelPolicy = z.infer<typeof TravelPolicySchema>;

/** How the organisation takes bookings: paid bookings are confirmed at once, or wait for the partner to accept. */
export const BookingSettingsInputSchema = z.object({
  autoConfirmBookings: z.boolean({ error: 'Say true (confirm paid bookings at once) or false (accept each yourself)' }),
});
export type BookingSettingsInput = z.output<typeof BookingSettingsInputSchema>;
export const BookingSettingsSchema = BookingSettingsInputSchema.extend({ organisationId: IdSchema });
export type BookingSettings = z.infer<typeof BookingSettingsSchema>;

/** Where an approved organisation works: the same fields and rules as the application's area step. */
export const ServiceAreaInputSchema = AreaStepSchema;
export type ServiceAreaInput = z.output<typeof ServiceAreaInputSchema>;
export const ServiceAreaSchema = z.object({
  organisationId: IdSchema,
  /** Null while the organisation has not set its base (only possible before its application). */
  area: z
    .object({
      baseLabel: z.string(),
      baseLat: z.number(),
      baseLng: z.number(),
      mode: z.enum(['mobile', 'workshop', 'both']),
      radiusKm: z.number().int().nullable(),
      workshopAddress: z.string().nullable(),
    })
    .nullable(),
});
export type ServiceArea = z.infer<typeof ServiceAreaSchema>;

export const TechnicianHoursSchema = z.object({
  organisationId: IdSchema,
  userId: IdSchema,
  /** Null until the hours are set. */
  hours: WorkingHoursSchema.nullable(),
});
export type TechnicianHours = z.infer<typeof TechnicianHoursSchema>;

/** Longest search the public slots endpoint answers, in days. */
export const MAX_SLOT_SEARCH_DAYS = 28;
/** Most slots one list in the answer carries. */
export const SLOT_LIST_LIMIT = 50;

export const SlotsQuerySchema = z.object({
  serviceType: CatalogueCodeSchema,
  lat: queryNumber(z.number({ error: 'Enter a latitude' }).min(-90, 'Latitude is −90 to 90').max(90, 'Latitude is −90 to 90'), 'Enter a latitude'),
  lng: queryNumber(z.number({ error: 'Enter a longitude' }).min(-180, 'Longitude is −180 to 180').max(180, 'Longitude is −180 to 180'), 'Enter a longitude'),
  from: InstantSchema.optional().describe('Earliest start; defaults to now'),
  days: queryNumber(
    z
      .number({ error: 'Enter a number of days' })
      .int('Enter whole days')
      .min(1, `Search 1 to ${MAX_SLOT_SEARCH_DAYS} days`)
      .max(MAX_SLOT_SEARCH_DAYS, `Search 1 to ${MAX_SLOT_SEARCH_DAYS} days`),
    'Enter a number of days',
  ).default(7),
});
export type SlotsQuery = z.output<typeof SlotsQuerySchema>;

const SlotSchema = z.object({ start: z.string(), end: z.string(), localStart: z.string() });
export const PartnerSlotsSchema = z.object({
  partnerId: IdSchema,
  serviceTypeCode: CatalogueCodeSchema,
  durationMinutes: z.number().int(),
  timeZone: z.string(),
  organisation: z.array(SlotSchema.extend({ technicianIds: z.array(IdSchema) })),
  technicians: z.array(z.object({ technicianId: IdSchema, timeZone: z.string(), slots: z.array(SlotSchema) })),
  /** True when a list was cut at SLOT_LIST_LIMIT. */
  truncated: z.boolean(),
});
export type PartnerSlots = z.infer<typeof PartnerSlotsSchema>;
