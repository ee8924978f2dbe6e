// The platform catalogues: capabilities partners hold and service types owners book.
import { z } from 'zod';

/** Stable codes are lower-case words joined by hyphens, e.g. "uds-flash-programming". */
export const CatalogueCodeSchema = z
  .string()
  .min(2)
  .max(64)
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens');

export const CAPABILITY_CATEGORIES = ['diagnostics', 'electrical', 'measurement', 'mechanical', 'skill'] as const;
export const CapabilityCategorySchema = z.enum(CAPABILITY_CATEGORIES);
export type CapabilityCategory = z.infer<typeof CapabilityCategorySchema>;

/**
 * Safety cautions a service type can carry. The wording lives in the apps' message
 * files; the API sends only the codes.
 */
export const CAUTION_CODES = ['exhaust-gas', 'fuel-system', 'vehicle-electrics', 'stable-power-flashing', 'hot-coolant'] as const;
export const CautionCodeSchema = z.enum(CAUTION_CODES);
export type CautionCode = z.infer<typeof CautionCodeSchema>;

export const CapabilitySchema = z.object({
  code: CatalogueCodeSchema,
  name: z.string().min(2).max(120),
  description: z.string().max(2000),
  category: CapabilityCategorySchema,
  standards: z.array(z.string()).describe('Open standards the equipment follows, e.g. "ISO 14229"'),
  retired: z.boolean(),
});
export type Capability = z.infer<typeof CapabilitySchema>;

export const ServiceTypeSchema = z.object({
  code: CatalogueCodeSchema,
  name: z.string().min(2).max(120),
  summary: z.string().max(300),
  description: z.string().max(4000),
  defaultDurationMinutes: z.number().int().min(15).max(24 * 60),
  requiredCapabilities: z.array(CatalogueCodeSchema),
  cautions: z.array(CautionCodeSchema),
  retired: z.boolean(),
});
export type ServiceType = z.infer<typeof ServiceTypeSchema>;

export const CapabilityListSchema = z.object({ data: z.array(CapabilitySchema) });
export const ServiceTypeListSchema = z.object({ data: z.array(ServiceTypeSchema) });
