// Demo vehicles for the pre-heat planner (invented models); every value can be changed in the form.
import type { PreheatInput } from '../schemas/preheat';

/** Everything the planner needs except the day's weather and departure. */
export type PreheatVehicleValues = Omit<PreheatInput, 'outsideTemperatureC' | 'departure'>;

export interface PreheatPreset {
  id: string;
  name: string;
  kind: 'panel-van' | 'motorhome';
  description: string;
  values: PreheatVehicleValues;
  /** Why each default has its value; shown as help text next to the field. */
  notes: Partial<Record<keyof PreheatVehicleValues, string>>;
}

/**
 * Panel van with a 5 kW coolant heater. The defaults are engineering estimates (common
 * practice, no source) chosen from the physics, not fitted to the warm-up time:
 * - engine 100 kg of cast iron: a 2-litre class diesel weighs about 180–220 kg dressed; the
 *   block and head around the coolant jacket are about half of that, and the crankshaft,
 *   sump oil and ancillaries barely warm within half an hour;
 * - engine loss 20 W/K: about 1.8 m² of engine surface at 8–12 W/(m²·K) (still-air convection
 *   plus radiation in a closed engine bay), thermostat closed so the radiator is out of circuit;
 * - heater matrix 40 W/K: blower on a low step moves about 0.05 kg/s of recirculated air through
 *   a matrix of effectiveness about 0.7–0.8, UA ≈ ε·ṁ·cp ≈ 35–40 W/K;
 * - cabin loss 45 W/K: about 4 m² of single glazing at about 5.5 W/(m²·K) plus about 8 m² of
 *   uninsulated steel and bulkhead at about 3 W/(m²·K), plus a little air leakage;
 * - interior 40 kJ/K: roughly 40 kg of seats, dashboard, trim, glass and inner panels
 *   (c ≈ 1 kJ/(kg·K)) whose surfaces follow the cabin air; deeper material lags and is left out.
 */
export const PANEL_VAN_PRESET: PreheatPreset = {
  id: 'korvan-cargo-4',
  name: 'Korvan Cargo 4',
  kind: 'panel-van',
  description: 'Panel van, 2-litre class diesel, 5 kW coolant heater, cab with bulkhead',
  values: {
    targetCoolantTemperatureC: 60,
    heaterOutputKw: 5,
    combustionEfficiency: 0.85,
    fuel: 'diesel',
    engineMassKg: 100,
    engineMaterial: 'cast-iron',
    coolantVolumeL: 9,
    coolantMixture: 'ethylene-glycol-50',
    cabinVolumeM3: 4.5,
    interiorHeatCapacityKjPerK: 40,
    engineLossWPerK: 20,
    heaterMatrixWPerK: 40,
    cabinLossWPerK: 45,
    batteryCapacityAh: 95,
    batteryType: 'agm',
    systemVoltage: 12,
    heaterDrawW: 80,
    startStateOfChargePercent: 100,
  },
  notes: {
    targetCoolantTemperatureC: 'At about 60 °C coolant the blower gives properly warm air.',
    engineMassKg: 'Metal around the coolant jacket that warms within half an hour, not the whole engine.',
    engineLossWPerK: 'Engine surface to the cold engine bay, thermostat closed.',
    heaterMatrixWPerK: 'Heater matrix with the blower on a low step, recirculated air.',
    cabinLossWPerK: 'Single-glazed cab, uninsulated steel and bulkhead.',
    interiorHeatCapacityKjPerK: 'Seats, dashboard, trim and glass that warm along with the air.',
    heaterDrawW: 'Heater (fan, fuel pump, pump) plus the vehicle blower on a low step.',
  },
};

/**
 * Motorhome on a heavier chassis: bigger engine and coolant circuit, larger heated space
 * (cab open to the front of the living area). Defaults reasoned as for the van: loss 24 W/K
 * for the larger engine; matrix 45 W/K; cabin 60 W/K (insulated walls but much larger area and
 * a single-glazed cab); interior 90 kJ/K for the cab plus front seating and furniture.
 */
export const MOTORHOME_PRESET: PreheatPreset = {
  id: 'maren-camper-2',
  name: 'Maren Camper 2',
  kind: 'motorhome',
  description: 'Motorhome, 2.3-litre class diesel, 5 kW coolant heater, cab open to the living area',
  values: {
    targetCoolantTemperatureC: 60,
    heaterOutputKw: 5,
    combustionEfficiency: 0.85,
    fuel: 'diesel',
    engineMassKg: 130,
    engineMaterial: 'cast-iron',
    coolantVolumeL: 11,
    coolantMixture: 'ethylene-glycol-50',
    cabinVolumeM3: 10,
    interiorHeatCapacityKjPerK: 90,
    engineLossWPerK: 24,
    heaterMatrixWPerK: 45,
    cabinLossWPerK: 60,
    batteryCapacityAh: 100,
    batteryType: 'flooded',
    systemVoltage: 12,
    heaterDrawW: 90,
    startStateOfChargePercent: 100,
  },
  notes: {
    cabinVolumeM3: 'Cab plus the front of the living area that shares its air.',
    cabinLossWPerK: 'Insulated body but a large surface and a single-glazed cab.',
  },
};

export const PREHEAT_PRESETS: readonly PreheatPreset[] = [PANEL_VAN_PRESET, MOTORHOME_PRESET];
