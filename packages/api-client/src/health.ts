// Service health, as shown on status pages and used by the start script.
import { HealthResponseSchema, type Health } from '@emberline/domain';
import type { HttpClient } from './http';

export async function getHealth(http: HttpClient, signal?: AbortSignal): Promise<Health> {
  return (await http.request('GET', '/api/health', { schema: HealthResponseSchema, signal })).data;
}
