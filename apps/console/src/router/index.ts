// The Console's router: the sidebar layout around partner and admin pages, a plain
// layout for sign-in, one guard.
import { createRouter, createWebHistory, type RouteRecordRaw, type RouterHistory } from 'vue-router';
import './types';
import { appConfig } from '@/app-config';
import { i18n } from '@/locales';
import { installGuards } from './guard';
import { accountRoutes } from './routes/account';
import { adminRoutes } from './routes/admin';
import { authRoutes } from './routes/auth';
import { dashboardRoutes } from './routes/dashboard';
import { notFoundRoutes } from './routes/not-found';
import { partnerRoutes } from './routes/partner';

export const routes: RouteRecordRaw[] = [
  ...authRoutes,
  {
    path: '/',
    component: () => import('@/layouts/console-layout.vue'),
    children: [{ path: '', redirect: { name: 'dashboard' } }, ...dashboardRoutes, ...accountRoutes, ...partnerRoutes, ...adminRoutes, ...notFoundRoutes],
  },
];

export function createAppRouter(history: RouterHistory = createWebHistory(appConfig.base)) {
  const router = createRouter({ history, routes, scrollBehavior: () => ({ top: 0 }) });
  installGuards(router, (key) => i18n.global.t(key), appConfig.appName);
  return router;
}
