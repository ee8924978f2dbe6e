// A partner's public profile, shareable; ?service=&lat=&lng=&place= carry the search along.
import type { RouteRecordRaw } from 'vue-router';

export const partnerRoutes: RouteRecordRaw[] = [
  { path: '/partners/:partnerId', name: 'partner', component: () => import('@/views/partner/index.vue'), meta: { title: 'partner.metaTitle' } },
];
