// Partner pages: the application, services and prices, parts, service area, working hours, the team,
// and those not built yet (each says which issue brings it).
import type { RouteRecordRaw } from 'vue-router';

const comingSoon = () => import('@/views/coming-soon/index.vue');

export const partnerRoutes: RouteRecordRaw[] = [
  // Partner admins edit; technicians see it read-only.
  { path: 'application', name: 'application', component: () => import('@/views/application/index.vue'), meta: { title: 'application.metaTitle', roles: ['partner_admin', 'technician'] } },
  // Bookings: the table, one technician's week and one booking (`menu` keeps "Bookings" lit in the menu).
  { path: 'bookings', name: 'bookings', component: () => import('@/views/bookings/index.vue'), meta: { title: 'nav.bookings', roles: ['technician', 'partner_admin'] } },
  { path: 'bookings/week', name: 'bookings-week', component: () => import('@/views/bookings/bookings-week.vue'), meta: { title: 'bookings.week.metaTitle', roles: ['technician', 'partner_admin'], menu: 'bookings' } },
  { path: 'bookings/:bookingId', name: 'booking', component: () => import('@/views/bookings/booking-detail.vue'), meta: { title: 'bookings.detail.metaTitle', roles: ['technician', 'partner_admin'], menu: 'bookings' } },
  { path: 'job-sheets', name: 'job-sheets', component: comingSoon, meta: { title: 'nav.jobSheets', roles: ['technician', 'partner_admin'], comingWith: 'issues.jobSheets' } },
  // What the organisation sells, where and when: partner admins edit, technicians see it read-only.
  { path: 'services', name: 'services-prices', component: () => import('@/views/offers/index.vue'), meta: { title: 'nav.servicesPrices', roles: ['partner_admin', 'technician'] } },
  { path: 'parts', name: 'parts', component: () => import('@/views/parts/index.vue'), meta: { title: 'nav.parts', roles: ['partner_admin', 'technician'] } },
  { path: 'area', name: 'service-area', component: () => import('@/views/service-area/index.vue'), meta: { title: 'nav.serviceArea', roles: ['partner_admin', 'technician'] } },
  { path: 'hours', name: 'working-hours', component: () => import('@/views/working-hours/index.vue'), meta: { title: 'nav.workingHours', roles: ['partner_admin', 'technician'] } },
  { path: 'team', name: 'team', component: () => import('@/views/team/index.vue'), meta: { title: 'nav.team', roles: ['partner_admin', 'technician'] } },
  { path: 'statements', name: 'statements', component: comingSoon, meta: { title: 'nav.statements', roles: ['partner_admin'], comingWith: 'issues.payouts' } },
];
