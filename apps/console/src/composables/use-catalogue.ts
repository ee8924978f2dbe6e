// The platform catalogue for tables: service types, capabilities and a code -> name lookup.
import type { Capability, ServiceType } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';

export interface Catalogue {
  serviceTypes: ServiceType[];
  capabilities: Capability[];
  capabilityNames: Record<string, string>;
}

export function useCatalogue() {
  return useAsyncData<Catalogue>(async (signal) => {
    const [serviceTypes, capabilities] = await Promise.all([listServiceTypes(signal), listCapabilities(signal)]);
    return { serviceTypes, capabilities, capabilityNames: Object.fromEntries(capabilities.map((c) => [c.code, c.name])) };
  });
}
