// Network admin pages: the application queue and review, the catalogue, logs.
import type { RouteRecordRaw } from 'vue-router';

const comingSoon = () => import('@/views/coming-soon/index.vue');

export const adminRoutes: RouteRecordRaw[] = [
  { path: 'admin/applications', name: 'applications', component: () => import('@/views/admin/applications/index.vue'), meta: { title: 'applications.metaTitle', roles: ['network_admin'] } },
  {
    path: 'admin/applications/:orgId',
    name: 'application-review',
    component: () => import('@/views/admin/application-review/index.vue'),
    props: true,
    meta: { title: 'review.metaTitle', roles: ['network_admin'] },
  },
  // Open to everyone read-only; network admins also edit the capabilities here.
  { path: 'admin/catalogue', name: 'catalogue', component: () => import('@/views/catalogue/index.vue'), meta: { title: 'nav.catalogue' } },
  { path: 'admin/mail-log', name: 'mail-log', component: () => import('@/views/admin/mail-log/index.vue'), meta: { title: 'nav.mailLog', roles: ['network_admin'] } },
  { path: 'admin/payouts', name: 'payouts', component: comingSoon, meta: { title: 'nav.payouts', roles: ['network_admin'], comingWith: 'issues.payouts' } },
  { path: 'admin/coverage-gaps', name: 'coverage-gaps', component: () => import('@/views/admin/coverage-gaps/index.vue'), meta: { title: 'nav.coverageGaps', roles: ['network_admin'] } },
];
