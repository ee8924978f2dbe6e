// Helpers for API tests that need people: they go through the real endpoints and read links
// from the e-mail outbox, as a person would read them from their inbox.
import request from 'supertest';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { expect } from 'vitest';
import { MailOutboxEntity } from '../../apps/api/src/entities/mail-outbox.entity';
import { outgoingContent } from '../../apps/api/src/mail/outbox';
import { mailSecretKeyOf } from '../../apps/api/src/mail/secret-data';

let counter = 0;
export const uniqueEmail = (prefix = 'person') => `${prefix}-${Date.now().toString(36)}-${++counter}@test.example`;
export const GOOD_PASSWORD = 'winter-glow-pin-42';

/**
 * The newest link of a template sent to an address, read from the outbox as the sender would send
 * it (the stored text has its token redacted; the sender opens the sealed one).
 */
export async function linkFromMail(ds: DataSource, to: string, template: string): Promise<string> {
  const rows = await ds.getRepository(MailOutboxEntity).find({ where: { to, template }, order: { createdAt: 'DESC', id: 'DESC' }, take: 1 });
  expect(rows.length, `a ${template} e-mail to ${to}`).toBe(1);
  const link = outgoingContent(rows[0]!, mailSecretKeyOf(ds)).text.match(/https?:\/\/\S+token=[\w-]+/)?.[0];
  expect(link, `a link in the ${template} e-mail`).toBeDefined();
  return link!;
}

export const tokenOf = (link: string) => new URL(link).searchParams.get('token')!;

export interface SignedIn {
  email: string;
  userId: string;
  accessToken: string;
  cookie: string;
  body: { data: { user: { roles: string[]; memberships: { organisationId: string; role: string }[] } } };
}

function refreshCookie(res: request.Response): string {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const c = cookies.find((x) => x.startsWith('emberline_refresh='));
  expect(c, 'a refresh cookie').toBeDefined();
  return c!.split(';')[0]!;
}

export function sessionOf(res: request.Response, email: string): SignedIn {
  return { email, userId: res.body.data.user.id, accessToken: res.body.data.accessToken, cookie: refreshCookie(res), body: res.body };
}

export async function signUpAndVerify(app: Express, ds: DataSource, kind: 'owner' | 'partner', o: { email?: string; organisationName?: string } = {}): Promise<SignedIn> {
  const email = o.email ?? uniqueEmail(kind);
  const body = { name: `Test ${kind}`, email, password: GOOD_PASSWORD, ...(kind === 'partner' ? { organisationName: o.organisationName ?? `Org ${email}` } : {}) };
  await request(app).post(kind === 'owner' ? '/api/auth/sign-up' : '/api/auth/partner-sign-up').send(body).expect(202);
  const token = tokenOf(await linkFromMail(ds, email, 'verify-email'));
  const res = await request(app).post('/api/auth/verify-email').send({ token }).expect(200);
  return sessionOf(res, email);
}

export async function signIn(app: Express, email: string, password: string): Promise<SignedIn> {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password }).expect(200);
  return sessionOf(res, email);
}

/** A partner organisation with an admin and (optionally) an accepted technician. */
export async function partnerWithTeam(app: Express, ds: DataSource, o: { technician?: boolean } = {}) {
  const admin = await signUpAndVerify(app, ds, 'partner');
  const orgId = admin.body.data.user.memberships[0]!.organisationId;
  let technician: SignedIn | undefined;
  if (o.technician) {
    const email = uniqueEmail('tech');
    await request(app).post(`/api/orgs/${orgId}/invitations`).auth(admin.accessToken, { type: 'bearer' }).send({ email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(ds, email, 'invitation'));
    const res = await request(app).post('/api/auth/invitations/accept').send({ token, name: 'Test technician', password: GOOD_PASSWORD }).expect(200);
    technician = sessionOf(res, email);
  }
  return { admin, orgId, technician };
}
