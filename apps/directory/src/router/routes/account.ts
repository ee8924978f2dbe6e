import type { RouteRecordRaw } from 'vue-router';

export const accountRoutes: RouteRecordRaw[] = [
  { path: '/account', name: 'account', component: () => import('@/views/account/index.vue'), meta: { title: 'accountPage.metaTitle', roles: ['owner'] } },
];
