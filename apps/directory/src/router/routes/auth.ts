import type { RouteRecordRaw } from 'vue-router';

export const authRoutes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/sign-in/index.vue'), meta: { title: 'signIn.metaTitle' } },
];
