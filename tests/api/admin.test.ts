// Network-admin routes: only network admins get in; the mail log shows what was queued.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { createTestApp, type TestApp } from '../setup/app';
import { createNetworkAdmin } from '../../apps/api/src/services/admin.service';
import { partnerWithTeam, signIn, signUpAndVerify, uniqueEmail } from '../setup/accounts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('admin routes', () => {
  it('refuse anonymous callers, owners and partner admins', async () => {
    await request(t.app).get('/api/admin/mail-log').expect(401);
    const owner = await signIn(t.app, 'hannes@owners.example', DEMO_PASSWORD);
    const partner = await signIn(t.app, 'lena@glutwerk.example', DEMO_PASSWORD);
    for (const who of [owner, partner]) {
      const res = await request(t.app).get('/api/admin/mail-log').auth(who.accessToken, { type: 'bearer' }).expect(403);
      expect(res.body.code).toBe('FORBIDDEN');
      await request(t.app).get('/api/admin/audit-log').auth(who.accessToken, { type: 'bearer' }).expect(403);
    }
  });

  it('list queued e-mails with filters, and audit entries', async () => {
    const email = uniqueEmail('logged');
    await request(t.app).post('/api/auth/sign-up').send({ name: 'Logged', email, password: 'winter-glow-pin-42' }).expect(202);
    const { orgId } = await partnerWithTeam(t.app, t.dataSource, { technician: true });
    const admin = await signIn(t.app, 'admin@emberline.example', DEMO_PASSWORD);
    const mail = await request(t.app).get('/api/admin/mail-log').query({ to: email }).auth(admin.accessToken, { type: 'bearer' }).expect(200);
    expect(mail.body.data).toHaveLength(1);
    expect(mail.body.data[0]).toMatchObject({ to: email, template: 'verify-email', status: 'pending', attempts: 0 });
    expect(mail.body.data[0].text).toContain('verify-email?token=');
    const audit = await request(t.app).get('/api/admin/audit-log').query({ organisationId: orgId }).auth(admin.accessToken, { type: 'bearer' }).expect(200);
    expect(audit.body.data.map((a: { action: string }) => a.action)).toEqual(['invitation.accept', 'invitation.create', 'organisation.create']);
    const bad = await request(t.app).get('/api/admin/mail-log').query({ status: 'lost', limit: 0 }).auth(admin.accessToken, { type: 'bearer' }).expect(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['query.limit', 'query.status']);
    const badAudit = await request(t.app).get('/api/admin/audit-log').query({ organisationId: 'not-an-id', limit: 9999 }).auth(admin.accessToken, { type: 'bearer' }).expect(400);
    expect(badAudit.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['query.limit', 'query.organisationId']);
  });
});

describe('creating network admins (npm run admin:create)', () => {
  it('creates a new admin who can sign in, and promotes an existing account keeping its password', async () => {
    const actor = { userId: null, roles: [], organisationId: null };
    const email = uniqueEmail('newadmin');
    expect(await t.dataSource.transaction((manager) => createNetworkAdmin({ manager, actor }, { email, name: 'New Admin', password: 'a-strong-admin-pass', passwordHashCost: 4 }))).toBe('created');
    const s = await signIn(t.app, email, 'a-strong-admin-pass');
    await request(t.app).get('/api/admin/mail-log').auth(s.accessToken, { type: 'bearer' }).expect(200);

    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    expect(await t.dataSource.transaction((manager) => createNetworkAdmin({ manager, actor }, { email: owner.email, name: 'Ignored', password: 'unused-password-x', passwordHashCost: 4 }))).toBe('promoted');
    const promoted = await signIn(t.app, owner.email, 'winter-glow-pin-42');
    expect(promoted.body.data.user).toMatchObject({ roles: ['owner', 'network_admin'] });
    const [row] = await t.dataSource.query("SELECT COUNT(*) AS n FROM audit_log WHERE action IN ('user.create-network-admin', 'user.grant-network-admin') AND entity_id IN (?, ?)", [s.userId, owner.userId]);
    expect(Number(row.n)).toBe(2);
  });
});
