// Garage handlers for the signed-in owner.
import type { VehicleInput } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as garage from '../services/vehicle.service';

export function vehicleController({ dataSource }: AppContext) {
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  return {
    list: async ({ actor }: { actor: Actor }) => ({ data: await garage.listVehicles(read(actor)) }),
    add: async ({ body, actor }: { body: VehicleInput; actor: Actor }) => ({
      data: await dataSource.transaction((manager) => garage.addVehicle({ manager, actor }, body)),
    }),
    update: async ({ params, body, actor }: { params: { vehicleId: string }; body: Partial<VehicleInput>; actor: Actor }) => ({
      data: await dataSource.transaction((manager) => garage.updateVehicle({ manager, actor }, params.vehicleId, body)),
    }),
    remove: async ({ params, actor }: { params: { vehicleId: string }; actor: Actor }) => {
      await dataSource.transaction((manager) => garage.removeVehicle({ manager, actor }, params.vehicleId));
      return { data: { removed: true as const } };
    },
  };
}
