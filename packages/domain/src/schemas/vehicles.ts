// A vehicle in an owner's garage: what the search, the booking flow and the pre-heat planner
// need to know about it.
import { z } from 'zod';
import { BATTERY_TYPES } from '../heater/battery';
import { HEATER_FUELS } from '../heater/fuels';

export const FACTORY_HEATERS = ['none', 'coolant_auxiliary', 'coolant_parking', 'air'] as const;
export const FactoryHeaterSchema = z.enum(FACTORY_HEATERS, { error: 'Choose which heater the vehicle came with' });
export type FactoryHeater = z.infer<typeof FactoryHeaterSchema>;

export const CLIMATE_CONTROLS = ['automatic', 'manual'] as const;
export const ClimateControlSchema = z.enum(CLIMATE_CONTROLS, { error: 'Choose automatic or manual climate control' });

export const VEHICLE_LIMITS = {
  year: { min: 1980, max: new Date().getUTCFullYear() + 1 },
  batteryCapacityAh: { min: 10, max: 1000 },
} as const;

export const VehicleInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the vehicle a name, e.g. "Our camper"').max(80, 'Use at most 80 characters'),
  model: z.string().trim().min(1, 'Enter the model').max(120, 'Use at most 120 characters'),
  year: z
    .number({ error: 'Enter the year of manufacture' })
    .int('Enter a whole year')
    .min(VEHICLE_LIMITS.year.min, `The year must be between ${VEHICLE_LIMITS.year.min} and ${VEHICLE_LIMITS.year.max}`)
    .max(VEHICLE_LIMITS.year.max, `The year must be between ${VEHICLE_LIMITS.year.min} and ${VEHICLE_LIMITS.year.max}`),
  fuel: z.enum(HEATER_FUELS, { error: 'Fuel must be diesel or petrol' }),
  factoryHeater: FactoryHeaterSchema,
  climateControl: ClimateControlSchema,
  electricalSystemV: z.literal([12, 24], { error: 'The electrical system must be 12 V or 24 V' }),
  batteryCapacityAh: z
    .number({ error: 'Enter the battery capacity in Ah' })
    .min(VEHICLE_LIMITS.batteryCapacityAh.min, `Battery capacity must be between ${VEHICLE_LIMITS.batteryCapacityAh.min} and ${VEHICLE_LIMITS.batteryCapacityAh.max} Ah`)
    .max(VEHICLE_LIMITS.batteryCapacityAh.max, `Battery capacity must be between ${VEHICLE_LIMITS.batteryCapacityAh.min} and ${VEHICLE_LIMITS.batteryCapacityAh.max} Ah`),
  batteryType: z.enum(BATTERY_TYPES, { error: 'Battery type must be flooded or AGM' }),
});
export type VehicleInput = z.infer<typeof VehicleInputSchema>;

export const VehiclePatchSchema = VehicleInputSchema.partial();

export const VehicleSchema = VehicleInputSchema.extend({ id: z.uuid(), createdAt: z.string(), updatedAt: z.string() });
export type Vehicle = z.infer<typeof VehicleSchema>;
export const VehicleResponseSchema = z.object({ data: VehicleSchema });
export const VehicleListSchema = z.object({ data: z.array(VehicleSchema) });

/** An owner keeps at most this many vehicles. */
export const MAX_VEHICLES = 20;
