// The owner's bookings (issue #7): the booking flow for one free time, the list, and one booking,
// which is also where the payments page comes back to (/bookings/:id?paid=1 or ?cancelled=1).
import type { RouteRecordRaw } from 'vue-router';
import { loadBookingMessages } from '@/locales';

const beforeEnter = () => loadBookingMessages();

export const ownerBookingRoutes: RouteRecordRaw[] = [
  { path: '/book/:partnerId', name: 'book', component: () => import('@/views/book/index.vue'), beforeEnter, meta: { title: 'book.metaTitle', roles: ['owner'] } },
  { path: '/bookings', name: 'bookings', component: () => import('@/views/bookings/index.vue'), beforeEnter, meta: { title: 'bookings.list.metaTitle', roles: ['owner'] } },
  { path: '/bookings/:bookingId', name: 'booking-detail', component: () => import('@/views/booking-detail/index.vue'), beforeEnter, meta: { title: 'bookings.detail.metaTitle', roles: ['owner'] } },
];
