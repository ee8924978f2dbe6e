// Platform catalogue: service types and capabilities.
import { CapabilityListSchema, ServiceTypeListSchema, type Capability, type ServiceType } from '@emberline/domain';
import type { HttpClient } from './http';

export async function listServiceTypes(http: HttpClient, signal?: AbortSignal): Promise<ServiceType[]> {
  return (await http.request('GET', '/api/catalogue/service-types', { schema: ServiceTypeListSchema, signal })).data;
}

export async function listCapabilities(http: HttpClient, signal?: AbortSignal): Promise<Capability[]> {
  return (await http.request('GET', '/api/catalogue/capabilities', { schema: CapabilityListSchema, signal })).data;
}
