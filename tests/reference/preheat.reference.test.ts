// Reference checks for the pre-heat planner: each check names its source beside it.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  AIR_SPECIFIC_HEAT,
  BCI_OPEN_CIRCUIT_VOLTAGE_12V,
  COOLANT_DENSITY_20C,
  ENGINE_MATERIAL_SPECIFIC_HEAT,
  ETHYLENE_GLYCOL_50_SPECIFIC_HEAT,
  FUEL_PROPERTIES,
  PANEL_VAN_PRESET,
  WATER_SPECIFIC_HEAT,
  airDensityKgPerM3,
  buildThermalModel,
  coolantSpecificHeat,
  fuelPerHour,
  integrateTwoNodeRk4,
  openCircuitVoltage,
  planPreheat,
  solveTwoNodeClosedForm,
  type TwoNodeModel,
} from '../../packages/domain/src/heater';
import { PreheatInputSchema, type PreheatInputDraft } from '../../packages/domain/src/schemas/preheat';

const DEPARTURE = '2026-01-15T07:30:00+01:00';

function vanInput(overrides: Partial<PreheatInputDraft> = {}): PreheatInputDraft {
  return { ...PANEL_VAN_PRESET.values, outsideTemperatureC: -15, departure: DEPARTURE, ...overrides };
}

describe('specific heats and densities used by the code (handbook tables named per check)', () => {
  it('water cp is 4.182 kJ/(kg·K) — Incropera, Table A.6', () => {
    expect(WATER_SPECIFIC_HEAT.value).toBe(4.182);
    expect(coolantSpecificHeat('water', 20)).toBe(4.182);
  });

  it('50 % ethylene glycol/water cp 3.18 (−15 °C), 3.24 (0 °C), 3.32 (20 °C), 3.56 (80 °C) — Conde (2011)', () => {
    const expected: Array<[number, number]> = [[-15, 3.18], [0, 3.24], [20, 3.32], [80, 3.56]];
    expect(ETHYLENE_GLYCOL_50_SPECIFIC_HEAT.map((p) => [p.temperatureC, p.value])).toEqual(expected);
    for (const [t, cp] of expected) expect(coolantSpecificHeat('ethylene-glycol-50', t)).toBe(cp);
    // Between table points: straight line, here halfway between 20 °C and 80 °C.
    expect(coolantSpecificHeat('ethylene-glycol-50', 50)).toBeCloseTo((3.32 + 3.56) / 2, 12);
  });

  it('cast iron 0.46 and carbon steel 0.49 kJ/(kg·K) — engineering handbooks; aluminium 0.903 — Incropera, Table A.1', () => {
    expect(ENGINE_MATERIAL_SPECIFIC_HEAT['cast-iron'].value).toBe(0.46);
    expect(ENGINE_MATERIAL_SPECIFIC_HEAT.steel.value).toBe(0.49);
    expect(ENGINE_MATERIAL_SPECIFIC_HEAT.aluminium.value).toBe(0.903);
  });

  it('the planner builds C1 from those values: 100 kg more engine adds 100·cp (same sources as above)', () => {
    for (const [material, cp] of [['cast-iron', 0.46], ['steel', 0.49], ['aluminium', 0.903]] as const) {
      const a = buildThermalModel(PreheatInputSchema.parse(vanInput({ engineMaterial: material, engineMassKg: 100 })));
      const b = buildThermalModel(PreheatInputSchema.parse(vanInput({ engineMaterial: material, engineMassKg: 200 })));
      expect(b.parameters.c1JPerK - a.parameters.c1JPerK).toBeCloseTo(100 * cp * 1000, 6);
    }
  });

  it('the planner takes glycol cp midway between outside and target: −20 °C and 60 °C → 20 °C → 3.32 kJ/(kg·K) — Conde (2011)', () => {
    const a = buildThermalModel(PreheatInputSchema.parse(vanInput({ outsideTemperatureC: -20, targetCoolantTemperatureC: 60, coolantVolumeL: 5 })));
    const b = buildThermalModel(PreheatInputSchema.parse(vanInput({ outsideTemperatureC: -20, targetCoolantTemperatureC: 60, coolantVolumeL: 10 })));
    // 5 L more coolant at 1.07 kg/L (from memory).
    const extraMassKg = 5 * 1.07;
    expect((b.parameters.c1JPerK - a.parameters.c1JPerK) / extraMassKg).toBeCloseTo(3320, 6);
  });

  it('coolant densities at 20 °C: water 998 kg/m³, 50 % glycol 1070 kg/m³ — from memory', () => {
    expect(COOLANT_DENSITY_20C.water.value).toBe(998);
    expect(COOLANT_DENSITY_20C['ethylene-glycol-50'].value).toBe(1070);
  });

  it('air cp 1.006 kJ/(kg·K); density 1.292 kg/m³ at 0 °C and 1.367 at −15 °C — Çengel, Table A-15 (ideal gas)', () => {
    expect(AIR_SPECIFIC_HEAT.value).toBe(1.006);
    // The table prints three decimals, so agreement to half a unit in the last place.
    expect(Math.abs(airDensityKgPerM3(0) - 1.292)).toBeLessThan(0.0005);
    expect(Math.abs(airDensityKgPerM3(-15) - 1.367)).toBeLessThan(0.0005);
  });
});

describe('fuels (EN 590, EN 228, IPCC 2006 Guidelines)', () => {
  it('lower heating values: diesel 43.0 MJ/kg, petrol 44.3 MJ/kg — IPCC 2006 Guidelines, Vol. 2, Table 1.2', () => {
    expect(FUEL_PROPERTIES.diesel.lowerHeatingValueMJPerKg).toBe(43.0);
    expect(FUEL_PROPERTIES.petrol.lowerHeatingValueMJPerKg).toBe(44.3);
  });

  it('densities lie inside EN 590 (820–845 kg/m³) and EN 228 (720–775 kg/m³)', () => {
    expect(FUEL_PROPERTIES.diesel.densityKgPerM3).toBeGreaterThanOrEqual(820);
    expect(FUEL_PROPERTIES.diesel.densityKgPerM3).toBeLessThanOrEqual(845);
    expect(FUEL_PROPERTIES.petrol.densityKgPerM3).toBeGreaterThanOrEqual(720);
    expect(FUEL_PROPERTIES.petrol.densityKgPerM3).toBeLessThanOrEqual(775);
  });

  it('worked check: 5 kW at 85 % burns 0.4925 kg/h of diesel, about 0.59 L/h at 832 kg/m³ — worked from IPCC 2006 Vol. 2 Table 1.2 and an EN 590 density', () => {
    const rate = fuelPerHour(5000, 0.85, 'diesel');
    expect(rate.kg).toBeCloseTo(0.4925, 4);
    expect(FUEL_PROPERTIES.diesel.densityKgPerM3).toBe(832);
    expect(rate.litres).toBeCloseTo(0.59, 2);
  });

  it('the planner burns that rate for the warm-up time — the worked IPCC/EN 590 rate above', () => {
    const plan = planPreheat(vanInput({ heaterOutputKw: 5, combustionEfficiency: 0.85, fuel: 'diesel' }));
    expect(plan.timeToTargetMinutes).not.toBeNull();
    expect(plan.fuel.kg).toBeCloseTo((0.4925 * plan.timeToTargetMinutes!) / 60, 4);
  });
});

describe('12 V lead-acid open-circuit voltage (BCI, 27 °C)', () => {
  const bci: Array<[number, number]> = [[100, 12.65], [75, 12.45], [50, 12.24], [25, 12.06], [0, 11.89]];

  it('the table points reproduce exactly — Battery Council International state-of-charge table, 27 °C', () => {
    expect(BCI_OPEN_CIRCUIT_VOLTAGE_12V).toHaveLength(5);
    for (const [soc, volts] of bci) expect(openCircuitVoltage(soc, 'flooded', 12)).toBeCloseTo(volts, 12);
  });

  it('24 V systems read double — Battery Council International table; a 24 V system is two 12 V batteries in series', () => {
    for (const [soc, volts] of bci) expect(openCircuitVoltage(soc, 'flooded', 24)).toBeCloseTo(2 * volts, 12);
  });

  it('AGM reads 0.1–0.2 V higher — battery makers’ state-of-charge tables, from memory; the 0.15 V used is our choice inside that range', () => {
    for (const [soc] of bci) {
      const diff = openCircuitVoltage(soc, 'agm', 12) - openCircuitVoltage(soc, 'flooded', 12);
      expect(diff).toBeGreaterThanOrEqual(0.1);
      expect(diff).toBeLessThanOrEqual(0.2);
    }
  });

  it('interpolation is linear between BCI points: 62.5 % lies halfway between 12.24 V and 12.45 V', () => {
    expect(openCircuitVoltage(62.5, 'flooded', 12)).toBeCloseTo((12.24 + 12.45) / 2, 12);
    expect(openCircuitVoltage(10, 'flooded', 12)).toBeCloseTo(11.89 + (10 / 25) * (12.06 - 11.89), 12);
  });

  it('interpolation is monotonic in state of charge (BCI table rises with charge)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.constantFrom('flooded' as const, 'agm' as const),
        fc.constantFrom(12 as const, 24 as const),
        (a, b, type, v) => {
          const [lo, hi] = a <= b ? [a, b] : [b, a];
          expect(openCircuitVoltage(lo, type, v)).toBeLessThanOrEqual(openCircuitVoltage(hi, type, v));
        },
      ),
    );
  });
});

describe('thermal model against textbook solutions', () => {
  it('single node: T(t) = Ta + (P/UA)(1 − e^(−UA·t/C)) — Newton heating, lumped capacitance (Incropera, ch. 5.3)', () => {
    const Ta = -10;
    const P = 4000;
    const UA = 30;
    const C = 80_000;
    // Uncoupled nodes: UA12 = 0 leaves node 1 a single lumped body.
    const model: TwoNodeModel = { c1JPerK: C, c2JPerK: 20_000, ua1aWPerK: UA, ua12WPerK: 0, ua2aWPerK: 40, heatInputW: P, ambientC: Ta };
    const textbook = (t: number): number => Ta + (P / UA) * (1 - Math.exp((-UA * t) / C));
    const closed = solveTwoNodeClosedForm(model);
    const rk4 = integrateTwoNodeRk4(model, { durationSeconds: 10_800, stepSeconds: 5, sampleEverySeconds: 600 });
    for (const s of rk4) {
      const exact = textbook(s.tSeconds);
      expect(closed.at(s.tSeconds).coolantC).toBeCloseTo(exact, 9);
      expect(s.coolantC).toBeCloseTo(exact, 6);
      expect(closed.at(s.tSeconds).cabinC).toBeCloseTo(Ta, 9); // no heat reaches the cabin
    }
    expect(closed.steadyState.coolantC).toBeCloseTo(Ta + P / UA, 9);
    expect(Math.max(...closed.timeConstantsSeconds)).toBeCloseTo(C / UA, 6); // τ = C/UA
  });

  it('two-node steady state matches the thermal-resistance network — Incropera, ch. 3 (series/parallel resistances)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 500, max: 10_000, noNaN: true }),
        (ua1a, ua12, ua2a, P) => {
          const model: TwoNodeModel = { c1JPerK: 80_000, c2JPerK: 40_000, ua1aWPerK: ua1a, ua12WPerK: ua12, ua2aWPerK: ua2a, heatInputW: P, ambientC: 0 };
          const branchToCabin = 1 / (1 / ua12 + 1 / ua2a);
          const theta1 = P / (ua1a + branchToCabin);
          const theta2 = (theta1 * ua12) / (ua12 + ua2a);
          const ss = solveTwoNodeClosedForm(model).steadyState;
          expect(ss.coolantC).toBeCloseTo(theta1, 6);
          expect(ss.cabinC).toBeCloseTo(theta2, 6);
        },
      ),
    );
  });
});

describe('trade practice (common practice, no source)', () => {
  it('van preset at −15 °C with a 5 kW heater reaches 60 °C coolant in roughly half an hour (20–45 min) — common practice, no source (DESIGN.md trade facts)', () => {
    const plan = planPreheat(vanInput({ outsideTemperatureC: -15, heaterOutputKw: 5 }));
    expect(plan.input.targetCoolantTemperatureC).toBe(60);
    expect(plan.timeToTargetMinutes).not.toBeNull();
    expect(plan.timeToTargetMinutes!).toBeGreaterThan(20);
    expect(plan.timeToTargetMinutes!).toBeLessThan(45);
  });
});
