// Thermophysical values the pre-heat planner uses, each with its source.
//
// Values are kept in the units their sources print (kJ/kg·K, kg/m³) and converted at the
// point of use, so a reader can hold each constant against its table directly.

export const ENGINE_MATERIALS = ['cast-iron', 'aluminium', 'steel'] as const;
export type EngineMaterial = (typeof ENGINE_MATERIALS)[number];

export const COOLANT_MIXTURES = ['water', 'ethylene-glycol-50'] as const;
export type CoolantMixture = (typeof COOLANT_MIXTURES)[number];

export interface SourcedValue {
  value: number;
  unit: string;
  source: string;
}

/** Specific heat of engine metals, kJ/(kg·K), near room temperature. */
export const ENGINE_MATERIAL_SPECIFIC_HEAT: Readonly<Record<EngineMaterial, SourcedValue>> = {
  'cast-iron': { value: 0.46, unit: 'kJ/(kg·K)', source: 'engineering handbooks (cast iron)' },
  aluminium: { value: 0.903, unit: 'kJ/(kg·K)', source: 'Incropera, Table A.1, pure aluminium at 300 K' },
  steel: { value: 0.49, unit: 'kJ/(kg·K)', source: 'engineering handbooks (carbon steel)' },
};

/** Water, 20 °C: cp 4.182 kJ/(kg·K) (Incropera, Table A.6). */
export const WATER_SPECIFIC_HEAT: SourcedValue = {
  value: 4.182,
  unit: 'kJ/(kg·K)',
  source: 'Incropera, Table A.6, saturated water at about 20 °C',
};

/**
 * 50 % ethylene glycol / water, cp against temperature (°C → kJ/(kg·K)).
 * Conde (2011) correlation; ASHRAE Fundamentals ch. 31 gives similar values.
 */
export const ETHYLENE_GLYCOL_50_SPECIFIC_HEAT: ReadonlyArray<{ temperatureC: number; value: number }> = [
  { temperatureC: -15, value: 3.18 },
  { temperatureC: 0, value: 3.24 },
  { temperatureC: 20, value: 3.32 },
  { temperatureC: 80, value: 3.56 },
];
export const ETHYLENE_GLYCOL_50_SOURCE = 'Conde (2011) correlation; ASHRAE Fundamentals ch. 31 similar';

/**
 * Coolant densities at 20 °C, kg/m³. Coolant is measured by volume when the system is
 * filled (near room temperature), so mass = fill volume × density at 20 °C is the right
 * mass whatever temperature the coolant later reaches.
 * Both values are from memory (water: Incropera Table A.6 gives about 998 kg/m³;
 * 50 % glycol mixture: about 1.07 kg/L in handbook tables).
 */
export const COOLANT_DENSITY_20C: Readonly<Record<CoolantMixture, SourcedValue>> = {
  water: { value: 998, unit: 'kg/m³', source: 'from memory: Incropera, Table A.6, water at 20 °C' },
  'ethylene-glycol-50': { value: 1070, unit: 'kg/m³', source: 'from memory: handbook value for 50 % glycol/water at 20 °C' },
};

/** Air cp, kJ/(kg·K) (Çengel). */
export const AIR_SPECIFIC_HEAT: SourcedValue = { value: 1.006, unit: 'kJ/(kg·K)', source: 'Çengel, Table A-15' };

/**
 * Specific gas constant of dry air, J/(kg·K): the molar gas constant 8.314 462 618 J/(mol·K)
 * (exact since 2019) over a molar mass of 28.9647 g/mol (from memory, standard atmosphere).
 * With 101 325 Pa it reproduces Çengel's 1.292 kg/m³ at 0 °C and 1.367 kg/m³ at −15 °C.
 */
export const AIR_GAS_CONSTANT_J_PER_KG_K = 8.314462618 / 0.0289647;
export const STANDARD_PRESSURE_PA = 101_325;
const KELVIN_OFFSET = 273.15;

/** Air density from the ideal-gas law at standard sea-level pressure, kg/m³. */
export function airDensityKgPerM3(temperatureC: number, pressurePa: number = STANDARD_PRESSURE_PA): number {
  const kelvin = temperatureC + KELVIN_OFFSET;
  if (!(kelvin > 0)) throw new RangeError(`Temperature ${temperatureC} °C is below absolute zero`);
  return pressurePa / (AIR_GAS_CONSTANT_J_PER_KG_K * kelvin);
}

/** Linear interpolation in a table sorted by x, clamped to the end points. */
export function interpolateClamped(points: ReadonlyArray<{ x: number; y: number }>, x: number): number {
  const first = points[0];
  const last = points[points.length - 1];
  if (!first || !last) throw new RangeError('Empty interpolation table');
  if (x <= first.x) return first.y;
  if (x >= last.x) return last.y;
  for (let i = 1; i < points.length; i++) {
    const hi = points[i]!;
    const lo = points[i - 1]!;
    if (x <= hi.x) return lo.y + ((hi.y - lo.y) * (x - lo.x)) / (hi.x - lo.x);
  }
  return last.y;
}

/**
 * Coolant cp in kJ/(kg·K) at a temperature. Glycol mixture: linear interpolation between
 * Conde's points, held constant beyond −15 °C and 80 °C. Water: the 20 °C value; water's cp
 * changes by under 1 % between 0 and 90 °C, so one value is enough.
 */
export function coolantSpecificHeat(mixture: CoolantMixture, temperatureC: number): number {
  if (mixture === 'water') return WATER_SPECIFIC_HEAT.value;
  return interpolateClamped(
    ETHYLENE_GLYCOL_50_SPECIFIC_HEAT.map((p) => ({ x: p.temperatureC, y: p.value })),
    temperatureC,
  );
}
