// The owner's garage: list, add, change and remove vehicles under /api/me/vehicles.
import { z } from 'zod';
import {
  VehicleInputSchema,
  VehicleListSchema,
  VehiclePatchSchema,
  VehicleResponseSchema,
  type Vehicle,
  type VehicleInput,
} from '@emberline/domain';
import type { HttpClient } from './http';

const RemovedResponseSchema = z.object({ data: z.object({ removed: z.literal(true) }) });
export type VehiclePatch = z.input<typeof VehiclePatchSchema>;

const seg = encodeURIComponent;

export async function listVehicles(http: HttpClient, signal?: AbortSignal): Promise<Vehicle[]> {
  return (await http.request('GET', '/api/me/vehicles', { schema: VehicleListSchema, signal })).data;
}

/** Validates with the schema the API uses, so a bad vehicle never leaves the client. */
export async function addVehicle(http: HttpClient, body: VehicleInput): Promise<Vehicle> {
  const input = VehicleInputSchema.parse(body);
  return (await http.request('POST', '/api/me/vehicles', { body: input, schema: VehicleResponseSchema })).data;
}

export async function updateVehicle(http: HttpClient, vehicleId: string, body: VehiclePatch): Promise<Vehicle> {
  const patch = VehiclePatchSchema.parse(body);
  return (await http.request('PATCH', `/api/me/vehicles/${seg(vehicleId)}`, { body: patch, schema: VehicleResponseSchema })).data;
}

export async function removeVehicle(http: HttpClient, vehicleId: string): Promise<void> {
  await http.request('DELETE', `/api/me/vehicles/${seg(vehicleId)}`, { schema: RemovedResponseSchema });
}
