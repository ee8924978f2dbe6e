// The one guard: routes with meta.roles need a signed-in user holding one of them;
// everyone else goes to sign-in and comes back afterwards.
import type { Router } from 'vue-router';
import { useSessionStore } from '@/stores/session';

export function installGuards(router: Router, translate: (key: string) => string, appName: string): void {
  router.beforeEach((to) => {
    const roles = to.meta.roles;
    if (!roles?.length) return true;
    if (useSessionStore().hasAnyRole(roles)) return true;
    return { name: 'sign-in', query: { redirect: to.fullPath } };
  });
  router.afterEach((to) => {
    if (typeof document !== 'undefined') document.title = `${translate(to.meta.title)} · ${appName}`;
  });
}
