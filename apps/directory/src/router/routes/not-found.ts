import type { RouteRecordRaw } from 'vue-router';

export const notFoundRoutes: RouteRecordRaw[] = [
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/not-found/index.vue'), meta: { title: 'notFound.metaTitle' } },
];
