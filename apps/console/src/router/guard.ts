// The one guard: the session is restored once before the first navigation; routes with
// meta.roles need a signed-in user holding one of them (everyone else signs in and comes back);
// signed-in users skip the guest pages.
import { watch } from 'vue';
import type { Router } from 'vue-router';
import { useSessionStore } from '@/stores/session';

/** A redirect target from the query, only if it is a path inside this app. */
export function safeRedirect(value: unknown): string | null {
  return typeof value === 'string' && value.startsWith('/') && !value.startsWith('//') ? value : null;
}

export function installGuards(router: Router, translate: (key: string) => string, appName: string): void {
  router.beforeEach(async (to) => {
    const session = useSessionStore();
    await session.restore();
    if (to.meta.guestOnly && session.isSignedIn) return safeRedirect(to.query.redirect) ?? { name: 'dashboard' };
    const roles = to.meta.roles;
    if (!roles?.length) return true;
    if (session.hasAnyRole(roles)) return true;
    // Signed in without the role: sending them to sign-in would loop.
    if (session.isSignedIn) return { name: 'no-access', query: { page: to.name === undefined ? undefined : String(to.name) } };
    return { name: 'sign-in', query: { redirect: to.fullPath } };
  });
  router.afterEach((to) => {
    if (typeof document !== 'undefined') document.title = `${translate(to.meta.title)} · ${appName}`;
  });
  router.isReady().then(
    () => {
      // When the session ends (sign-out, expired refresh) or the role goes with an organisation
      // switch, leave pages that need it.
      const session = useSessionStore();
      watch(
        () => session.roles,
        () => {
          const current = router.currentRoute.value;
          const roles = current.meta.roles;
          if (!roles?.length || session.hasAnyRole(roles)) return;
          void router.replace(
            session.isSignedIn ? { name: 'no-access', query: { page: String(current.name ?? '') } } : { name: 'sign-in', query: { redirect: current.fullPath } },
          );
        },
      );
    },
    () => undefined,
  );
}
