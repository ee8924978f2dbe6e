// Typed route meta: title (i18n key), who may open the page, and for pages not built yet
// the issue that brings them (i18n key).
import type { Role } from '@emberline/domain';

export type { Role };

declare module 'vue-router' {
  interface RouteMeta {
    title: string;
    roles?: Role[];
    comingWith?: string;
    /** Pages for signed-out visitors (sign-in, join): signed-in users go on to the dashboard. */
    guestOnly?: boolean;
  }
}
