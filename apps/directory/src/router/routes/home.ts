import type { RouteRecordRaw } from 'vue-router';

export const homeRoutes: RouteRecordRaw[] = [
  { path: '/', name: 'home', component: () => import('@/views/home/index.vue'), meta: { title: 'home.metaTitle' } },
];
