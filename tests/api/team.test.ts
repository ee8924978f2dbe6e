// Partner sign-up, invitations and the team: who may do what inside one organisation.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { GOOD_PASSWORD, linkFromMail, partnerWithTeam, signIn, signUpAndVerify, tokenOf, uniqueEmail } from '../setup/accounts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

describe('partner sign-up', () => {
  it('creates a draft organisation with the caller as partner admin', async () => {
    const admin = await signUpAndVerify(t.app, t.dataSource, 'partner', { organisationName: 'Test Heizdienst' });
    expect(admin.body.data.user.memberships).toEqual([
      expect.objectContaining({ organisationName: 'Test Heizdienst', organisationStatus: 'draft', role: 'partner_admin' }),
    ]);
    expect(admin.body.data.user.roles).toEqual([]);
    const link = await linkFromMail(t.dataSource, admin.email, 'verify-email');
    expect(link).toContain('/console/verify-email?token=');
  });

  it('refuses a missing organisation name', async () => {
    const res = await request(t.app).post('/api/auth/partner-sign-up').send({ name: 'A', email: uniqueEmail(), password: GOOD_PASSWORD }).expect(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toContain('organisationName');
  });
});

describe('invitations', () => {
  it('invites a technician who accepts with a new account and then sees only that organisation', async () => {
    const { admin, orgId, technician } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    expect(technician!.body.data.user.memberships).toEqual([expect.objectContaining({ organisationId: orgId, role: 'technician' })]);
    const team = await request(t.app).get(`/api/orgs/${orgId}/team`).set(auth(technician!.accessToken)).expect(200);
    expect(team.body.data.members.map((m: { email: string }) => m.email).sort()).toEqual([admin.email, technician!.email].sort());
    // a technician reads but does not manage the team
    const denied = await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(technician!.accessToken)).send({ email: uniqueEmail(), role: 'technician' }).expect(403);
    expect(denied.body.code).toBe('FORBIDDEN');
  });

  it('shows what a link offers, then uses it once only', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const email = uniqueEmail('invitee');
    await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(admin.accessToken)).send({ email, role: 'partner_admin' }).expect(201);
    const token = tokenOf(await linkFromMail(t.dataSource, email, 'invitation'));
    const preview = await request(t.app).get(`/api/auth/invitations/${token}`).expect(200);
    expect(preview.body.data).toMatchObject({ email, role: 'partner_admin', accountExists: false });

    const weak = await request(t.app).post('/api/auth/invitations/accept').send({ token, password: 'short' }).expect(400);
    expect(weak.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['name', 'password']);
    await request(t.app).post('/api/auth/invitations/accept').send({ token, name: 'Second Admin', password: GOOD_PASSWORD }).expect(200);
    const again = await request(t.app).post('/api/auth/invitations/accept').send({ token, name: 'Second Admin', password: GOOD_PASSWORD }).expect(404);
    expect(again.body.code).toBe('INVITATION_INVALID');
    await request(t.app).get(`/api/auth/invitations/${token}`).expect(404);
  });

  it('links an existing account only with that account\'s password', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const existing = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(admin.accessToken)).send({ email: existing.email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(t.dataSource, existing.email, 'invitation'));
    expect((await request(t.app).get(`/api/auth/invitations/${token}`)).body.data.accountExists).toBe(true);
    await request(t.app).post('/api/auth/invitations/accept').send({ token, password: 'not-their-password' }).expect(401);
    const ok = await request(t.app).post('/api/auth/invitations/accept').send({ token, password: GOOD_PASSWORD }).expect(200);
    expect(ok.body.data.user.roles).toEqual(['owner']);
    expect(ok.body.data.user.memberships).toEqual([expect.objectContaining({ organisationId: orgId, role: 'technician' })]);
  });

  it('refuses to invite someone already in the team, and withdraws a pending invitation', async () => {
    const { admin, orgId, technician } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    const dup = await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(admin.accessToken)).send({ email: technician!.email, role: 'technician' }).expect(409);
    expect(dup.body.code).toBe('ALREADY_MEMBER');

    const email = uniqueEmail('later');
    const created = await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(admin.accessToken)).send({ email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(t.dataSource, email, 'invitation'));
    await request(t.app).delete(`/api/orgs/${orgId}/invitations/${created.body.data.id}`).set(auth(admin.accessToken)).expect(200);
    await request(t.app).post('/api/auth/invitations/accept').send({ token, name: 'Late', password: GOOD_PASSWORD }).expect(404);
    const team = await request(t.app).get(`/api/orgs/${orgId}/team`).set(auth(admin.accessToken)).expect(200);
    expect(team.body.data.invitations).toEqual([]);
  });

  it('refuses an expired invitation', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const email = uniqueEmail('expired');
    await request(t.app).post(`/api/orgs/${orgId}/invitations`).set(auth(admin.accessToken)).send({ email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(t.dataSource, email, 'invitation'));
    await t.dataSource.query('UPDATE invitation SET expires_at = UTC_TIMESTAMP(3) - INTERVAL 1 SECOND WHERE email = ?', [email]);
    await request(t.app).post('/api/auth/invitations/accept').send({ token, name: 'X', password: GOOD_PASSWORD }).expect(404);
  });
});

describe('roles in the team', () => {
  it('changes roles, keeps at least one partner admin, removes members, and audits each change', async () => {
    const { admin, orgId, technician } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    const lastAdmin = await request(t.app).patch(`/api/orgs/${orgId}/members/${admin.userId}`).set(auth(admin.accessToken)).send({ role: 'technician' }).expect(409);
    expect(lastAdmin.body.code).toBe('LAST_ADMIN');
    await request(t.app).delete(`/api/orgs/${orgId}/members/${admin.userId}`).set(auth(admin.accessToken)).expect(409);

    const promoted = await request(t.app).patch(`/api/orgs/${orgId}/members/${technician!.userId}`).set(auth(admin.accessToken)).send({ role: 'partner_admin' }).expect(200);
    expect(promoted.body.data.members.find((m: { userId: string }) => m.userId === technician!.userId).role).toBe('partner_admin');
    const bad = await request(t.app).patch(`/api/orgs/${orgId}/members/${technician!.userId}`).set(auth(admin.accessToken)).send({ role: 'network_admin' }).expect(400);
    expect(bad.body.errors[0].path).toBe('role');
    await request(t.app).delete(`/api/orgs/${orgId}/members/${technician!.userId}`).set(auth(admin.accessToken)).expect(200);
    // the removed member no longer reaches the organisation at all
    await request(t.app).get(`/api/orgs/${orgId}/team`).set(auth(technician!.accessToken)).expect(404);

    const audit: { action: string; before_state: unknown; after_state: unknown }[] = await t.dataSource.query(
      'SELECT action, before_state, after_state FROM audit_log WHERE organisation_id = ? ORDER BY id',
      [orgId],
    );
    expect(audit.map((a) => a.action)).toEqual(['organisation.create', 'invitation.create', 'invitation.accept', 'membership.change-role', 'membership.remove']);
    const change = audit.find((a) => a.action === 'membership.change-role')!;
    const json = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
    expect(json(change.before_state)).toEqual({ role: 'technician' });
    expect(json(change.after_state)).toEqual({ role: 'partner_admin' });
  });

  it('lets a network admin read any organisation', async () => {
    const { orgId } = await partnerWithTeam(t.app, t.dataSource);
    const admin = await signIn(t.app, 'admin@emberline.example', 'ember-demo-2026');
    const res = await request(t.app).get(`/api/orgs/${orgId}`).set(auth(admin.accessToken)).expect(200);
    expect(res.body.data.status).toBe('draft');
  });
});
