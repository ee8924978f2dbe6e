// Whether a service type fits a vehicle, from rules kept as data: which capabilities it then
// needs, what it adds in time and parts, and the warnings to show in plain words.
import type { EligibilityResult, EligibilityRule, EligibilityWarning, RuleCondition, VehicleProfile } from '../schemas/eligibility';

/** The parts of a catalogue service type the engine needs. */
export interface EligibilityServiceType {
  code: string;
  defaultDurationMinutes: number;
  requiredCapabilities: readonly string[];
}

type ConditionKey = keyof RuleCondition;
const PROFILE_FIELD: Record<ConditionKey, keyof VehicleProfile> = {
  factoryHeater: 'factoryHeater',
  climateControl: 'climateControl',
  electricalSystemV: 'electricalSystemV',
  fuel: 'fuel',
  yearBefore: 'year',
};

/**
 * True when every condition of the rule holds for the vehicle. A condition on a field the owner
 * left unknown does not hold (the rule is not applied) and the field is reported as unknown, so
 * the owner can be asked instead of being refused on a guess.
 */
export function ruleApplies(when: RuleCondition, vehicle: VehicleProfile, unknown?: Set<string>): boolean {
  let applies = true;
  for (const key of Object.keys(when) as ConditionKey[]) {
    const wanted = when[key];
    if (wanted === undefined) continue;
    const field = PROFILE_FIELD[key];
    const value = vehicle[field];
    if (value === undefined) {
      unknown?.add(field);
      applies = false;
      continue;
    }
    const holds = key === 'yearBefore' ? (value as number) < (wanted as number) : (wanted as readonly unknown[]).includes(value);
    if (!holds) applies = false;
  }
  return applies;
}

/**
 * Evaluates the active rules for one service type and vehicle. Blocking rules make the service
 * ineligible; every applying rule adds its capabilities, minutes and parts (a blocked result
 * still lists them, for the explanation). Rules are applied in the order given; warnings keep it.
 */
export function evaluateEligibility(serviceType: EligibilityServiceType, vehicle: VehicleProfile, rules: readonly EligibilityRule[]): EligibilityResult {
  const capabilities = new Set(serviceType.requiredCapabilities);
  const unknown = new Set<string>();
  const warnings: EligibilityWarning[] = [];
  const extraParts: EligibilityResult['extraParts'] = [];
  let extraMinutes = 0;
  let eligible = true;
  for (const rule of rules) {
    if (!rule.active) continue;
    if (rule.serviceTypes.length && !rule.serviceTypes.includes(serviceType.code)) continue;
    if (!ruleApplies(rule.when, vehicle, unknown)) continue;
    const e = rule.effect;
    if (e.severity === 'block') eligible = false;
    e.addCapabilities.forEach((c) => capabilities.add(c));
    extraMinutes += e.extraMinutes;
    extraParts.push(...e.extraParts);
    warnings.push({ ruleCode: rule.code, severity: e.severity, message: e.message, suggestServiceTypes: [...e.suggestServiceTypes] });
  }
  return {
    serviceTypeCode: serviceType.code,
    eligible,
    requiredCapabilities: [...capabilities].sort(),
    extraMinutes,
    durationMinutes: serviceType.defaultDurationMinutes + extraMinutes,
    extraParts,
    warnings,
    unknown: [...unknown].sort(),
  };
}
