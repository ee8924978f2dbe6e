// The owner's garage under /me/vehicles.
import { z } from 'zod';
import { IdSchema, VehicleInputSchema, VehicleListSchema, VehiclePatchSchema, VehicleResponseSchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { vehicleController } from '../controllers/vehicle.controller';

export function registerVehicleRoutes(api: ApiRouter, app: AppContext): void {
  const c = vehicleController(app);
  const tags = ['Garage'];
  const params = z.object({ vehicleId: IdSchema });
  api.route({ method: 'get', path: '/me/vehicles', summary: "The signed-in owner's vehicles", tags, roles: ['owner'], response: VehicleListSchema }, c.list);
  api.route(
    { method: 'post', path: '/me/vehicles', summary: 'Add a vehicle to the garage', tags, roles: ['owner'], body: VehicleInputSchema, response: VehicleResponseSchema, status: 201, problems: [409] },
    c.add,
  );
  api.route(
    { method: 'patch', path: '/me/vehicles/:vehicleId', summary: 'Change a vehicle', tags, roles: ['owner'], params, body: VehiclePatchSchema, response: VehicleResponseSchema, problems: [404] },
    c.update,
  );
  api.route(
    { method: 'delete', path: '/me/vehicles/:vehicleId', summary: 'Remove a vehicle', tags, roles: ['owner'], params, response: z.object({ data: z.object({ removed: z.literal(true) }) }), problems: [404] },
    c.remove,
  );
}
