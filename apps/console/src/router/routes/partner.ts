// Partner pages: the application, the team, and those not built yet (each says which issue brings it).
import type { RouteRecordRaw } from 'vue-router';

const comingSoon = () => import('@/views/coming-soon/index.vue');

export const partnerRoutes: RouteRecordRaw[] = [
  // Partner admins edit; technicians see it read-only.
  { path: 'application', name: 'application', component: () => import('@/views/application/index.vue'), meta: { title: 'application.metaTitle', roles: ['partner_admin', 'technician'] } },
  { path: 'bookings', name: 'bookings', component: comingSoon, meta: { title: 'nav.bookings', roles: ['technician', 'partner_admin'], comingWith: 'issues.booking' } },
  { path: 'job-sheets', name: 'job-sheets', component: comingSoon, meta: { title: 'nav.jobSheets', roles: ['technician', 'partner_admin'], comingWith: 'issues.jobSheets' } },
  { path: 'services', name: 'services-prices', component: comingSoon, meta: { title: 'nav.servicesPrices', roles: ['partner_admin'], comingWith: 'issues.offers' } },
  { path: 'team', name: 'team', component: () => import('@/views/team/index.vue'), meta: { title: 'nav.team', roles: ['partner_admin', 'technician'] } },
  { path: 'statements', name: 'statements', component: comingSoon, meta: { title: 'nav.statements', roles: ['partner_admin'], comingWith: 'issues.payouts' } },
];
