// Typed route meta: every route names its title (an i18n key) and who may open it.
import type { Role } from '@emberline/domain';

export type { Role };

declare module 'vue-router' {
  interface RouteMeta {
    /** i18n key of the page title. */
    title: string;
    /** Roles allowed to open the page; undefined means public. */
    roles?: Role[];
    /** Pages for signed-out visitors (sign-in, sign-up): signed-in users go on to their page. */
    guestOnly?: boolean;
  }
}
