import type { RouteRecordRaw } from 'vue-router';

export const safetyRoutes: RouteRecordRaw[] = [
  { path: '/safety', name: 'safety', component: () => import('@/views/safety/index.vue'), meta: { title: 'safety.metaTitle' } },
];
