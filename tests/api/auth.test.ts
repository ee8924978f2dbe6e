// Accounts end to end on MariaDB: sign-up and verification, sign-in, sessions with rotating
// refresh tokens, password reset, and the abuse cases the issue lists (each with a test).
import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { loadConfig, loadSeedSettings } from '../../apps/api/src/config';
import { UserAccountEntity } from '../../apps/api/src/entities';
import { verifyPassword } from '../../apps/api/src/lib/password-hash';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { createTestApp, TEST_JWT_SECRET, type TestApp } from '../setup/app';
import { GOOD_PASSWORD, linkFromMail, signIn, signUpAndVerify, tokenOf, uniqueEmail } from '../setup/accounts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
const withoutIds = (body: Record<string, unknown>) => ({ ...body, requestId: undefined, instance: undefined });

describe('owner sign-up and e-mail verification', () => {
  it('creates an owner, e-mails a link, and the link confirms the address and signs in', async () => {
    const email = uniqueEmail('owner');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Clara Test', email: email.toUpperCase(), password: GOOD_PASSWORD }).expect(202);
    expect(res.body.data.accepted).toBe(true);
    const link = await linkFromMail(t.dataSource, email, 'verify-email');
    expect(link.startsWith('http://emberline.test/verify-email?token=')).toBe(true);

    // not yet confirmed: the password is right but sign-in waits for the link
    const early = await request(t.app).post('/api/auth/sign-in').send({ email, password: GOOD_PASSWORD }).expect(403);
    expect(early.body.code).toBe('EMAIL_NOT_VERIFIED');

    const verified = await request(t.app).post('/api/auth/verify-email').send({ token: tokenOf(link) }).expect(200);
    expect(verified.body.data.user).toMatchObject({ email, roles: ['owner'], emailVerified: true, memberships: [] });
    const me = await request(t.app).get('/api/me').set(bearer(verified.body.data.accessToken)).expect(200);
    expect(me.body.data.email).toBe(email);
  });

  it('carries a same-site return path into the confirmation link, and refuses any other', async () => {
    const email = uniqueEmail('owner');
    const returnTo = '/book/4f6d2a7e-0000-4000-8000-000000000001?serviceType=seasonal-heater-service&start=2030-01-07T09:00:00.000Z';
    await request(t.app).post('/api/auth/sign-up').send({ name: 'Return Test', email, password: GOOD_PASSWORD, returnTo }).expect(202);
    const link = new URL(await linkFromMail(t.dataSource, email, 'verify-email'));
    expect(link.pathname).toBe('/verify-email');
    expect(link.searchParams.get('next')).toBe(returnTo);
    await request(t.app).post('/api/auth/verify-email').send({ token: link.searchParams.get('token') }).expect(200);

    for (const bad of ['https://elsewhere.example/book', '//elsewhere.example/book', '/\\elsewhere.example', 'book/1', '/book\nSet-Cookie: x', `/${'a'.repeat(1000)}`]) {
      const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'X', email: uniqueEmail(), password: GOOD_PASSWORD, returnTo: bad }).expect(400);
      expect(res.body.errors.map((e: { path: string }) => e.path), bad).toContain('returnTo');
    }
  });

  it('refuses weak passwords with field errors', async () => {
    for (const [password, message] of [
      ['short', /at least 10/],
      ['password123', /too common/],
      ['1234567890', /too common/],
    ] as const) {
      const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'X', email: uniqueEmail(), password }).expect(400);
      expect(res.body.errors.find((e: { path: string }) => e.path === 'password')?.message).toMatch(message);
    }
    const email = uniqueEmail('same');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'X', email, password: email }).expect(400);
    expect(res.body.errors).toContainEqual({ path: 'password', message: 'Your password must not be your e-mail address' });
  });

  it('answers the same for an address that already has an account (no enumeration)', async () => {
    const fresh = await request(t.app).post('/api/auth/sign-up').send({ name: 'A', email: uniqueEmail(), password: GOOD_PASSWORD }).expect(202);
    const taken = await request(t.app).post('/api/auth/sign-up').send({ name: 'A', email: 'clara@owners.example', password: GOOD_PASSWORD }).expect(202);
    expect(taken.body).toEqual(fresh.body);
    const [{ n }] = await t.dataSource.query("SELECT COUNT(*) AS n FROM user_account WHERE email = 'clara@owners.example'");
    expect(Number(n)).toBe(1);
  });

  it('uses a verification link once only', async () => {
    const email = uniqueEmail();
    await request(t.app).post('/api/auth/sign-up').send({ name: 'A', email, password: GOOD_PASSWORD }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, email, 'verify-email'));
    await request(t.app).post('/api/auth/verify-email').send({ token }).expect(200);
    const again = await request(t.app).post('/api/auth/verify-email').send({ token }).expect(400);
    expect(again.body.code).toBe('INVALID_LINK');
  });

  it("hashes with scrypt at OWASP's cost (N = 2^17) by default, lower only in tests", () => {
    expect(loadConfig({ DB_PASSWORD: 'x' }).PASSWORD_HASH_COST).toBe(17);
    expect(() => loadConfig({ DB_PASSWORD: 'x', PASSWORD_HASH_COST: '16' })).toThrow(/PASSWORD_HASH_COST/);
    // the variable's old name still sets it, and is held to the same floor
    expect(loadConfig({ DB_PASSWORD: 'x', NODE_ENV: 'test', BCRYPT_COST: '4' }).PASSWORD_HASH_COST).toBe(4);
    expect(() => loadConfig({ DB_PASSWORD: 'x', BCRYPT_COST: '12' })).toThrow(/PASSWORD_HASH_COST/);
    expect(loadSeedSettings({ NODE_ENV: 'test', PASSWORD_HASH_COST: '4' }).PASSWORD_HASH_COST).toBe(4);
  });
});

describe('sign-in', () => {
  it('signs in a seeded demo account', async () => {
    const s = await signIn(t.app, 'admin@emberline.example', DEMO_PASSWORD);
    expect(s.body.data.user).toMatchObject({ roles: ['network_admin'] });
  });

  it('gives the same answer for a wrong password and an unknown address', async () => {
    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: 'max@owners.example', password: 'not-the-password' }).expect(401);
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: uniqueEmail('ghost'), password: 'not-the-password' }).expect(401);
    expect(withoutIds(wrong.body)).toEqual(withoutIds(unknown.body));
  });

  it('signs in with a bcrypt hash from before scrypt and then stores the password as scrypt', async () => {
    const { email, userId } = await signUpAndVerify(t.app, t.dataSource, 'owner');
    const users = t.dataSource.getRepository(UserAccountEntity);
    const legacy = await bcrypt.hash(GOOD_PASSWORD, 4);
    await users.update({ id: userId }, { passwordHash: legacy });

    // a wrong password leaves the old hash where it is
    await request(t.app).post('/api/auth/sign-in').send({ email, password: 'not-the-password' }).expect(401);
    expect((await users.findOneByOrFail({ id: userId })).passwordHash).toBe(legacy);

    await signIn(t.app, email, GOOD_PASSWORD);
    const stored = (await users.findOneByOrFail({ id: userId })).passwordHash;
    expect(stored).toMatch(/^\$scrypt\$ln=4,r=8,p=1\$/);
    expect(await verifyPassword(GOOD_PASSWORD, stored)).toBe(true);
    await signIn(t.app, email, GOOD_PASSWORD);
    expect((await users.findOneByOrFail({ id: userId })).passwordHash).toBe(stored);
  });

  // guessing, pauses and the account lock: tests/api/auth-lockout.test.ts
});

describe('access tokens', () => {
  let userId: string;
  beforeAll(async () => {
    userId = (await signIn(t.app, 'max@owners.example', DEMO_PASSWORD)).userId;
  });
  const base64url = (o: object) => Buffer.from(JSON.stringify(o)).toString('base64url');

  it('refuses a token with alg "none"', async () => {
    const token = `${base64url({ alg: 'none', typ: 'JWT' })}.${base64url({ sub: userId, typ: 'access', iss: 'emberline', aud: 'emberline-api', exp: Math.floor(Date.now() / 1000) + 600 })}.`;
    const res = await request(t.app).get('/api/me').set(bearer(token)).expect(401);
    expect(res.body.code).toBe('NOT_SIGNED_IN');
  });

  it('refuses a token signed with another secret', async () => {
    const token = jwt.sign({ typ: 'access' }, 'some-other-secret-that-is-long-enough', { subject: userId, issuer: 'emberline', audience: 'emberline-api', expiresIn: 600 });
    await request(t.app).get('/api/me').set(bearer(token)).expect(401);
  });

  it('refuses an expired token', async () => {
    const token = jwt.sign({ typ: 'access', exp: Math.floor(Date.now() / 1000) - 10 }, TEST_JWT_SECRET, { subject: userId, issuer: 'emberline', audience: 'emberline-api' });
    const res = await request(t.app).get('/api/me').set(bearer(token)).expect(401);
    expect(res.body.detail).toMatch(/expired/);
  });

  it('lets the owner change name and language, and refuses bad values', async () => {
    const token = jwt.sign({ typ: 'access' }, TEST_JWT_SECRET, { subject: userId, issuer: 'emberline', audience: 'emberline-api', expiresIn: 600 });
    const changed = await request(t.app).patch('/api/me').set(bearer(token)).send({ locale: 'de' }).expect(200);
    expect(changed.body.data.locale).toBe('de');
    const bad = await request(t.app).patch('/api/me').set(bearer(token)).send({ name: '', locale: 'fr' }).expect(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['locale', 'name']);
    expect((await request(t.app).get('/api/me').set(bearer(token))).body.data.locale).toBe('de');
  });

  it('accepts a valid token and refuses none at all', async () => {
    const token = jwt.sign({ typ: 'access' }, TEST_JWT_SECRET, { subject: userId, issuer: 'emberline', audience: 'emberline-api', expiresIn: 600 });
    await request(t.app).get('/api/me').set(bearer(token)).expect(200);
    await request(t.app).get('/api/me').expect(401);
  });
});

describe('refresh tokens', () => {
  it('rotates on every refresh, and reuse of an old one revokes the whole family', async () => {
    const s = await signIn(t.app, 'theresa@owners.example', DEMO_PASSWORD);
    const first = await request(t.app).post('/api/auth/refresh').set('cookie', s.cookie).expect(200);
    const rotated = ([] as string[]).concat(first.headers['set-cookie'] ?? []).find((c) => c.startsWith('emberline_refresh='))!;
    expect(rotated).toMatch(/HttpOnly/i);
    expect(rotated).toMatch(/SameSite=Strict/i);
    expect(rotated).toMatch(/Path=\/api\/auth/i);
    // the readable hint says only that a session exists; it is not a credential
    const hint = ([] as string[]).concat(first.headers['set-cookie'] ?? []).find((c) => c.startsWith('emberline_session='))!;
    expect(hint).toMatch(/^emberline_session=1;/);
    expect(hint).not.toMatch(/HttpOnly/i);
    const second = rotated.split(';')[0]!;
    expect(second).not.toBe(s.cookie);

    // the old cookie again: someone copied it
    const reuse = await request(t.app).post('/api/auth/refresh').set('cookie', s.cookie).expect(401);
    expect(reuse.body.code).toBe('SESSION_EXPIRED');
    // and the family is gone: the newest cookie no longer works either
    await request(t.app).post('/api/auth/refresh').set('cookie', second).expect(401);
    const [row] = await t.dataSource.query('SELECT COUNT(*) AS live FROM refresh_token WHERE user_id = ? AND revoked_at IS NULL', [s.userId]);
    expect(Number(row.live)).toBe(0);
  });

  it('sign-out revokes the session', async () => {
    const s = await signIn(t.app, 'jakob@owners.example', DEMO_PASSWORD);
    const out = await request(t.app).post('/api/auth/sign-out').set('cookie', s.cookie).expect(200);
    expect(([] as string[]).concat(out.headers['set-cookie'] ?? []).some((c) => /^emberline_session=;/.test(c))).toBe(true);
    await request(t.app).post('/api/auth/refresh').set('cookie', s.cookie).expect(401);
  });

  it('refuses refresh without a cookie', async () => {
    await request(t.app).post('/api/auth/refresh').expect(401);
  });
});

describe('password reset', () => {
  it('answers the same whether or not the address has an account', async () => {
    const known = await request(t.app).post('/api/auth/forgot-password').send({ email: 'ingrid@owners.example' }).expect(202);
    const unknown = await request(t.app).post('/api/auth/forgot-password').send({ email: uniqueEmail('ghost') }).expect(202);
    expect(known.body).toEqual(unknown.body);
  });

  it('sets a new password once per link and ends every session', async () => {
    const user = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/auth/forgot-password').send({ email: user.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, user.email, 'reset-password'));

    const weak = await request(t.app).post('/api/auth/reset-password').send({ token, password: 'short' }).expect(400);
    expect(weak.body.errors[0].path).toBe('password');
    await request(t.app).post('/api/auth/reset-password').send({ token, password: 'a-brand-new-password' }).expect(200);
    const reused = await request(t.app).post('/api/auth/reset-password').send({ token, password: 'another-new-password' }).expect(400);
    expect(reused.body.code).toBe('INVALID_LINK');

    await request(t.app).post('/api/auth/refresh').set('cookie', user.cookie).expect(401);
    await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: GOOD_PASSWORD }).expect(401);
    await signIn(t.app, user.email, 'a-brand-new-password');
    await linkFromMail(t.dataSource, user.email, 'reset-password');
    const [changed] = await t.dataSource.query("SELECT COUNT(*) AS n FROM mail_outbox WHERE to_address = ? AND template = 'password-changed'", [user.email]);
    expect(Number(changed.n)).toBe(1);
  });

  it('ends access tokens issued before the reset at once, not when they expire', async () => {
    const user = await signUpAndVerify(t.app, t.dataSource, 'owner');
    const before = (await signIn(t.app, user.email, GOOD_PASSWORD)).accessToken;
    await request(t.app).get('/api/me').set(bearer(before)).expect(200);
    await request(t.app).post('/api/auth/forgot-password').send({ email: user.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, user.email, 'reset-password'));
    await request(t.app).post('/api/auth/reset-password').send({ token, password: 'a-brand-new-password' }).expect(200);

    expect((await request(t.app).get('/api/me').set(bearer(before)).expect(401)).body.code).toBe('NOT_SIGNED_IN');
    await request(t.app).get('/api/me').set(bearer(user.accessToken)).expect(401);
    const after = await signIn(t.app, user.email, 'a-brand-new-password');
    await request(t.app).get('/api/me').set(bearer(after.accessToken)).expect(200);
  });

  it('refuses an expired link', async () => {
    const user = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/auth/forgot-password').send({ email: user.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, user.email, 'reset-password'));
    await t.dataSource.query("UPDATE one_time_token SET expires_at = UTC_TIMESTAMP(3) - INTERVAL 1 MINUTE WHERE user_id = ? AND purpose = 'reset_password'", [user.userId]);
    const res = await request(t.app).post('/api/auth/reset-password').send({ token, password: 'a-brand-new-password' }).expect(400);
    expect(res.body.code).toBe('INVALID_LINK');
  });
});

describe('rate limits (express-rate-limit)', () => {
  const tight = { windowMinutes: 15, perIp: 1000, perAccount: 3 };
  let limited: TestApp;
  beforeAll(async () => {
    limited = await createTestApp({}, { limits: { signIn: tight, signUp: tight, reset: tight, invitation: tight } });
  });
  afterAll(() => limited.close());

  it.each([
    ['sign-in', '/api/auth/sign-in', { password: 'whatever-password' }],
    ['sign-up', '/api/auth/sign-up', { name: 'X', password: GOOD_PASSWORD }],
    ['password reset', '/api/auth/forgot-password', {}],
  ])('limits %s per account', async (_what, path, extra) => {
    const email = uniqueEmail('limited');
    for (let i = 0; i < 3; i++) expect((await request(limited.app).post(path).send({ email, ...extra })).status).not.toBe(429);
    const res = await request(limited.app).post(path).send({ email, ...extra }).expect(429);
    expect(res.body.code).toBe('TOO_MANY_REQUESTS');
    expect(res.headers['ratelimit-policy'] ?? res.headers['ratelimit']).toBeDefined();
    // another address is not affected
    expect((await request(limited.app).post(path).send({ email: uniqueEmail('other'), ...extra })).status).not.toBe(429);
  });

  it('limits per IP address', async () => {
    const perIp = await createTestApp({}, { limits: { signIn: { windowMinutes: 15, perIp: 2, perAccount: 100 }, signUp: tight, reset: tight, invitation: tight } });
    try {
      for (let i = 0; i < 2; i++) await request(perIp.app).post('/api/auth/sign-in').send({ email: uniqueEmail(), password: 'x-password-1' }).expect(401);
      await request(perIp.app).post('/api/auth/sign-in').send({ email: uniqueEmail(), password: 'x-password-1' }).expect(429);
    } finally {
      await perIp.close();
    }
  });

  it('limits invitations', async () => {
    const admin = await signUpAndVerify(limited.app, limited.dataSource, 'partner');
    const orgId = admin.body.data.user.memberships[0]!.organisationId;
    const email = uniqueEmail('invitee');
    for (let i = 0; i < 3; i++) await request(limited.app).post(`/api/orgs/${orgId}/invitations`).set(bearer(admin.accessToken)).send({ email, role: 'technician' }).expect(201);
    await request(limited.app).post(`/api/orgs/${orgId}/invitations`).set(bearer(admin.accessToken)).send({ email, role: 'technician' }).expect(429);
  });
});
