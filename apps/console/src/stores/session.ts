// Who is signed in and which organisation they act for, shared across pages. Placeholder until accounts arrive: nobody is.
import { computed, ref } from 'vue';
import { defineStore } from 'pinia';
import type { Role } from '@/router/types';

export interface SessionUser {
  id: string;
  displayName: string;
  roles: Role[];
}

export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null);
  const currentOrganisationId = ref<string | null>(null);
  const isSignedIn = computed(() => user.value !== null);

  function hasAnyRole(roles: readonly Role[]): boolean {
    return !!user.value && roles.some((r) => user.value!.roles.includes(r));
  }

  return { user, currentOrganisationId, isSignedIn, hasAnyRole };
});
