// The pre-heat planner: when to start the coolant heater, and what the warm-up costs in fuel and battery.
import { PreheatInputSchema, type PreheatInput, type PreheatInputDraft } from '../schemas/preheat';
import type { CautionCode } from '../schemas/catalogue';
import {
  AIR_SPECIFIC_HEAT,
  COOLANT_DENSITY_20C,
  ENGINE_MATERIAL_SPECIFIC_HEAT,
  airDensityKgPerM3,
  coolantSpecificHeat,
} from './materials';
import { FUEL_PROPERTIES, fuelBurnt, fuelPerHour, type FuelAmount } from './fuels';
import { batteryUse, type BatteryUse } from './battery';
import {
  solveTwoNodeClosedForm,
  timeToCoolantTemperature,
  type ClosedFormSolution,
  type TemperatureSample,
  type TwoNodeModel,
} from './thermal-model';

/** Longest warm-up the planner will recommend; beyond it the target counts as not reachable. */
export const MAX_WARM_UP_MINUTES = 360;
/** Warn above this: many heaters end a timed run after 30–120 minutes (common practice, no source). */
export const LONG_RUN_WARNING_MINUTES = 120;
/** How far the curve runs when the target is not reached. */
export const UNREACHABLE_CURVE_MINUTES = 180;

export interface ThermalModelDetails {
  parameters: TwoNodeModel;
  /** Temperature at which coolant cp is taken: midway between outside and target. */
  representativeTemperatureC: number;
  engineHeatCapacityJPerK: number;
  coolantMassKg: number;
  coolantSpecificHeatJPerKgK: number;
  coolantHeatCapacityJPerK: number;
  airMassKg: number;
  airHeatCapacityJPerK: number;
  interiorHeatCapacityJPerK: number;
}

/** Turns validated planner input into the two-node model (SI units). */
export function buildThermalModel(input: PreheatInput): ThermalModelDetails {
  const representativeTemperatureC = (input.outsideTemperatureC + input.targetCoolantTemperatureC) / 2;
  const engineHeatCapacityJPerK = input.engineMassKg * ENGINE_MATERIAL_SPECIFIC_HEAT[input.engineMaterial].value * 1000;
  const coolantMassKg = (input.coolantVolumeL / 1000) * COOLANT_DENSITY_20C[input.coolantMixture].value;
  const coolantSpecificHeatJPerKgK = coolantSpecificHeat(input.coolantMixture, representativeTemperatureC) * 1000;
  const coolantHeatCapacityJPerK = coolantMassKg * coolantSpecificHeatJPerKgK;
  // Air mass at the outside temperature: the air in a parked cabin starts there; as it warms
  // some leaves through vents, but air is under a tenth of the cabin's heat capacity anyway.
  const airMassKg = input.cabinVolumeM3 * airDensityKgPerM3(input.outsideTemperatureC);
  const airHeatCapacityJPerK = airMassKg * AIR_SPECIFIC_HEAT.value * 1000;
  const interiorHeatCapacityJPerK = input.interiorHeatCapacityKjPerK * 1000;
  return {
    parameters: {
      c1JPerK: engineHeatCapacityJPerK + coolantHeatCapacityJPerK,
      c2JPerK: airHeatCapacityJPerK + interiorHeatCapacityJPerK,
      ua1aWPerK: input.engineLossWPerK,
      ua12WPerK: input.heaterMatrixWPerK,
      ua2aWPerK: input.cabinLossWPerK,
      heatInputW: input.heaterOutputKw * 1000,
      ambientC: input.outsideTemperatureC,
    },
    representativeTemperatureC,
    engineHeatCapacityJPerK,
    coolantMassKg,
    coolantSpecificHeatJPerKgK,
    coolantHeatCapacityJPerK,
    airMassKg,
    airHeatCapacityJPerK,
    interiorHeatCapacityJPerK,
  };
}

export interface CurvePoint extends TemperatureSample {
  minutes: number;
}

export interface PreheatWarning {
  code: 'battery-below-cut-off' | 'battery-exhausted' | 'battery-low-at-start' | 'long-run' | 'water-coolant-freezing';
  message: string;
}

export interface PreheatPlan {
  input: PreheatInput;
  reachable: boolean;
  /** Why the target is not reached; null when it is. */
  unreachableReason: string | null;
  /** Exact time for the coolant to reach the target, minutes. */
  timeToTargetMinutes: number | null;
  /** Whole minutes between recommended start and departure (time to target rounded up). */
  leadMinutes: number | null;
  /** Departure as ISO 8601, in the offset it was given in (UTC for a Date). */
  departure: string;
  /** Departure − time to target, rounded down to the whole minute, same offset as departure. */
  recommendedStart: string | null;
  /** Temperatures the system would settle at with the heater at full output. */
  steadyState: { coolantC: number; cabinC: number };
  /** Cabin temperature when the coolant reaches the target. */
  cabinAtTargetC: number | null;
  /** Warm-up curve from start to the target (or a fixed horizon when not reachable). */
  curve: CurvePoint[];
  stepSeconds: number;
  fuel: FuelAmount & {
    perHour: FuelAmount;
    lowerHeatingValueMJPerKg: number;
    densityKgPerM3: number;
    sources: string[];
  };
  /** Battery use over the warm-up; null when the target is not reached. */
  battery: BatteryUse | null;
  thermalModel: ThermalModelDetails & {
    eigenvaluesPerSecond: readonly [number, number];
    timeConstantsMinutes: readonly [number, number];
  };
  warnings: PreheatWarning[];
  cautions: CautionCode[];
  /** Plain-English modelling assumptions for the screen. */
  assumptions: string[];
}

const OFFSET_PATTERN = /(Z|[+-]\d{2}:\d{2})$/i;

/** Milliseconds since the epoch and the offset in minutes of an ISO string or Date. */
function parseDeparture(departure: string | Date): { ms: number; offsetMinutes: number } {
  if (departure instanceof Date) return { ms: departure.getTime(), offsetMinutes: 0 };
  const ms = Date.parse(departure);
  const match = OFFSET_PATTERN.exec(departure);
  if (!Number.isFinite(ms) || !match) throw new RangeError('Departure must be an ISO date-time with an offset');
  const suffix = match[1]!.toUpperCase();
  if (suffix === 'Z') return { ms, offsetMinutes: 0 };
  const sign = suffix.startsWith('-') ? -1 : 1;
  const [h, m] = suffix.slice(1).split(':').map(Number);
  return { ms, offsetMinutes: sign * ((h ?? 0) * 60 + (m ?? 0)) };
}

/** ISO 8601 in a fixed offset, to the second. */
export function formatWithOffset(ms: number, offsetMinutes: number): string {
  const local = new Date(ms + offsetMinutes * 60_000).toISOString().slice(0, 19);
  if (offsetMinutes === 0) return `${local}Z`;
  const abs = Math.abs(offsetMinutes);
  const hh = String(Math.floor(abs / 60)).padStart(2, '0');
  const mm = String(abs % 60).padStart(2, '0');
  return `${local}${offsetMinutes < 0 ? '-' : '+'}${hh}:${mm}`;
}

/** Samples of the closed-form solution every `stepSeconds` up to `endSeconds`, end point included. */
export function sampleCurve(solution: ClosedFormSolution, endSeconds: number, stepSeconds: number): CurvePoint[] {
  const points: CurvePoint[] = [];
  const n = Math.floor(endSeconds / stepSeconds + 1e-9);
  for (let i = 0; i <= n; i++) {
    const s = solution.at(i * stepSeconds);
    points.push({ ...s, minutes: s.tSeconds / 60 });
  }
  if (endSeconds - n * stepSeconds > 1e-6) {
    const s = solution.at(endSeconds);
    points.push({ ...s, minutes: s.tSeconds / 60 });
  }
  return points;
}

const round1 = (x: number): string => (Math.round(x * 10) / 10).toString().replace('-', '\u2212');

function assumptionsFor(details: ThermalModelDetails, input: PreheatInput): string[] {
  const fuel = FUEL_PROPERTIES[input.fuel];
  return [
    'Engine with its coolant, and the cabin, are each treated as one body at one temperature.',
    'The heater gives its full rated output until the coolant reaches the target; real heaters then drop to part load or pause, which this plan does not model.',
    'The blower runs from the start and moves the coolant heat into the cabin through the heater matrix; many controllers wait until the coolant is warm, which makes the cabin warm later.',
    'The vehicle starts at the outside temperature, as after a night parked outside; no wind, sun or snow cover is modelled.',
    `Heat losses to the outside are fixed conductances: engine ${input.engineLossWPerK} W/K, cabin ${input.cabinLossWPerK} W/K; heater matrix to cabin ${input.heaterMatrixWPerK} W/K.`,
    `Coolant heat capacity is taken at ${round1(details.representativeTemperatureC)} °C, midway between the outside and target temperatures.`,
    `The cabin's heat capacity is its air plus ${input.interiorHeatCapacityKjPerK} kJ/K for seats, trim, glass and panels that warm along with the air (an estimate).`,
    'The engine mass is the metal around the coolant that warms within the run, not the whole engine.',
    `Fuel use assumes ${input.fuel} with a lower heating value of ${fuel.lowerHeatingValueMJPerKg} MJ/kg and a density of ${fuel.densityKgPerM3} kg/m³, and the stated combustion efficiency for the whole run.`,
    'Battery use is the heater’s average electrical draw divided by the nominal system voltage; extra draw while the glow plug lights the burner, and the lower capacity of a cold battery, are not included.',
    `State of charge and rest voltage follow the BCI table at 27 °C; AGM batteries are taken as 0.15 V higher; the safe limit is 50 % charge, so the engine will still start.`,
  ];
}

/**
 * Plans a pre-heat. Validates the input with PreheatInputSchema (throws its ZodError on bad
 * input), solves the two-node model in closed form and reports time, fuel and battery.
 */
export function planPreheat(draft: PreheatInputDraft, options: { stepSeconds?: 30 | 60 } = {}): PreheatPlan {
  const input = PreheatInputSchema.parse(draft);
  const stepSeconds = options.stepSeconds ?? 30;
  const details = buildThermalModel(input);
  const solution = solveTwoNodeClosedForm(details.parameters);
  const target = input.targetCoolantTemperatureC;
  const heatW = details.parameters.heatInputW;

  let seconds = timeToCoolantTemperature(solution, target);
  let unreachableReason: string | null = null;
  if (seconds === null) {
    unreachableReason =
      `At full output the coolant would level off at about ${round1(solution.steadyState.coolantC)} °C, ` +
      `below the target of ${round1(target)} °C: heat losses at ${round1(input.outsideTemperatureC)} °C outside are too high for this heater. ` +
      'Lower the target, fit a stronger heater or reduce losses (for example an engine-bay cover).';
  } else if (seconds / 60 > MAX_WARM_UP_MINUTES) {
    unreachableReason =
      `The coolant would need about ${Math.round(seconds / 3600)} hours to reach ${round1(target)} °C, ` +
      `more than the ${MAX_WARM_UP_MINUTES / 60} hours this planner allows: it would level off at about ${round1(solution.steadyState.coolantC)} °C. ` +
      'Lower the target, fit a stronger heater or reduce losses.';
    seconds = null;
  }

  const departure = parseDeparture(input.departure);
  const fuelProps = FUEL_PROPERTIES[input.fuel];
  const perHour = fuelPerHour(heatW, input.combustionEfficiency, input.fuel);
  const warnings: PreheatWarning[] = [];

  if (input.coolantMixture === 'water' && input.outsideTemperatureC <= 0) {
    warnings.push({
      code: 'water-coolant-freezing',
      message: 'Plain water freezes at 0 °C: at this outside temperature the circuit needs antifreeze.',
    });
  }
  if (input.startStateOfChargePercent < 50) {
    warnings.push({
      code: 'battery-low-at-start',
      message: `The battery starts below 50 % charge; charge it before relying on the heater.`,
    });
  }

  let battery: BatteryUse | null = null;
  let curve: CurvePoint[];
  let fuel: FuelAmount;
  if (seconds === null) {
    curve = sampleCurve(solution, UNREACHABLE_CURVE_MINUTES * 60, stepSeconds);
    fuel = { kg: 0, litres: 0 };
  } else {
    curve = sampleCurve(solution, seconds, stepSeconds);
    fuel = fuelBurnt(heatW, input.combustionEfficiency, input.fuel, seconds);
    battery = batteryUse({
      capacityAh: input.batteryCapacityAh,
      type: input.batteryType,
      systemVoltage: input.systemVoltage,
      drawW: input.heaterDrawW,
      durationSeconds: seconds,
      startStateOfChargePercent: input.startStateOfChargePercent,
    });
    if (battery.exhausted) {
      warnings.push({ code: 'battery-exhausted', message: 'The run would use more charge than the battery holds: the heater would stop early.' });
    } else if (battery.belowCutOff && input.startStateOfChargePercent >= 50) {
      warnings.push({
        code: 'battery-below-cut-off',
        message:
          `The battery would drop to about ${Math.round(battery.endStateOfChargePercent)} % charge ` +
          `(about ${battery.endOpenCircuitVoltage.toFixed(2)} V at rest), below the safe limit of 50 % ` +
          `(about ${battery.cutOffOpenCircuitVoltage.toFixed(2)} V): the engine may not start.`,
      });
    }
    if (seconds / 60 > LONG_RUN_WARNING_MINUTES) {
      warnings.push({
        code: 'long-run',
        message: `The warm-up takes more than ${LONG_RUN_WARNING_MINUTES} minutes; many heaters end a timed run sooner, so check the heater's run-time setting.`,
      });
    }
  }

  const leadMinutes = seconds === null ? null : Math.ceil(seconds / 60 - 1e-9);
  const startMs = seconds === null ? null : Math.floor((departure.ms - seconds * 1000) / 60_000) * 60_000;

  return {
    input,
    reachable: seconds !== null,
    unreachableReason,
    timeToTargetMinutes: seconds === null ? null : seconds / 60,
    leadMinutes,
    departure: formatWithOffset(departure.ms, departure.offsetMinutes),
    recommendedStart: startMs === null ? null : formatWithOffset(startMs, departure.offsetMinutes),
    steadyState: solution.steadyState,
    cabinAtTargetC: seconds === null ? null : solution.at(seconds).cabinC,
    curve,
    stepSeconds,
    fuel: {
      ...fuel,
      perHour,
      lowerHeatingValueMJPerKg: fuelProps.lowerHeatingValueMJPerKg,
      densityKgPerM3: fuelProps.densityKgPerM3,
      sources: [fuelProps.lowerHeatingValueSource, fuelProps.densitySource],
    },
    battery,
    thermalModel: {
      ...details,
      eigenvaluesPerSecond: solution.eigenvalues,
      timeConstantsMinutes: [solution.timeConstantsSeconds[0] / 60, solution.timeConstantsSeconds[1] / 60],
    },
    warnings,
    cautions: ['exhaust-gas'],
    assumptions: assumptionsFor(details, input),
  };
}
