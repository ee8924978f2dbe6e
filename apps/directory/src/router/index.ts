// The Directory's router: route modules per feature, lazy views, one guard.
import { createRouter, createWebHistory, type RouterHistory } from 'vue-router';
import './types';
import { appConfig } from '@/app-config';
import { i18n } from '@/locales';
import { installGuards } from './guard';
import { accountRoutes } from './routes/account';
import { authRoutes } from './routes/auth';
import { ownerBookingRoutes } from './routes/bookings';
import { garageRoutes } from './routes/garage';
import { homeRoutes } from './routes/home';
import { notFoundRoutes } from './routes/not-found';
import { partnerRoutes } from './routes/partner';
import { safetyRoutes } from './routes/safety';
import { searchRoutes } from './routes/search';
import { toolsRoutes } from './routes/tools';

export const routes = [...homeRoutes, ...searchRoutes, ...partnerRoutes, ...ownerBookingRoutes, ...safetyRoutes, ...authRoutes, ...accountRoutes, ...toolsRoutes, ...garageRoutes, ...notFoundRoutes];

export function createAppRouter(history: RouterHistory = createWebHistory('/')) {
  const router = createRouter({
    history,
    routes,
    scrollBehavior(to, from, saved) {
      if (saved) return saved;
      // a new query on the same page (a filter, a sort) keeps the reader where they are
      if (to.path === from.path && !to.hash && from.matched.length) return false;
      if (to.hash) return { el: to.hash, top: 24, behavior: 'smooth' };
      return { top: 0 };
    },
  });
  installGuards(router, (key) => i18n.global.t(key), appConfig.appName);
  return router;
}
