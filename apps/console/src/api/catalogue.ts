// Platform catalogue calls: service types and the capabilities they require.
import * as client from '@emberline/api-client';
import type { Capability, ServiceType } from '@emberline/domain';
import { http } from './http';

export function listServiceTypes(signal?: AbortSignal): Promise<ServiceType[]> {
  return client.listServiceTypes(http, signal);
}

export function listCapabilities(signal?: AbortSignal): Promise<Capability[]> {
  return client.listCapabilities(http, signal);
}
