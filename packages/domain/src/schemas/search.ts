// The public search for partners, its answer, places, and coverage gaps (searches nobody answered).
import { z } from 'zod';
import { IdSchema } from './accounts';
import { CatalogueCodeSchema, CautionCodeSchema } from './catalogue';
import { EligibilityResultSchema, VehicleProfileSchema } from './eligibility';
import { LocalDateSchema } from './hours';
import { CurrencySchema } from './offers';
import { queryNumber } from './query';

/** Largest search radius, km: how far an owner will drive to a workshop. */
export const MAX_SEARCH_RADIUS_KM = 300;
export const DEFAULT_SEARCH_RADIUS_KM = 100;
export const SEARCH_SORTS = ['best', 'distance', 'price', 'soonest'] as const;
export const SEARCH_MODES = ['any', 'mobile', 'workshop'] as const;
/** Days ahead the search looks for each result's next free slot. */
export const SEARCH_SLOT_DAYS = 14;
export const SEARCH_LIMIT = { default: 20, max: 50 } as const;

const latitude = queryNumber(z.number({ error: 'Enter a latitude' }).min(-90, 'Latitude is −90 to 90').max(90, 'Latitude is −90 to 90'), 'Enter a latitude');
const longitude = queryNumber(z.number({ error: 'Enter a longitude' }).min(-180, 'Longitude is −180 to 180').max(180, 'Longitude is −180 to 180'), 'Enter a longitude');

export const SearchQuerySchema = VehicleProfileSchema.extend({
  serviceType: CatalogueCodeSchema,
  lat: latitude,
  lng: longitude,
  radiusKm: queryNumber(
    z
      .number({ error: 'Enter a radius in km' })
      .int('Enter whole kilometres')
      .min(1, `The radius is 1 to ${MAX_SEARCH_RADIUS_KM} km`)
      .max(MAX_SEARCH_RADIUS_KM, `The radius is 1 to ${MAX_SEARCH_RADIUS_KM} km`),
    'Enter a radius in km',
  )
    .default(DEFAULT_SEARCH_RADIUS_KM)
    .describe('How far the owner will drive to a workshop; mobile partners must cover the place itself'),
  mode: z.enum(SEARCH_MODES, { error: 'Choose any, mobile or workshop' }).default('any'),
  maxPriceMinor: queryNumber(z.number({ error: 'Enter a maximum price' }).int('Enter whole minor units').min(0, 'The maximum price cannot be negative').max(10_000_000, 'Use at most 10 000 000'), 'Enter a maximum price').optional(),
  currency: CurrencySchema.optional().describe('Currency of maxPriceMinor; results priced in another currency are left out when a maximum is set'),
  date: LocalDateSchema.optional().describe('Only partners with a free slot on this date (their local date)'),
  sort: z.enum(SEARCH_SORTS, { error: 'Sort by best, distance, price or soonest' }).default('best'),
  limit: queryNumber(z.number().int().min(1).max(SEARCH_LIMIT.max, `Ask for 1 to ${SEARCH_LIMIT.max} results`)).default(SEARCH_LIMIT.default),
});
export type SearchQuery = z.output<typeof SearchQuerySchema>;
export type SearchRequest = z.input<typeof SearchQuerySchema>;

export const SearchResultSchema = z.object({
  partnerId: IdSchema,
  name: z.string(),
  city: z.string().nullable(),
  baseLat: z.number(),
  baseLng: z.number(),
  mode: z.enum(['mobile', 'workshop', 'both']),
  radiusKm: z.number().int().nullable(),
  /** Where the job happens for this result: at the owner's place or at the workshop. */
  jobAt: z.enum(['owner', 'workshop']),
  distanceKm: z.number(),
  currency: CurrencySchema,
  labourMinor: z.number().int(),
  partsMinor: z.number().int(),
  travelFeeMinor: z.number().int(),
  /** Labour + parts + travel, net (VAT comes with the quote engine). */
  totalMinor: z.number().int(),
  durationMinutes: z.number().int(),
  rating: z.number().nullable(),
  reviewCount: z.number().int(),
  nextSlot: z.object({ start: z.string(), localStart: z.string(), timeZone: z.string() }).nullable(),
  /** 0–1, higher is better; see bestMatchScore in the domain. */
  score: z.number(),
});
export type SearchResult = z.infer<typeof SearchResultSchema>;

export const NearbyPartnerSchema = z.object({ partnerId: IdSchema, name: z.string(), city: z.string().nullable(), distanceKm: z.number(), baseLat: z.number(), baseLng: z.number() });

export const SearchResponseSchema = z.object({
  data: z.array(SearchResultSchema),
  meta: z.object({
    total: z.number().int(),
    serviceType: z.object({ code: CatalogueCodeSchema, name: z.string(), cautions: z.array(CautionCodeSchema) }),
    eligibility: EligibilityResultSchema,
    /**
     * The equipment that makes every result a match: what the service and this vehicle require,
     * which each partner listed holds. The same for all results, so it is sent once.
     */
    matchedCapabilities: z.array(z.object({ code: CatalogueCodeSchema, name: z.string() })),
    /** When nothing matched: the nearest partners offering the service whose area does not reach the place. */
    nearestOutside: z.array(NearbyPartnerSchema),
    /** True when this search was recorded as a coverage gap (anonymously). */
    gapRecorded: z.boolean(),
  }),
});
export type SearchResponse = z.infer<typeof SearchResponseSchema>;

export const PlaceQuerySchema = z.object({
  q: z.string({ error: 'Type at least two letters of a place' }).trim().min(2, 'Type at least two letters of a place').max(80, 'Use at most 80 characters'),
  limit: queryNumber(z.number().int().min(1).max(20)).default(8),
});
export const PlaceSchema = z.object({ id: z.number().int(), name: z.string(), country: z.string(), lat: z.number(), lng: z.number(), population: z.number().int() });
export type Place = z.infer<typeof PlaceSchema>;
export const PlaceListSchema = z.object({ data: z.array(PlaceSchema) });

export const CoverageAlertInputSchema = z.object({
  email: z.email({ error: 'Enter a valid e-mail address' }).max(254),
  serviceType: CatalogueCodeSchema,
  lat: latitude,
  lng: longitude,
});
export type CoverageAlertInput = z.output<typeof CoverageAlertInputSchema>;

export const CoverageGapsQuerySchema = z.object({
  days: queryNumber(z.number().int().min(1, 'Look back 1 to 365 days').max(365, 'Look back 1 to 365 days')).default(90),
  serviceType: CatalogueCodeSchema.optional(),
});
export const CoverageGapCellSchema = z.object({
  lat: z.number(),
  lng: z.number(),
  serviceTypeCode: CatalogueCodeSchema,
  searches: z.number().int(),
  alerts: z.number().int().describe('Owners waiting for an e-mail for this cell and service'),
  lastSearchedAt: z.string(),
});
export const CoverageGapsSchema = z.object({ data: z.array(CoverageGapCellSchema), meta: z.object({ days: z.number().int(), totalSearches: z.number().int() }) });
export type CoverageGaps = z.infer<typeof CoverageGapsSchema>;

/** A partner's public profile page: who, where, what at which price, equipment, hours, reviews. */
export const PartnerProfileSchema = z.object({
  partnerId: IdSchema,
  name: z.string(),
  city: z.string().nullable(),
  country: z.string().nullable(),
  baseLat: z.number(),
  baseLng: z.number(),
  mode: z.enum(['mobile', 'workshop', 'both']),
  radiusKm: z.number().int().nullable(),
  workshopAddress: z.string().nullable(),
  timeZone: z.string().nullable().describe('Time zone of the first technician with hours; the weekly hours are in it'),
  /** The union of the technicians' weekly hours per ISO weekday (1 = Monday), local "HH:MM" intervals. */
  weeklyHours: z.array(z.object({ weekday: z.number().int().min(1).max(7), intervals: z.array(z.object({ start: z.string(), end: z.string() })) })),
  services: z.array(
    z.object({
      serviceTypeCode: CatalogueCodeSchema,
      name: z.string(),
      summary: z.string(),
      cautions: z.array(CautionCodeSchema),
      currency: CurrencySchema,
      labourMinor: z.number().int(),
      partsMinor: z.number().int(),
      durationMinutes: z.number().int(),
    }),
  ),
  equipment: z.array(z.object({ code: CatalogueCodeSchema, name: z.string(), category: z.string() })),
  travelPolicy: z.object({ freeWithinKm: z.number().int(), ratePerKmMinor: z.number().int(), currency: CurrencySchema, maxDistanceKm: z.number().int() }).nullable(),
  rating: z.number().nullable(),
  reviewCount: z.number().int(),
  /** Reviews arrive with the booking issues; the list is empty until then. */
  reviews: z.array(z.object({ rating: z.number().int(), text: z.string(), authorName: z.string(), createdAt: z.string() })),
});
export type PartnerProfile = z.infer<typeof PartnerProfileSchema>;
