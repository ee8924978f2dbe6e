// Input of the pre-heat planner: physical ranges with messages that name the allowed range.
import { z } from 'zod';
import { HEATER_FUELS } from '../heater/fuels';
import { COOLANT_MIXTURES, ENGINE_MATERIALS } from '../heater/materials';
import { BATTERY_TYPES } from '../heater/battery';

/** Numbers in messages use a real minus sign, as the screens do. */
const show = (n: number): string => String(n).replace('-', '\u2212');

/** The allowed range of every numeric field, shared by the schema, its messages and the form. */
export const PREHEAT_LIMITS = {
  outsideTemperatureC: { min: -40, max: 30, unit: '°C', label: 'Outside temperature' },
  targetCoolantTemperatureC: { min: 10, max: 90, unit: '°C', label: 'Target coolant temperature' },
  heaterOutputKw: { min: 0, max: 20, unit: 'kW', label: 'Heater heat output', minExclusive: true },
  combustionEfficiency: { min: 0, max: 1, unit: '', label: 'Combustion efficiency', minExclusive: true },
  engineMassKg: { min: 20, max: 600, unit: 'kg', label: 'Engine mass' },
  coolantVolumeL: { min: 1, max: 40, unit: 'L', label: 'Coolant volume' },
  cabinVolumeM3: { min: 0.5, max: 60, unit: 'm³', label: 'Cabin volume' },
  interiorHeatCapacityKjPerK: { min: 0, max: 500, unit: 'kJ/K', label: 'Interior heat capacity' },
  engineLossWPerK: { min: 0, max: 300, unit: 'W/K', label: 'Engine heat loss' },
  heaterMatrixWPerK: { min: 1, max: 500, unit: 'W/K', label: 'Heater matrix conductance' },
  cabinLossWPerK: { min: 1, max: 500, unit: 'W/K', label: 'Cabin heat loss' },
  batteryCapacityAh: { min: 10, max: 1000, unit: 'Ah', label: 'Battery capacity' },
  heaterDrawW: { min: 0, max: 500, unit: 'W', label: 'Heater electrical draw' },
  startStateOfChargePercent: { min: 0, max: 100, unit: '%', label: 'Starting battery charge' },
} as const;

type LimitKey = keyof typeof PREHEAT_LIMITS;

/** The message for a field outside its range, e.g. "Outside temperature must be between −40 °C and 30 °C". */
export function preheatRangeMessage(key: LimitKey): string {
  const l: { min: number; max: number; unit: string; label: string; minExclusive?: boolean } = PREHEAT_LIMITS[key];
  const u = l.unit ? ` ${l.unit}` : '';
  return l.minExclusive
    ? `${l.label} must be greater than ${show(l.min)}${u} and at most ${show(l.max)}${u}`
    : `${l.label} must be between ${show(l.min)}${u} and ${show(l.max)}${u}`;
}

function ranged(key: LimitKey) {
  const l: { min: number; max: number; minExclusive?: boolean } = PREHEAT_LIMITS[key];
  const error = preheatRangeMessage(key);
  const base = z.number({ error });
  return (l.minExclusive ? base.gt(l.min, { error }) : base.min(l.min, { error })).max(l.max, { error });
}

const DEPARTURE_MESSAGE = 'Departure must be a date and time with a UTC offset, e.g. 2026-01-15T07:30:00+01:00';

export const PreheatDepartureSchema = z.union(
  [z.iso.datetime({ offset: true, error: DEPARTURE_MESSAGE }), z.date({ error: DEPARTURE_MESSAGE })],
  { error: DEPARTURE_MESSAGE },
);

export const PreheatInputSchema = z
  .object({
    outsideTemperatureC: ranged('outsideTemperatureC'),
    targetCoolantTemperatureC: ranged('targetCoolantTemperatureC'),
    departure: PreheatDepartureSchema,
    heaterOutputKw: ranged('heaterOutputKw'),
    combustionEfficiency: ranged('combustionEfficiency'),
    fuel: z.enum(HEATER_FUELS, { error: 'Fuel must be diesel or petrol' }),
    engineMassKg: ranged('engineMassKg').describe('Effective mass of the engine metal warmed by the coolant'),
    engineMaterial: z.enum(ENGINE_MATERIALS, { error: 'Engine material must be cast iron, aluminium or steel' }),
    coolantVolumeL: ranged('coolantVolumeL'),
    coolantMixture: z.enum(COOLANT_MIXTURES, { error: 'Coolant must be water or 50 % ethylene glycol' }),
    cabinVolumeM3: ranged('cabinVolumeM3'),
    interiorHeatCapacityKjPerK: ranged('interiorHeatCapacityKjPerK').describe(
      'Effective heat capacity of seats, trim, glass and inner panels that warm with the cabin air',
    ),
    engineLossWPerK: ranged('engineLossWPerK').describe('UA from engine and coolant to the outside'),
    heaterMatrixWPerK: ranged('heaterMatrixWPerK').describe('UA from coolant to cabin air through heater matrix and blower'),
    cabinLossWPerK: ranged('cabinLossWPerK').describe('UA from the cabin to the outside'),
    batteryCapacityAh: ranged('batteryCapacityAh'),
    batteryType: z.enum(BATTERY_TYPES, { error: 'Battery type must be flooded or AGM' }),
    systemVoltage: z.literal([12, 24], { error: 'System voltage must be 12 V or 24 V' }),
    heaterDrawW: ranged('heaterDrawW'),
    startStateOfChargePercent: ranged('startStateOfChargePercent').default(100),
  })
  .refine((v) => v.targetCoolantTemperatureC > v.outsideTemperatureC, {
    path: ['targetCoolantTemperatureC'],
    error: (issue) => {
      const input = issue.input as { outsideTemperatureC?: number } | undefined;
      const outside = input?.outsideTemperatureC;
      return `Target coolant temperature must be above the outside temperature${
        typeof outside === 'number' ? ` (${show(outside)} °C)` : ''
      } and at most ${show(PREHEAT_LIMITS.targetCoolantTemperatureC.max)} °C`;
    },
    // Compare only when both temperatures are valid numbers, even if other fields failed.
    when: (payload) =>
      !payload.issues.some((i) => i.path?.[0] === 'outsideTemperatureC' || i.path?.[0] === 'targetCoolantTemperatureC') &&
      typeof (payload.value as { outsideTemperatureC?: unknown }).outsideTemperatureC === 'number' &&
      typeof (payload.value as { targetCoolantTemperatureC?: unknown }).targetCoolantTemperatureC === 'number',
  });

/** Validated input (defaults applied). */
export type PreheatInput = z.output<typeof PreheatInputSchema>;
/** Input as a form or request sends it (starting charge optional). */
export type PreheatInputDraft = z.input<typeof PreheatInputSchema>;
