// Pages in the quiet sign-in frame: sign-in, joining the network, e-mail links, invitations.
import type { RouteMeta, RouteRecordRaw } from 'vue-router';

const authLayout = () => import('@/layouts/auth-layout.vue');

function authPage(path: string, name: string, component: RouteRecordRaw['component'], meta: RouteMeta): RouteRecordRaw {
  return { path, component: authLayout, children: [{ path: '', name, component: component!, meta }] };
}

export const authRoutes: RouteRecordRaw[] = [
  authPage('/sign-in', 'sign-in', () => import('@/views/sign-in/index.vue'), { title: 'signIn.metaTitle', guestOnly: true }),
  authPage('/join', 'join', () => import('@/views/join/index.vue'), { title: 'join.metaTitle', guestOnly: true }),
  authPage('/join/check-inbox', 'check-inbox', () => import('@/views/check-inbox/index.vue'), { title: 'account.checkInboxTitle' }),
  authPage('/verify-email', 'verify-email', () => import('@/views/verify-email/index.vue'), { title: 'verifyEmail.metaTitle' }),
  authPage('/forgot-password', 'forgot-password', () => import('@/views/forgot-password/index.vue'), { title: 'account.forgotTitle', guestOnly: true }),
  authPage('/reset-password', 'reset-password', () => import('@/views/reset-password/index.vue'), { title: 'account.resetTitle' }),
  authPage('/accept-invitation', 'accept-invitation', () => import('@/views/accept-invitation/index.vue'), { title: 'acceptInvitation.metaTitle' }),
];
