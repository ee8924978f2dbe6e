// Bookable service types with the names of the equipment each one needs.
import type { ServiceType } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listCapabilities } from '@/api/catalogue';
import { useCatalogueStore } from '@/stores/catalogue';

export interface ServiceCatalogue {
  serviceTypes: ServiceType[];
  /** Capability code -> display name. */
  capabilityNames: Record<string, string>;
}

export function useServiceCatalogue() {
  const catalogue = useCatalogueStore();
  return useAsyncData<ServiceCatalogue>(async (signal) => {
    const [serviceTypes, capabilities] = await Promise.all([catalogue.bookableServiceTypes(), listCapabilities(signal)]);
    return {
      serviceTypes,
      capabilityNames: Object.fromEntries(capabilities.map((c) => [c.code, c.name])),
    };
  });
}

/** Service types only, for pickers. */
export function useServiceTypes() {
  const catalogue = useCatalogueStore();
  return useAsyncData<ServiceType[]>(() => catalogue.bookableServiceTypes());
}
