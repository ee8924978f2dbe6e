// The signed-in owner's vehicles as { data, loading, error, refresh }.
import type { Vehicle } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listVehicles } from '@/api/garage';

export function useGarage(options: { immediate?: boolean } = {}) {
  return useAsyncData<Vehicle[]>((signal) => listVehicles(signal), options);
}
