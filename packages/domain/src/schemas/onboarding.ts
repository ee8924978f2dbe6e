// Partner onboarding: the application a partner fills in step by step, its documents, the
// review a network admin does, and the decisions that move an organisation through its statuses.
import { checkVAT, countries as vatCountries } from 'jsvat';
import { z } from 'zod';
import { CatalogueCodeSchema, CapabilityCategorySchema } from './catalogue';
import { AuditEntrySchema, IdSchema, OrganisationStatusSchema, type OrganisationStatus } from './accounts';
import { LocalDateSchema } from './hours';
import { INSURANCE_MAX_YEARS_AHEAD, latestInsuranceExpiry } from '../vetting/insurance';

/** Countries the network works in (ISO 3166-1 alpha-2). */
export const NETWORK_COUNTRIES = ['AT', 'DE', 'CH', 'IT', 'SI', 'SE', 'NO', 'DK', 'FI'] as const;
export const CountrySchema = z.enum(NETWORK_COUNTRIES, { error: 'Choose a country the network works in' });
export type Country = z.infer<typeof CountrySchema>;

/** True when a VAT ID has the format (and check digits) its country uses, per jsvat. */
export function isValidVatId(vatId: string): boolean {
  return checkVAT(vatId.replace(/[\s.-]/g, '').toUpperCase(), vatCountries).isValid;
}

/** The ISO 3166 country that issued a valid VAT ID (CHE… is CH, EL… is GR), or null when it is not valid. */
export function vatIdCountry(vatId: string): string | null {
  const result = checkVAT(vatId.replace(/[\s.-]/g, '').toUpperCase(), vatCountries);
  return result.isValid ? (result.country?.isoCode.short ?? null) : null;
}

const text = (label: string, max: number) =>
  z.string({ error: `Enter the ${label}` }).trim().min(1, `Enter the ${label}`).max(max, `Use at most ${max} characters`);

export const BusinessStepSchema = z.object({
  legalName: text('legal name', 160),
  tradingName: text('trading name', 120),
  country: CountrySchema,
  street: text('street and number', 160),
  postalCode: text('postal code', 16),
  city: text('town or city', 100),
  vatId: z
    .string()
    .trim()
    .max(20, 'Use at most 20 characters')
    .refine((v) => v === '' || isValidVatId(v), 'This VAT ID does not have a valid format for its country')
    .transform((v) => (v === '' ? null : v.replace(/[\s.-]/g, '').toUpperCase()))
    .nullable()
    .optional(),
  phone: z
    .string({ error: 'Enter a phone number' })
    .trim()
    .regex(/^\+?[0-9 ()/-]{6,24}$/, 'Enter a phone number with country code, e.g. +43 512 123456'),
});
export type BusinessStep = z.input<typeof BusinessStepSchema>;

export const WORK_MODES = ['mobile', 'workshop', 'both'] as const;
export const WorkModeSchema = z.enum(WORK_MODES, { error: 'Choose mobile, workshop or both' });
export type WorkMode = z.infer<typeof WorkModeSchema>;

export const RADIUS_LIMITS = { min: 5, max: 300 } as const;

export const AreaStepSchema = z
  .object({
    baseLabel: text('base location', 120),
    baseLat: z.number({ error: 'Pick the base on the map' }).min(-90, 'Latitude must be between −90 and 90').max(90, 'Latitude must be between −90 and 90'),
    baseLng: z.number({ error: 'Pick the base on the map' }).min(-180, 'Longitude must be between −180 and 180').max(180, 'Longitude must be between −180 and 180'),
    mode: WorkModeSchema,
    radiusKm: z
      .number({ error: 'Enter the service radius in km' })
      .int('Use whole kilometres')
      .min(RADIUS_LIMITS.min, `The radius must be between ${RADIUS_LIMITS.min} and ${RADIUS_LIMITS.max} km`)
      .max(RADIUS_LIMITS.max, `The radius must be between ${RADIUS_LIMITS.min} and ${RADIUS_LIMITS.max} km`)
      .nullable(),
    workshopAddress: z.string().trim().max(240, 'Use at most 240 characters').nullable(),
  })
  .superRefine((v, ctx) => {
    if (v.mode !== 'workshop' && v.radiusKm === null) ctx.addIssue({ code: 'custom', path: ['radiusKm'], message: 'Mobile work needs a service radius' });
    if (v.mode !== 'mobile' && !v.workshopAddress) ctx.addIssue({ code: 'custom', path: ['workshopAddress'], message: 'Enter the workshop address' });
  });
export type AreaStep = z.input<typeof AreaStepSchema>;

export const ClaimedCapabilitySchema = z.object({
  code: CatalogueCodeSchema,
  notes: z.string().trim().max(500, 'Use at most 500 characters').nullable().optional(),
  serial: z.string().trim().max(80, 'Use at most 80 characters').nullable().optional(),
});
export const CapabilitiesStepSchema = z.object({
  capabilities: z.array(ClaimedCapabilitySchema).min(1, 'Pick at least one piece of equipment or skill').max(60),
});
export type CapabilitiesStep = z.input<typeof CapabilitiesStepSchema>;

export const DOCUMENT_KINDS = ['insurance', 'registration', 'qualification', 'evidence'] as const;
export const DocumentKindSchema = z.enum(DOCUMENT_KINDS, { error: 'Choose what kind of document this is' });
export type DocumentKind = z.infer<typeof DocumentKindSchema>;
export const REQUIRED_DOCUMENTS: readonly DocumentKind[] = ['insurance', 'registration'];

export const UPLOAD_LIMIT_BYTES = 10 * 1024 * 1024;
export const UPLOAD_TYPES = ['application/pdf', 'image/jpeg', 'image/png', 'image/webp'] as const;

/** The form fields sent with an uploaded file (multipart). `today` is the caller's date (YYYY-MM-DD). */
export function documentFieldsSchema(today: string) {
  return z
    .object({
      kind: DocumentKindSchema,
      // a date that passes the pattern but not the calendar (2031-02-31) is refused here, not by the database
      expiresOn: LocalDateSchema.optional(),
      capabilityCode: CatalogueCodeSchema.optional(),
    })
    .superRefine((v, ctx) => {
      if (v.kind === 'insurance' && !v.expiresOn) ctx.addIssue({ code: 'custom', path: ['expiresOn'], message: 'Enter the date the insurance expires' });
      if (v.expiresOn && v.expiresOn <= today) ctx.addIssue({ code: 'custom', path: ['expiresOn'], message: 'The expiry date must be in the future' });
      const latest = latestInsuranceExpiry(today);
      // compared as text, so only a date the pattern accepted (a malformed one has its own error)
      if (v.expiresOn && /^\d{4}-\d{2}-\d{2}$/.test(v.expiresOn) && v.expiresOn > latest) {
        ctx.addIssue({ code: 'custom', path: ['expiresOn'], message: `The expiry date can be at most ${INSURANCE_MAX_YEARS_AHEAD} years ahead (until ${latest}): check the date on the certificate` });
      }
      if (v.kind === 'evidence' && !v.capabilityCode) ctx.addIssue({ code: 'custom', path: ['capabilityCode'], message: 'Say which equipment the photo shows' });
    });
}

export const DocumentSchema = z.object({
  id: IdSchema,
  kind: DocumentKindSchema,
  fileName: z.string(),
  contentType: z.enum(UPLOAD_TYPES),
  sizeBytes: z.number().int(),
  expiresOn: z.string().nullable(),
  capabilityCode: z.string().nullable(),
  uploadedAt: z.string(),
});
export type PartnerDocument = z.infer<typeof DocumentSchema>;

export const ChangeRequestSchema = z.object({
  message: z.string(),
  /** Notes the partner sees next to the fields concerned, keyed by field path (e.g. "business.vatId"). */
  fields: z.record(z.string(), z.string()),
  requestedAt: z.string(),
});

export const ApplicationSchema = z.object({
  organisationId: IdSchema,
  status: OrganisationStatusSchema,
  statusReason: z.string().nullable(),
  business: BusinessStepSchema.extend({ vatId: z.string().nullable() }).partial().nullable(),
  area: z.object({
    baseLabel: z.string(),
    baseLat: z.number(),
    baseLng: z.number(),
    mode: WorkModeSchema,
    radiusKm: z.number().nullable(),
    workshopAddress: z.string().nullable(),
  }).nullable(),
  capabilities: z.array(ClaimedCapabilitySchema.extend({ name: z.string(), category: CapabilityCategorySchema })),
  documents: z.array(DocumentSchema),
  changeRequest: ChangeRequestSchema.nullable(),
  /** What is still missing before the application can be submitted, as field errors. */
  missing: z.array(z.object({ path: z.string(), message: z.string() })),
  submittedAt: z.string().nullable(),
  editable: z.boolean(),
});
export type Application = z.infer<typeof ApplicationSchema>;

export const ReviewChecklistSchema = z.object({
  insuranceValid: z.boolean(),
  insuranceCoversMobileWork: z.boolean(),
  registrationMatches: z.boolean(),
  equipmentEvidence: z.boolean(),
  identityChecked: z.boolean(),
});
export type ReviewChecklist = z.infer<typeof ReviewChecklistSchema>;

/** What a network admin sees when reviewing one application: it, the review so far and its history. */
export const ApplicationReviewSchema = z.object({
  application: ApplicationSchema,
  checklist: ReviewChecklistSchema.nullable(),
  internalNotes: z.string(),
  /** The organisation's audit log, newest first. */
  history: z.array(AuditEntrySchema),
});
export type ApplicationReview = z.infer<typeof ApplicationReviewSchema>;

export const ReviewUpdateSchema = z.object({ checklist: ReviewChecklistSchema, internalNotes: z.string().max(4000, 'Use at most 4000 characters') });

export const DECISIONS = ['approve', 'request_changes', 'reject', 'suspend', 'reinstate'] as const;
export const DecisionSchema = z
  .object({
    decision: z.enum(DECISIONS),
    message: z.string().trim().max(2000, 'Use at most 2000 characters').default(''),
    fields: z.record(z.string(), z.string().trim().max(500)).default({}),
  })
  .superRefine((v, ctx) => {
    if (v.decision !== 'approve' && v.decision !== 'reinstate' && !v.message) {
      ctx.addIssue({ code: 'custom', path: ['message'], message: 'Tell the partner why' });
    }
  });
export type Decision = z.input<typeof DecisionSchema>;

/** Which status each decision leads to, and from which statuses it may be taken. */
export const DECISION_TRANSITIONS: Record<(typeof DECISIONS)[number], { from: readonly OrganisationStatus[]; to: OrganisationStatus }> = {
  approve: { from: ['submitted', 'in_review'], to: 'approved' },
  request_changes: { from: ['submitted', 'in_review'], to: 'changes_requested' },
  reject: { from: ['submitted', 'in_review'], to: 'rejected' },
  suspend: { from: ['approved'], to: 'suspended' },
  reinstate: { from: ['suspended'], to: 'approved' },
};

/** Statuses in which the partner may edit and (re)submit the application. */
export const EDITABLE_STATUSES: readonly OrganisationStatus[] = ['draft', 'changes_requested'];

export const ApplicationSummarySchema = z.object({
  organisationId: IdSchema,
  tradingName: z.string(),
  country: z.string().nullable(),
  city: z.string().nullable(),
  status: OrganisationStatusSchema,
  submittedAt: z.string().nullable(),
  waitingDays: z.number().int().nullable(),
  insuranceExpiresOn: z.string().nullable(),
});
export type ApplicationSummary = z.infer<typeof ApplicationSummarySchema>;

/** What the public Directory API shows of an approved partner. */
export const PublicPartnerSchema = z.object({
  id: IdSchema,
  tradingName: z.string(),
  city: z.string(),
  country: z.string(),
  baseLat: z.number(),
  baseLng: z.number(),
  mode: WorkModeSchema,
  radiusKm: z.number().nullable(),
  capabilities: z.array(z.string()),
});
export type PublicPartner = z.infer<typeof PublicPartnerSchema>;

export const CapabilityInputSchema = z.object({
  code: CatalogueCodeSchema,
  name: z.string().trim().min(2, 'Enter a name').max(120, 'Use at most 120 characters'),
  description: z.string().trim().max(2000, 'Use at most 2000 characters'),
  category: CapabilityCategorySchema,
  standards: z.array(z.string().trim().min(1).max(80)).max(10),
});
export const CapabilityPatchSchema = CapabilityInputSchema.omit({ code: true }).partial().extend({ retired: z.boolean().optional() });
