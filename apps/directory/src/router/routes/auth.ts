// Owner accounts: sign-in, sign-up, e-mail links and the account page.
import type { RouteRecordRaw } from 'vue-router';

export const authRoutes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/sign-in/index.vue'), meta: { title: 'signIn.metaTitle', guestOnly: true } },
  { path: '/sign-up', name: 'sign-up', component: () => import('@/views/sign-up/index.vue'), meta: { title: 'signUp.metaTitle', guestOnly: true } },
  { path: '/sign-up/check-inbox', name: 'check-inbox', component: () => import('@/views/check-inbox/index.vue'), meta: { title: 'checkInbox.metaTitle' } },
  { path: '/verify-email', name: 'verify-email', component: () => import('@/views/verify-email/index.vue'), meta: { title: 'verifyEmail.metaTitle' } },
  { path: '/forgot-password', name: 'forgot-password', component: () => import('@/views/forgot-password/index.vue'), meta: { title: 'forgotPassword.metaTitle', guestOnly: true } },
  { path: '/reset-password', name: 'reset-password', component: () => import('@/views/reset-password/index.vue'), meta: { title: 'resetPassword.metaTitle' } },
];
