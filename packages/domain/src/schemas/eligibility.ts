// Vehicle eligibility: the vehicle profile a search or booking describes, and the rules (data
// kept with the catalogue, edited by network admins) that say what a service needs for it.
import { z } from 'zod';
import { HEATER_FUELS } from '../heater/fuels';
import { CatalogueCodeSchema } from './catalogue';
import { ClimateControlSchema, FactoryHeaterSchema, FACTORY_HEATERS, CLIMATE_CONTROLS, VEHICLE_LIMITS } from './vehicles';
import { DURATION_STEP_MINUTES } from './hours';
import { queryNumber } from './query';

/** What the search needs to know about a vehicle; every field may be left out (unknown). */
export const VehicleProfileSchema = z.object({
  model: z.string().trim().max(120, 'Use at most 120 characters').optional(),
  fuel: z.enum(HEATER_FUELS, { error: 'Fuel must be diesel or petrol' }).optional(),
  factoryHeater: FactoryHeaterSchema.optional(),
  climateControl: ClimateControlSchema.optional(),
  electricalSystemV: queryNumber(z.literal([12, 24], { error: 'The electrical system must be 12 V or 24 V' }), 'The electrical system must be 12 V or 24 V').optional(),
  year: queryNumber(
    z
      .number({ error: 'Enter the year of manufacture' })
      .int('Enter a whole year')
      .min(VEHICLE_LIMITS.year.min, `The year must be between ${VEHICLE_LIMITS.year.min} and ${VEHICLE_LIMITS.year.max}`)
      .max(VEHICLE_LIMITS.year.max, `The year must be between ${VEHICLE_LIMITS.year.min} and ${VEHICLE_LIMITS.year.max}`),
    'Enter the year of manufacture',
  ).optional(),
});
export type VehicleProfile = z.output<typeof VehicleProfileSchema>;

/** A rough class of vehicle for anonymous statistics: heater situation and voltage, never the model. */
export function vehicleClassOf(v: VehicleProfile): string {
  return `${v.factoryHeater ?? 'unknown-heater'}/${v.electricalSystemV ? `${v.electricalSystemV}v` : 'unknown-voltage'}`;
}

const nonEmpty = <T extends z.ZodTypeAny>(item: T) => z.array(item).min(1, 'Choose at least one value or leave the condition out');

/** Conditions a rule applies under: every condition given must hold; within one, any listed value matches. */
export const RuleConditionSchema = z
  .object({
    factoryHeater: nonEmpty(z.enum(FACTORY_HEATERS)).optional(),
    climateControl: nonEmpty(z.enum(CLIMATE_CONTROLS)).optional(),
    electricalSystemV: nonEmpty(z.literal([12, 24])).optional(),
    fuel: nonEmpty(z.enum(HEATER_FUELS)).optional(),
    /** Vehicles built before this year. */
    yearBefore: z.number().int().min(VEHICLE_LIMITS.year.min).max(2100).optional(),
  })
  .refine((c) => Object.values(c).some((v) => v !== undefined), 'Give at least one condition');
export type RuleCondition = z.infer<typeof RuleConditionSchema>;

export const ExtraPartSchema = z.object({
  description: z.string().trim().min(2, 'Describe the part').max(120, 'Use at most 120 characters'),
  quantity: z.number().int().min(1, 'Use 1 to 20').max(20, 'Use 1 to 20'),
});

export const RULE_SEVERITIES = ['block', 'notice'] as const;

export const RuleEffectSchema = z.object({
  /** "block": the service does not fit this vehicle (suggest another); "notice": it fits, with the changes below. */
  severity: z.enum(RULE_SEVERITIES, { error: 'Choose block or notice' }),
  /** The owner-facing explanation in plain words. */
  message: z.string().trim().min(10, 'Write at least 10 characters').max(400, 'Use at most 400 characters'),
  suggestServiceTypes: z.array(CatalogueCodeSchema).max(5).default([]),
  addCapabilities: z.array(CatalogueCodeSchema).max(10).default([]),
  extraMinutes: z
    .number()
    .int()
    .min(0, 'Use 0 to 480 minutes')
    .max(480, 'Use 0 to 480 minutes')
    .refine((v) => v % DURATION_STEP_MINUTES === 0, `Use a multiple of ${DURATION_STEP_MINUTES} minutes`)
    .default(0),
  extraParts: z.array(ExtraPartSchema).max(10).default([]),
});

export const EligibilityRuleInputSchema = z.object({
  code: CatalogueCodeSchema,
  /** Service types the rule is about; empty means every service type. */
  serviceTypes: z.array(CatalogueCodeSchema).max(20).default([]),
  when: RuleConditionSchema,
  effect: RuleEffectSchema,
  active: z.boolean().default(true),
});
export type EligibilityRuleInput = z.input<typeof EligibilityRuleInputSchema>;
export type EligibilityRule = z.output<typeof EligibilityRuleInputSchema>;

export const EligibilityRuleSchema = EligibilityRuleInputSchema.extend({ updatedAt: z.string() });
export const EligibilityRuleListSchema = z.object({ data: z.array(EligibilityRuleSchema) });

export const EligibilityWarningSchema = z.object({
  ruleCode: CatalogueCodeSchema,
  severity: z.enum(RULE_SEVERITIES),
  message: z.string(),
  suggestServiceTypes: z.array(CatalogueCodeSchema),
});
export type EligibilityWarning = z.infer<typeof EligibilityWarningSchema>;

export const EligibilityResultSchema = z.object({
  serviceTypeCode: CatalogueCodeSchema,
  eligible: z.boolean(),
  /** The service type's capabilities plus those rules add, sorted. */
  requiredCapabilities: z.array(CatalogueCodeSchema),
  extraMinutes: z.number().int(),
  durationMinutes: z.number().int(),
  extraParts: z.array(ExtraPartSchema),
  warnings: z.array(EligibilityWarningSchema),
  /** Fields of the profile that were unknown; rules about them were not applied. */
  unknown: z.array(z.string()),
});
export type EligibilityResult = z.infer<typeof EligibilityResultSchema>;
