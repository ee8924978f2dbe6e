// The eligibility engine on a table of cases: the invented demo vans (../shared/DEMO.md) against
// the platform's starting rules. Trade facts behind the rules are common practice, no source.
import { describe, expect, it } from 'vitest';
import { EligibilityRuleInputSchema, evaluateEligibility, ruleApplies, vehicleClassOf, VehicleProfileSchema, type EligibilityRule, type VehicleProfile } from '../../../packages/domain/src';
import { ELIGIBILITY_RULES } from '../../../apps/api/src/db/seed/eligibility-rules';
import { SERVICE_TYPES } from '../../../apps/api/src/db/seed/catalogue-data';

const rules: EligibilityRule[] = ELIGIBILITY_RULES.map((r) => EligibilityRuleInputSchema.parse(r));
const service = (code: string) => {
  const st = SERVICE_TYPES.find((s) => s.code === code);
  if (!st) throw new Error(`no service type ${code}`);
  return st;
};

// The demo brief's invented vans.
const cargo4: VehicleProfile = { model: 'Korvan Cargo 4', fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, year: 2021 };
const cargo4Basic: VehicleProfile = { ...cargo4, model: 'Korvan Cargo 4 Basic', climateControl: 'manual' };
const camper2: VehicleProfile = { model: 'Maren Camper 2', fuel: 'diesel', factoryHeater: 'none', climateControl: 'manual', electricalSystemV: 12, year: 2019 };
const transit9: VehicleProfile = { model: 'Tessaro Transit 9', fuel: 'diesel', factoryHeater: 'coolant_parking', climateControl: 'automatic', electricalSystemV: 24, year: 2018 };

type Case = [string, VehicleProfile, string, { eligible: boolean; rules: string[]; extraMinutes: number; suggest?: string[] }];
const cases: Case[] = [
  ['Cargo 4: the straightforward conversion', cargo4, 'parking-conversion-auto', { eligible: true, rules: [], extraMinutes: 0 }],
  ['Cargo 4 Basic: manual climate control is the other conversion', cargo4Basic, 'parking-conversion-auto', { eligible: false, rules: ['manual-climate-needs-manual-conversion'], extraMinutes: 0, suggest: ['parking-conversion-manual'] }],
  ['Cargo 4 Basic: the manual conversion fits', cargo4Basic, 'parking-conversion-manual', { eligible: true, rules: [], extraMinutes: 0 }],
  ['Cargo 4: the manual conversion is not needed', cargo4, 'parking-conversion-manual', { eligible: false, rules: ['automatic-climate-simpler-conversion'], extraMinutes: 0, suggest: ['parking-conversion-auto'] }],
  ['Camper 2: no factory heater means a retrofit', camper2, 'parking-conversion-manual', { eligible: false, rules: ['no-coolant-heater-to-convert'], extraMinutes: 0, suggest: ['air-heater-installation'] }],
  ['Camper 2: the air heater retrofit fits', camper2, 'air-heater-installation', { eligible: true, rules: [], extraMinutes: 0 }],
  ['Transit 9: already a parking heater, nothing to convert (and 24 V noted)', transit9, 'parking-conversion-auto', { eligible: false, rules: ['already-a-parking-heater', 'twenty-four-volt-parts'], extraMinutes: 15 }],
  ['Transit 9: remote kit fits with 24 V parts and 15 more minutes', transit9, 'remote-kit-fitting', { eligible: true, rules: ['twenty-four-volt-parts'], extraMinutes: 15 }],
  ['Cargo 4: a remote kit alone cannot start an auxiliary-only heater; the conversion comes first', cargo4, 'remote-kit-fitting', { eligible: false, rules: ['auxiliary-heater-needs-conversion'], extraMinutes: 0, suggest: ['parking-conversion-auto', 'parking-conversion-manual'] }],
  ['Transit 9: handset pairing, no rule', transit9, 'handset-pairing', { eligible: true, rules: [], extraMinutes: 0 }],
  ['petrol camper: air heater with a separate pickup', { ...camper2, fuel: 'petrol' }, 'air-heater-installation', { eligible: true, rules: ['petrol-air-heater-fuel-pickup'], extraMinutes: 60 }],
  ['2009 van: firmware update is read first', { ...cargo4, year: 2009 }, 'control-unit-firmware-update', { eligible: true, rules: ['older-control-unit-check'], extraMinutes: 15 }],
  ['2012 van: the year rule ends before 2012', { ...cargo4, year: 2012 }, 'control-unit-firmware-update', { eligible: true, rules: [], extraMinutes: 0 }],
];

describe('evaluateEligibility on the demo vans (table of cases)', () => {
  it.each(cases)('%s', (_label, vehicle, code, expected) => {
    const st = service(code);
    const r = evaluateEligibility(st, vehicle, rules);
    expect(r.eligible).toBe(expected.eligible);
    expect(r.warnings.map((w) => w.ruleCode)).toEqual(expected.rules);
    expect(r.extraMinutes).toBe(expected.extraMinutes);
    expect(r.durationMinutes).toBe(st.defaultDurationMinutes + expected.extraMinutes);
    if (expected.suggest) expect(r.warnings[0]!.suggestServiceTypes).toEqual(expected.suggest);
    expect(r.requiredCapabilities).toEqual([...st.requiredCapabilities].sort());
    expect(r.unknown).toEqual([]);
  });
});

describe('evaluateEligibility rules as data', () => {
  const conv = service('parking-conversion-auto');

  it('an unknown field does not refuse on a guess: the rule is skipped and the field reported', () => {
    const r = evaluateEligibility(conv, { fuel: 'diesel' }, rules);
    expect(r.eligible).toBe(true);
    expect(r.unknown).toEqual(['climateControl', 'electricalSystemV', 'factoryHeater', 'year']);
  });

  it('an inactive rule does nothing; a rule without service types applies to all', () => {
    const off = rules.map((r) => ({ ...r, active: r.code !== 'manual-climate-needs-manual-conversion' }));
    expect(evaluateEligibility(conv, cargo4Basic, off).eligible).toBe(true);
    const everywhere: EligibilityRule = EligibilityRuleInputSchema.parse({ code: 'extra-check', when: { fuel: ['diesel'] }, effect: { severity: 'notice', message: 'Diesel vans get an extra check here.', addCapabilities: ['exhaust-gas-analyser'], extraMinutes: 10 } });
    const r = evaluateEligibility(service('handset-pairing'), cargo4, [everywhere]);
    expect(r).toMatchObject({ eligible: true, extraMinutes: 10, requiredCapabilities: ['digital-multimeter', 'exhaust-gas-analyser'] });
  });

  it('all conditions must hold, any listed value within one', () => {
    const when = { factoryHeater: ['none' as const, 'air' as const], electricalSystemV: [24 as const] };
    expect(ruleApplies(when, { factoryHeater: 'air', electricalSystemV: 24 })).toBe(true);
    expect(ruleApplies(when, { factoryHeater: 'air', electricalSystemV: 12 })).toBe(false);
    expect(ruleApplies(when, { factoryHeater: 'coolant_parking', electricalSystemV: 24 })).toBe(false);
  });

  it('refuses malformed rules: no condition, odd minutes, empty value lists', () => {
    const base = { code: 'x-rule', effect: { severity: 'notice', message: 'Long enough message.' } };
    expect(EligibilityRuleInputSchema.safeParse({ ...base, when: {} }).success).toBe(false);
    expect(EligibilityRuleInputSchema.safeParse({ ...base, when: { fuel: [] } }).success).toBe(false);
    expect(EligibilityRuleInputSchema.safeParse({ ...base, when: { fuel: ['diesel'] }, effect: { ...base.effect, extraMinutes: 7 } }).success).toBe(false);
  });

  it('reads a vehicle from query strings and classes it without the model', () => {
    const v = VehicleProfileSchema.parse({ electricalSystemV: '24', year: '2018', factoryHeater: 'coolant_parking', model: 'Tessaro Transit 9' });
    expect(v).toMatchObject({ electricalSystemV: 24, year: 2018 });
    expect(vehicleClassOf(v)).toBe('coolant_parking/24v');
    expect(VehicleProfileSchema.safeParse({ electricalSystemV: '18' }).success).toBe(false);
  });
});
