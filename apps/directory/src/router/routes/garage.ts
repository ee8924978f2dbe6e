// The owner's garage: saved vehicles, signed-in owners only.
import type { RouteRecordRaw } from 'vue-router';

export const garageRoutes: RouteRecordRaw[] = [
  { path: '/garage', name: 'garage', component: () => import('@/views/garage/index.vue'), meta: { title: 'garage.metaTitle', roles: ['owner'] } },
];
