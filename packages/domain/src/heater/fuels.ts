// Fuel properties and fuel burnt by a fuel-fired heater, with sources.

export const HEATER_FUELS = ['diesel', 'petrol'] as const;
export type HeaterFuel = (typeof HEATER_FUELS)[number];

export interface FuelProperties {
  /** Lower (net) heating value, MJ/kg. */
  lowerHeatingValueMJPerKg: number;
  lowerHeatingValueSource: string;
  /** Representative density at 15 °C, kg/m³, chosen inside the standard's range. */
  densityKgPerM3: number;
  densityRangeKgPerM3: readonly [number, number];
  densitySource: string;
}

export const FUEL_PROPERTIES: Readonly<Record<HeaterFuel, FuelProperties>> = {
  diesel: {
    lowerHeatingValueMJPerKg: 43.0,
    lowerHeatingValueSource: 'IPCC 2006 Guidelines, Vol. 2, Table 1.2 (gas/diesel oil)',
    // 832 kg/m³ lies inside EN 590's 820–845 kg/m³ and is the value of the worked check.
    densityKgPerM3: 832,
    densityRangeKgPerM3: [820, 845],
    densitySource: 'EN 590 (820–845 kg/m³ at 15 °C); representative value inside the range',
  },
  petrol: {
    lowerHeatingValueMJPerKg: 44.3,
    lowerHeatingValueSource: 'IPCC 2006 Guidelines, Vol. 2, Table 1.2 (motor gasoline)',
    // Near the middle of EN 228's 720–775 kg/m³.
    densityKgPerM3: 745,
    densityRangeKgPerM3: [720, 775],
    densitySource: 'EN 228 (720–775 kg/m³ at 15 °C); representative value inside the range',
  },
};

export interface FuelAmount {
  kg: number;
  litres: number;
}

/**
 * Fuel burnt for a heat output over a duration: heat input = output ÷ efficiency, divided by
 * the lower heating value for mass and by the density for volume.
 */
export function fuelBurnt(heatOutputW: number, efficiency: number, fuel: HeaterFuel, durationSeconds: number): FuelAmount {
  if (!(heatOutputW >= 0)) throw new RangeError('Heat output must be zero or positive');
  if (!(efficiency > 0 && efficiency <= 1)) throw new RangeError('Efficiency must be in (0, 1]');
  if (!(durationSeconds >= 0)) throw new RangeError('Duration must be zero or positive');
  const props = FUEL_PROPERTIES[fuel];
  const heatInputJ = (heatOutputW / efficiency) * durationSeconds;
  const kg = heatInputJ / (props.lowerHeatingValueMJPerKg * 1e6);
  return { kg, litres: (kg / props.densityKgPerM3) * 1000 };
}

/** Fuel burnt per hour of running at full output. */
export function fuelPerHour(heatOutputW: number, efficiency: number, fuel: HeaterFuel): FuelAmount {
  return fuelBurnt(heatOutputW, efficiency, fuel, 3600);
}
