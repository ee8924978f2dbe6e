// Unit tests of the pre-heat planner: closed form vs RK4, energy balance, properties, planner output, schema.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ZodError } from 'zod';
import {
  MOTORHOME_PRESET,
  PANEL_VAN_PRESET,
  PREHEAT_PRESETS,
  batteryUse,
  energyBalance,
  fuelBurnt,
  integrateTwoNodeRk4,
  planPreheat,
  solveTwoNodeClosedForm,
  systemMatrix,
  timeToCoolantTemperature,
  type TemperatureSample,
  type TwoNodeModel,
} from '../../../packages/domain/src/heater';
import { PreheatInputSchema, type PreheatInputDraft } from '../../../packages/domain/src/schemas/preheat';

const DEPARTURE = '2026-01-15T07:30:00+01:00';

function input(overrides: Partial<PreheatInputDraft> = {}, preset = PANEL_VAN_PRESET): PreheatInputDraft {
  return { ...preset.values, outsideTemperatureC: -15, departure: DEPARTURE, ...overrides };
}

/** Random but physically sensible two-node models. */
const modelArb: fc.Arbitrary<TwoNodeModel> = fc.record({
  c1JPerK: fc.double({ min: 20_000, max: 300_000, noNaN: true }),
  c2JPerK: fc.double({ min: 5_000, max: 200_000, noNaN: true }),
  ua1aWPerK: fc.double({ min: 0, max: 150, noNaN: true }),
  ua12WPerK: fc.double({ min: 1, max: 300, noNaN: true }),
  ua2aWPerK: fc.double({ min: 1, max: 300, noNaN: true }),
  heatInputW: fc.double({ min: 500, max: 12_000, noNaN: true }),
  ambientC: fc.double({ min: -40, max: 30, noNaN: true }),
});

/** Largest |closed − RK4| over the samples, relative to the largest temperature rise. */
function maxRelativeDeviation(model: TwoNodeModel, rk4: TemperatureSample[]): number {
  const closed = solveTwoNodeClosedForm(model);
  let maxRise = 0;
  let maxDiff = 0;
  for (const s of rk4) {
    const c = closed.at(s.tSeconds);
    maxRise = Math.max(maxRise, c.coolantC - model.ambientC, c.cabinC - model.ambientC);
    maxDiff = Math.max(maxDiff, Math.abs(c.coolantC - s.coolantC), Math.abs(c.cabinC - s.cabinC));
  }
  return maxDiff / maxRise;
}

describe('closed form of the two-node system', () => {
  it('eigenpairs satisfy A·v = λ·v, with λ1 + λ2 = trace and λ1·λ2 = det (2×2 linear algebra)', () => {
    fc.assert(
      fc.property(modelArb, (m) => {
        const A = systemMatrix(m);
        const sol = solveTwoNodeClosedForm(m);
        const [l1, l2] = sol.eigenvalues;
        const tr = A.a11 + A.a22;
        const det = A.a11 * A.a22 - A.a12 * A.a21;
        expect(l1 + l2).toBeCloseTo(tr, 12);
        expect((l1 * l2) / det).toBeCloseTo(1, 9);
        expect(l1).toBeLessThan(0);
        expect(l2).toBeLessThan(0);
        sol.eigenvectors.forEach(([x, y], i) => {
          const l = sol.eigenvalues[i]!;
          const scale = Math.abs(A.a11) + Math.abs(A.a22);
          expect(Math.abs(A.a11 * x + A.a12 * y - l * x)).toBeLessThan(1e-9 * scale);
          expect(Math.abs(A.a21 * x + A.a22 * y - l * y)).toBeLessThan(1e-9 * scale);
        });
        // Starts at ambient.
        expect(sol.at(0).coolantC).toBeCloseTo(m.ambientC, 9);
        expect(sol.at(0).cabinC).toBeCloseTo(m.ambientC, 9);
      }),
    );
  });

  it('closed form and RK4 (5 s step) agree within 0.5 % over the presets’ warm-up', () => {
    for (const preset of PREHEAT_PRESETS) {
      const plan = planPreheat(input({}, preset));
      const model = plan.thermalModel.parameters;
      const rk4 = integrateTwoNodeRk4(model, { durationSeconds: plan.timeToTargetMinutes! * 60, stepSeconds: 5, sampleEverySeconds: 30 });
      expect(rk4[rk4.length - 1]!.tSeconds).toBeCloseTo(plan.timeToTargetMinutes! * 60, 9);
      expect(maxRelativeDeviation(model, rk4)).toBeLessThan(0.005);
    }
  });

  it('closed form and RK4 agree within 0.5 % for random models over three slow time constants', () => {
    fc.assert(
      fc.property(modelArb, (m) => {
        const sol = solveTwoNodeClosedForm(m);
        const duration = 3 * sol.timeConstantsSeconds[1];
        // Step small against the fastest time constant, as a fixed-step integrator needs.
        const step = Math.min(5, sol.timeConstantsSeconds[0] / 10);
        const rk4 = integrateTwoNodeRk4(m, { durationSeconds: duration, stepSeconds: step, sampleEverySeconds: duration / 50 });
        expect(maxRelativeDeviation(m, rk4)).toBeLessThan(0.005);
      }),
      { numRuns: 60 },
    );
  });

  it('a coarse RK4 step shows a visible error, so the comparison can fail', () => {
    const m = planPreheat(input()).thermalModel.parameters;
    const sol = solveTwoNodeClosedForm(m);
    // A step of 2.5 fast time constants (still stable, far from accurate) must show the gap.
    const rk4 = integrateTwoNodeRk4(m, { durationSeconds: 1800, stepSeconds: sol.timeConstantsSeconds[0] * 2.5, sampleEverySeconds: 0 });
    expect(maxRelativeDeviation(m, rk4)).toBeGreaterThan(0.005);
  });
});

describe('energy balance: delivered = stored + lost (first law)', () => {
  it('holds within 1 % on the planner’s 30 s curve for both presets', () => {
    for (const preset of PREHEAT_PRESETS) {
      const plan = planPreheat(input({}, preset));
      const b = energyBalance(plan.thermalModel.parameters, plan.curve);
      expect(b.deliveredJ).toBeCloseTo(plan.input.heaterOutputKw * 1000 * plan.timeToTargetMinutes! * 60, 3);
      expect(b.relativeError).toBeLessThan(0.01);
      expect(b.storedJ).toBeGreaterThan(0);
      expect(b.lostJ).toBeGreaterThan(0);
    }
  });

  it('holds within 1 % on RK4 trajectories of random models', () => {
    fc.assert(
      fc.property(modelArb, fc.double({ min: 60, max: 4 * 3600, noNaN: true }), (m, duration) => {
        const sol = solveTwoNodeClosedForm(m);
        const step = Math.min(5, sol.timeConstantsSeconds[0] / 10);
        const rk4 = integrateTwoNodeRk4(m, { durationSeconds: duration, stepSeconds: step, sampleEverySeconds: step });
        expect(energyBalance(m, rk4).relativeError).toBeLessThan(0.01);
      }),
      { numRuns: 40 },
    );
  });

  it('flags a trajectory that breaks conservation (temperatures 10 % too high)', () => {
    const plan = planPreheat(input());
    const m = plan.thermalModel.parameters;
    const wrong = plan.curve.map((s) => ({ ...s, coolantC: m.ambientC + 1.1 * (s.coolantC - m.ambientC), cabinC: m.ambientC + 1.1 * (s.cabinC - m.ambientC) }));
    expect(energyBalance(m, wrong).relativeError).toBeGreaterThan(0.01);
  });
});

describe('properties of the warm-up', () => {
  it('temperatures never exceed the steady state nor drop below ambient while heating', () => {
    fc.assert(
      fc.property(modelArb, fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 20 }), (m, fractions) => {
        const sol = solveTwoNodeClosedForm(m);
        const eps = 1e-9 * (Math.abs(m.ambientC) + sol.steadyState.coolantC - m.ambientC + 1);
        for (const f of fractions) {
          const s = sol.at(f * 6 * sol.timeConstantsSeconds[1]);
          expect(s.coolantC).toBeGreaterThanOrEqual(m.ambientC - eps);
          expect(s.cabinC).toBeGreaterThanOrEqual(m.ambientC - eps);
          expect(s.coolantC).toBeLessThanOrEqual(sol.steadyState.coolantC + eps);
          expect(s.cabinC).toBeLessThanOrEqual(sol.steadyState.cabinC + eps);
        }
      }),
    );
  });

  it('more heater power never lengthens the time to target', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 12, noNaN: true }),
        fc.double({ min: 0.5, max: 12, noNaN: true }),
        fc.integer({ min: -40, max: 5 }),
        fc.integer({ min: 30, max: 85 }),
        fc.constantFrom(...PREHEAT_PRESETS),
        (p1, p2, outside, target, preset) => {
          const [lo, hi] = p1 <= p2 ? [p1, p2] : [p2, p1];
          const weak = planPreheat(input({ heaterOutputKw: lo, outsideTemperatureC: outside, targetCoolantTemperatureC: target }, preset));
          const strong = planPreheat(input({ heaterOutputKw: hi, outsideTemperatureC: outside, targetCoolantTemperatureC: target }, preset));
          const minutes = (t: number | null): number => t ?? Number.POSITIVE_INFINITY;
          expect(minutes(strong.timeToTargetMinutes)).toBeLessThanOrEqual(minutes(weak.timeToTargetMinutes) + 1e-6);
          if (weak.reachable) expect(strong.reachable).toBe(true);
        },
      ),
      { numRuns: 80 },
    );
  });

  it('fuel scales linearly with time (k·t burns k times as much; runs add up)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 20, noNaN: true }),
        fc.double({ min: 0.05, max: 1, noNaN: true }),
        fc.constantFrom('diesel' as const, 'petrol' as const),
        fc.double({ min: 1, max: 20_000, noNaN: true }),
        fc.double({ min: 1, max: 20_000, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (kw, eff, fuel, t1, t2, k) => {
          const a = fuelBurnt(kw * 1000, eff, fuel, t1);
          const scaled = fuelBurnt(kw * 1000, eff, fuel, k * t1);
          const sum = fuelBurnt(kw * 1000, eff, fuel, t1 + t2);
          const b = fuelBurnt(kw * 1000, eff, fuel, t2);
          expect(scaled.kg).toBeCloseTo(k * a.kg, 9);
          expect(scaled.litres).toBeCloseTo(k * a.litres, 9);
          expect(sum.kg / (a.kg + b.kg)).toBeCloseTo(1, 12);
          expect(sum.litres / (a.litres + b.litres)).toBeCloseTo(1, 12);
        },
      ),
    );
  });
});

describe('planPreheat', () => {
  it('starts the curve at ambient, ends it exactly at the target, rising, every 30 s', () => {
    const plan = planPreheat(input());
    expect(plan.reachable).toBe(true);
    const first = plan.curve[0]!;
    const last = plan.curve[plan.curve.length - 1]!;
    expect(first).toMatchObject({ tSeconds: 0, minutes: 0 });
    expect(first.coolantC).toBeCloseTo(-15, 9);
    expect(first.cabinC).toBeCloseTo(-15, 9);
    expect(last.coolantC).toBeCloseTo(60, 4);
    expect(last.minutes).toBeCloseTo(plan.timeToTargetMinutes!, 9);
    expect(plan.cabinAtTargetC).toBeCloseTo(last.cabinC, 9);
    for (let i = 1; i < plan.curve.length - 1; i++) {
      expect(plan.curve[i]!.tSeconds - plan.curve[i - 1]!.tSeconds).toBe(30);
      expect(plan.curve[i]!.coolantC).toBeGreaterThan(plan.curve[i - 1]!.coolantC);
      expect(plan.curve[i]!.cabinC).toBeGreaterThan(plan.curve[i - 1]!.cabinC);
      expect(plan.curve[i]!.coolantC).toBeLessThan(60);
    }
    const perMinute = planPreheat(input(), { stepSeconds: 60 });
    expect(perMinute.curve[1]!.tSeconds).toBe(60);
  });

  it('recommends departure − time to target, rounded down to the minute, in the departure’s offset', () => {
    const plan = planPreheat(input({ departure: '2026-01-15T07:30:00+01:00' }));
    const t = plan.timeToTargetMinutes!;
    const expectedMs = Math.floor((Date.parse('2026-01-15T07:30:00+01:00') - t * 60_000) / 60_000) * 60_000;
    expect(plan.recommendedStart).toMatch(/^2026-01-15T\d{2}:\d{2}:00\+01:00$/);
    expect(Date.parse(plan.recommendedStart!)).toBe(expectedMs);
    expect(plan.leadMinutes).toBe(Math.ceil(t));
    expect(plan.departure).toBe('2026-01-15T07:30:00+01:00');

    const west = planPreheat(input({ departure: '2026-01-15T06:05:00-03:30' }));
    expect(west.recommendedStart).toMatch(/-03:30$/);
    expect(Date.parse(west.recommendedStart!)).toBe(Math.floor((Date.parse('2026-01-15T06:05:00-03:30') - west.timeToTargetMinutes! * 60_000) / 60_000) * 60_000);

    const asDate = planPreheat(input({ departure: new Date('2026-01-15T06:30:00Z') }));
    expect(asDate.departure).toBe('2026-01-15T06:30:00Z');
    expect(asDate.recommendedStart).toMatch(/Z$/);
    expect(Date.parse(asDate.recommendedStart!)).toBe(Date.parse(plan.recommendedStart!));
  });

  it('never recommends a start later than departure − time to target, and never a full minute earlier', () => {
    const ttt = planPreheat(input()).timeToTargetMinutes! * 60_000;
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 24 * 3600 - 1 }), (secondOfDay) => {
        const departure = new Date(Date.UTC(2026, 0, 15) + secondOfDay * 1000);
        const plan = planPreheat(input({ departure }));
        const start = Date.parse(plan.recommendedStart!);
        const latest = departure.getTime() - ttt;
        expect(start % 60_000).toBe(0);
        expect(start).toBeLessThanOrEqual(latest);
        expect(latest - start).toBeLessThan(60_000);
      }),
      { numRuns: 50 },
    );
  });

  it('reports "not reachable" with a reason when the steady state stays below the target', () => {
    const plan = planPreheat(input({ heaterOutputKw: 1, outsideTemperatureC: -30, targetCoolantTemperatureC: 80 }));
    expect(plan.steadyState.coolantC).toBeLessThan(80);
    expect(plan.reachable).toBe(false);
    expect(plan.timeToTargetMinutes).toBeNull();
    expect(plan.recommendedStart).toBeNull();
    expect(plan.battery).toBeNull();
    expect(plan.unreachableReason).toMatch(/level off/);
    expect(plan.unreachableReason).toContain(`${Math.round(plan.steadyState.coolantC * 10) / 10}`.replace('-', '\u2212'));
    // The curve shows the approach to the steady state over the fixed horizon.
    expect(plan.curve[plan.curve.length - 1]!.minutes).toBe(180);
  });

  it('computes battery charge as W × h ÷ V and the state of charge it leaves', () => {
    const plan = planPreheat(input({ heaterDrawW: 80, systemVoltage: 12, batteryCapacityAh: 95 }));
    const hours = plan.timeToTargetMinutes! / 60;
    expect(plan.battery!.chargeUsedAh).toBeCloseTo((80 * hours) / 12, 9);
    expect(plan.battery!.endStateOfChargePercent).toBeCloseTo(100 - ((80 * hours) / 12 / 95) * 100, 9);
    expect(plan.battery!.belowCutOff).toBe(false);
    const at24 = planPreheat(input({ heaterDrawW: 80, systemVoltage: 24, batteryCapacityAh: 95 }));
    expect(at24.battery!.chargeUsedAh).toBeCloseTo(plan.battery!.chargeUsedAh / 2, 9);
    expect(plan.warnings).toEqual([]);
  });

  it('warns when the battery would fall below the 50 % safe cut-off', () => {
    const plan = planPreheat(input({ startStateOfChargePercent: 55, batteryCapacityAh: 40, heaterDrawW: 100 }));
    expect(plan.battery!.endStateOfChargePercent).toBeLessThan(50);
    expect(plan.battery!.belowCutOff).toBe(true);
    expect(plan.warnings.map((w) => w.code)).toContain('battery-below-cut-off');
    const flat = batteryUse({ capacityAh: 10, type: 'flooded', systemVoltage: 12, drawW: 300, durationSeconds: 3600, startStateOfChargePercent: 100 });
    expect(flat.exhausted).toBe(true);
    expect(flat.endStateOfChargePercent).toBe(0);
  });

  it('warns about plain water below freezing and lists plain-English assumptions and the exhaust caution', () => {
    const plan = planPreheat(input({ coolantMixture: 'water' }));
    expect(plan.warnings.map((w) => w.code)).toContain('water-coolant-freezing');
    expect(plan.assumptions.length).toBeGreaterThan(5);
    expect(plan.assumptions.join(' ')).toMatch(/full rated output until the coolant reaches the target/);
    expect(plan.cautions).toContain('exhaust-gas');
  });

  it('the motorhome preset needs longer than the van (more mass, larger cabin)', () => {
    const van = planPreheat(input({}, PANEL_VAN_PRESET));
    const home = planPreheat(input({}, MOTORHOME_PRESET));
    expect(home.timeToTargetMinutes!).toBeGreaterThan(van.timeToTargetMinutes!);
  });

  it('timeToCoolantTemperature returns the crossing of the closed-form curve', () => {
    const m = planPreheat(input()).thermalModel.parameters;
    const sol = solveTwoNodeClosedForm(m);
    const t = timeToCoolantTemperature(sol, 40)!;
    expect(sol.at(t).coolantC).toBeCloseTo(40, 5);
    expect(sol.at(t - 1).coolantC).toBeLessThan(40);
    expect(timeToCoolantTemperature(sol, sol.steadyState.coolantC + 1)).toBeNull();
  });

  it('preset names are invented demo names', () => {
    expect(PREHEAT_PRESETS.map((p) => p.name)).toEqual(['Korvan Cargo 4', 'Maren Camper 2']);
  });
});

describe('PreheatInputSchema', () => {
  const valid = input();
  const messageFor = (draft: unknown, field: string): string | undefined => {
    const r = PreheatInputSchema.safeParse(draft);
    return r.success ? undefined : r.error.issues.find((i) => i.path[0] === field)?.message;
  };

  it('accepts the presets and defaults the starting charge to 100 %', () => {
    const { startStateOfChargePercent: _omit, ...rest } = valid;
    expect(PreheatInputSchema.parse(rest).startStateOfChargePercent).toBe(100);
  });

  it.each([
    ['outsideTemperatureC', -41, 'Outside temperature must be between −40 °C and 30 °C'],
    ['outsideTemperatureC', 31, 'Outside temperature must be between −40 °C and 30 °C'],
    ['targetCoolantTemperatureC', 95, 'Target coolant temperature must be between 10 °C and 90 °C'],
    ['heaterOutputKw', 0, 'Heater heat output must be greater than 0 kW and at most 20 kW'],
    ['heaterOutputKw', -2, 'Heater heat output must be greater than 0 kW and at most 20 kW'],
    ['combustionEfficiency', 0, 'Combustion efficiency must be greater than 0 and at most 1'],
    ['combustionEfficiency', 1.01, 'Combustion efficiency must be greater than 0 and at most 1'],
    ['engineMassKg', 5, 'Engine mass must be between 20 kg and 600 kg'],
    ['coolantVolumeL', 100, 'Coolant volume must be between 1 L and 40 L'],
    ['cabinVolumeM3', 0, 'Cabin volume must be between 0.5 m³ and 60 m³'],
    ['batteryCapacityAh', 5, 'Battery capacity must be between 10 Ah and 1000 Ah'],
    ['startStateOfChargePercent', 120, 'Starting battery charge must be between 0 % and 100 %'],
    ['heaterMatrixWPerK', 0, 'Heater matrix conductance must be between 1 W/K and 500 W/K'],
    ['systemVoltage', 13, 'System voltage must be 12 V or 24 V'],
    ['outsideTemperatureC', 'cold', 'Outside temperature must be between −40 °C and 30 °C'],
    ['outsideTemperatureC', Number.NaN, 'Outside temperature must be between −40 °C and 30 °C'],
  ])('rejects %s = %s with "%s"', (field, value, message) => {
    expect(messageFor({ ...valid, [field]: value }, field)).toBe(message);
  });

  it('accepts the edges: efficiency 1, −40 °C outside', () => {
    expect(PreheatInputSchema.safeParse({ ...valid, combustionEfficiency: 1 }).success).toBe(true);
    expect(PreheatInputSchema.safeParse({ ...valid, outsideTemperatureC: -40 }).success).toBe(true);
  });

  it('rejects a target at or below the outside temperature on the target field', () => {
    const r = PreheatInputSchema.safeParse({ ...valid, outsideTemperatureC: 25, targetCoolantTemperatureC: 20 });
    expect(r.success).toBe(false);
    const issues = r.success ? [] : r.error.issues;
    expect(issues).toHaveLength(1);
    expect(issues[0]!.path).toEqual(['targetCoolantTemperatureC']);
    expect(issues[0]!.message).toBe('Target coolant temperature must be above the outside temperature (25 °C) and at most 90 °C');
    expect(messageFor({ ...valid, outsideTemperatureC: 20, targetCoolantTemperatureC: 20 }, 'targetCoolantTemperatureC')).toMatch(/above the outside/);
    // Still reported when another field is wrong too.
    expect(messageFor({ ...valid, outsideTemperatureC: 25, targetCoolantTemperatureC: 20, engineMassKg: 1 }, 'targetCoolantTemperatureC')).toMatch(/above the outside/);
  });

  it('requires a departure with a UTC offset', () => {
    const msg = 'Departure must be a date and time with a UTC offset, e.g. 2026-01-15T07:30:00+01:00';
    expect(messageFor({ ...valid, departure: '2026-01-15T07:30:00' }, 'departure')).toBe(msg);
    expect(messageFor({ ...valid, departure: new Date('not a date') }, 'departure')).toBe(msg);
    expect(PreheatInputSchema.safeParse({ ...valid, departure: '2026-01-15T07:30:00Z' }).success).toBe(true);
  });

  it('planPreheat throws the schema’s ZodError on bad input', () => {
    expect(() => planPreheat({ ...valid, heaterOutputKw: 0 })).toThrow(ZodError);
  });
});
