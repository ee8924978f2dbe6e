// The owner's garage: vehicles under /api/me/vehicles, with the signed-in owner's token.
import * as client from '@emberline/api-client';
import type { Vehicle, VehicleInput } from '@emberline/domain';
import { http } from './http';

export function listVehicles(signal?: AbortSignal): Promise<Vehicle[]> {
  return client.listVehicles(http, signal);
}

export function addVehicle(body: VehicleInput): Promise<Vehicle> {
  return client.addVehicle(http, body);
}

export function updateVehicle(vehicleId: string, body: client.VehiclePatch): Promise<Vehicle> {
  return client.updateVehicle(http, vehicleId, body);
}

export function removeVehicle(vehicleId: string): Promise<void> {
  return client.removeVehicle(http, vehicleId);
}
