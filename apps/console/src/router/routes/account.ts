// The signed-in user's own pages, and where the guard sends someone a page is not for.
import type { RouteRecordRaw } from 'vue-router';
import { ROLES } from '@emberline/domain';

export const accountRoutes: RouteRecordRaw[] = [
  { path: 'account', name: 'account', component: () => import('@/views/account/index.vue'), meta: { title: 'accountPage.metaTitle', roles: [...ROLES] } },
  { path: 'no-access', name: 'no-access', component: () => import('@/views/no-access/index.vue'), meta: { title: 'noAccess.metaTitle' } },
];
