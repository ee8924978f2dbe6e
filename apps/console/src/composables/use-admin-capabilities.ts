// Every capability, retired ones included, for network admins who edit the catalogue.
import type { Capability } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listAllCapabilities } from '@/api/onboarding';

export function useAdminCapabilities() {
  return useAsyncData<Capability[]>((signal) => listAllCapabilities(signal));
}
