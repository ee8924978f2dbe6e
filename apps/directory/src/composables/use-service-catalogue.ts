// Bookable service types with the names of the equipment each one needs.
import type { ServiceType } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';

export interface ServiceCatalogue {
  serviceTypes: ServiceType[];
  /** Capability code -> display name. */
  capabilityNames: Record<string, string>;
}

export function useServiceCatalogue() {
  return useAsyncData<ServiceCatalogue>(async (signal) => {
    const [serviceTypes, capabilities] = await Promise.all([listServiceTypes(signal), listCapabilities(signal)]);
    return {
      serviceTypes: serviceTypes.filter((s) => !s.retired),
      capabilityNames: Object.fromEntries(capabilities.map((c) => [c.code, c.name])),
    };
  });
}

/** Service types only, for pickers. */
export function useServiceTypes() {
  return useAsyncData<ServiceType[]>(async (signal) => (await listServiceTypes(signal)).filter((s) => !s.retired));
}
