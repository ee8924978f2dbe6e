// The one guard: the session is restored once before the first navigation; routes with
// meta.roles need a signed-in user holding one of them; signed-in users skip the guest pages.
import type { RouteLocationRaw, Router } from 'vue-router';
import { watch } from 'vue';
import { isSafeReturnPath } from '@emberline/domain';
import { useSessionStore } from '@/stores/session';

/** A redirect target from the query, only if it is a path inside this app (the rule the API checks too). */
export function safeRedirect(value: unknown): string | null {
  return isSafeReturnPath(value) ? value : null;
}

/** The query that carries a safe return address on to the next account page (none when unsafe). */
export function returnQuery(value: unknown): { redirect?: string } {
  const target = safeRedirect(value);
  return target ? { redirect: target } : {};
}

function homeOf(session: ReturnType<typeof useSessionStore>): RouteLocationRaw {
  return session.hasAnyRole(['owner']) ? { name: 'account' } : { name: 'home' };
}

export function installGuards(router: Router, translate: (key: string) => string, appName: string): void {
  router.beforeEach(async (to) => {
    const session = useSessionStore();
    await session.restore();
    if (to.meta.guestOnly && session.isSignedIn) return safeRedirect(to.query.redirect) ?? homeOf(session);
    const roles = to.meta.roles;
    if (!roles?.length) return true;
    if (session.hasAnyRole(roles)) return true;
    // Signed in without the role: sending them to sign-in would loop, so home it is.
    if (session.isSignedIn) return { name: 'home' };
    return { name: 'sign-in', query: { redirect: to.fullPath } };
  });
  router.afterEach((to) => {
    if (typeof document !== 'undefined') document.title = `${translate(to.meta.title)} · ${appName}`;
  });
  router.isReady().then(
    () => {
      // When the session ends (sign-out, expired refresh) on a protected page, leave it.
      watch(
        () => useSessionStore().isSignedIn,
        (signedIn) => {
          const current = router.currentRoute.value;
          if (!signedIn && current.meta.roles?.length) void router.replace({ name: 'sign-in', query: { redirect: current.fullPath } });
        },
      );
    },
    () => undefined,
  );
}
