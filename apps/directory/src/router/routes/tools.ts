// Owner tools that need no sign-in: the pre-heat planner.
import type { RouteRecordRaw } from 'vue-router';

export const toolsRoutes: RouteRecordRaw[] = [
  { path: '/tools/pre-heat', name: 'pre-heat', component: () => import('@/views/planner/index.vue'), meta: { title: 'planner.metaTitle' } },
];
