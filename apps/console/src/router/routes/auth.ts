import type { RouteRecordRaw } from 'vue-router';

export const authRoutes: RouteRecordRaw[] = [
  {
    path: '/sign-in',
    component: () => import('@/layouts/auth-layout.vue'),
    children: [{ path: '', name: 'sign-in', component: () => import('@/views/sign-in/index.vue'), meta: { title: 'signIn.metaTitle' } }],
  },
];
