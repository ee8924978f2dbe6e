// The platform's starting vehicle rules, seeded once and then edited by network admins. Trade
// facts behind them are common practice, no source: a conversion needs a factory coolant heater
// to convert; an auxiliary-only heater must be converted before a remote kit can start it; manual
// climate control needs extra wiring; 24 V vehicles need 24 V parts.
import type { EligibilityRuleInput } from '@emberline/domain';

const CONVERSIONS = ['parking-conversion-auto', 'parking-conversion-manual'];

export const ELIGIBILITY_RULES: EligibilityRuleInput[] = [
  {
    code: 'no-coolant-heater-to-convert',
    serviceTypes: [...CONVERSIONS, 'control-unit-firmware-update', 'control-unit-configuration'],
    when: { factoryHeater: ['none', 'air'] },
    effect: {
      severity: 'block',
      message: 'This vehicle has no factory coolant heater, so there is nothing to convert: it needs a heater fitted (a retrofit), not a conversion.',
      suggestServiceTypes: ['air-heater-installation'],
    },
  },
  {
    code: 'already-a-parking-heater',
    serviceTypes: CONVERSIONS,
    when: { factoryHeater: ['coolant_parking'] },
    effect: {
      severity: 'block',
      message: 'The heater already works as a parking heater. A remote-control kit, handset pairing or a fault diagnosis is what you are looking for.',
      suggestServiceTypes: ['remote-kit-fitting', 'handset-pairing', 'heater-fault-diagnosis'],
    },
  },
  {
    code: 'auxiliary-heater-needs-conversion',
    serviceTypes: ['remote-kit-fitting'],
    when: { factoryHeater: ['coolant_auxiliary'] },
    effect: {
      severity: 'block',
      message: 'The factory heater runs only as an auxiliary heater while the engine runs, so a remote kit alone cannot start it: the conversion to a parking heater comes first, and it includes the remote receiver.',
      suggestServiceTypes: CONVERSIONS,
    },
  },
  {
    code: 'manual-climate-needs-manual-conversion',
    serviceTypes: ['parking-conversion-auto'],
    when: { climateControl: ['manual'] },
    effect: {
      severity: 'block',
      message: 'With manual climate control the conversion needs extra wiring and parts and takes about twice as long: choose the conversion for manual climate control.',
      suggestServiceTypes: ['parking-conversion-manual'],
    },
  },
  {
    code: 'automatic-climate-simpler-conversion',
    serviceTypes: ['parking-conversion-manual'],
    when: { climateControl: ['automatic'] },
    effect: {
      severity: 'block',
      message: 'With automatic climate control the shorter conversion is enough: choose the conversion for automatic climate control.',
      suggestServiceTypes: ['parking-conversion-auto'],
    },
  },
  {
    code: 'twenty-four-volt-parts',
    serviceTypes: [...CONVERSIONS, 'remote-kit-fitting', 'air-heater-installation'],
    when: { electricalSystemV: [24] },
    effect: {
      severity: 'notice',
      message: 'A 24 V electrical system needs a receiver and heater parts rated for 24 V; the technician brings matching parts and checks the supply, which adds a little time.',
      extraMinutes: 15,
      extraParts: [{ description: 'Parts rated for 24 V instead of 12 V', quantity: 1 }],
    },
  },
  {
    code: 'petrol-air-heater-fuel-pickup',
    serviceTypes: ['air-heater-installation'],
    when: { fuel: ['petrol'] },
    effect: {
      severity: 'notice',
      message: 'A petrol vehicle needs a heater made for petrol and a separate fuel pickup in the tank; expect a longer job.',
      extraMinutes: 60,
      extraParts: [{ description: 'Tank fuel pickup for petrol', quantity: 1 }],
    },
  },
  {
    code: 'older-control-unit-check',
    serviceTypes: ['control-unit-firmware-update', ...CONVERSIONS],
    when: { yearBefore: 2012 },
    effect: {
      severity: 'notice',
      message: 'On vehicles built before 2012 the heater control unit may not take current firmware; the technician reads it first and tells you before changing anything.',
      extraMinutes: 15,
    },
  },
];
