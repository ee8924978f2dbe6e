// Network admin pages. The catalogue is public (read-only) until accounts arrive.
import type { RouteRecordRaw } from 'vue-router';

const comingSoon = () => import('@/views/coming-soon/index.vue');

export const adminRoutes: RouteRecordRaw[] = [
  { path: 'admin/applications', name: 'applications', component: comingSoon, meta: { title: 'nav.applications', roles: ['network_admin'], comingWith: 'issues.onboarding' } },
  { path: 'admin/catalogue', name: 'catalogue', component: () => import('@/views/catalogue/index.vue'), meta: { title: 'nav.catalogue' } },
  { path: 'admin/mail-log', name: 'mail-log', component: () => import('@/views/admin/mail-log/index.vue'), meta: { title: 'nav.mailLog', roles: ['network_admin'] } },
  { path: 'admin/payouts', name: 'payouts', component: comingSoon, meta: { title: 'nav.payouts', roles: ['network_admin'], comingWith: 'issues.payouts' } },
  { path: 'admin/coverage-gaps', name: 'coverage-gaps', component: comingSoon, meta: { title: 'nav.coverageGaps', roles: ['network_admin'], comingWith: 'issues.search' } },
];
