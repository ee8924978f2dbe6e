// The map search; the whole search lives in the query so it can be shared and revisited.
import type { RouteRecordRaw } from 'vue-router';

export const searchRoutes: RouteRecordRaw[] = [
  { path: '/search', name: 'search', component: () => import('@/views/search/index.vue'), meta: { title: 'search.metaTitle' } },
];
