// Rate limits: link-token routes count per token and per account (not in one bucket for everyone),
// and the counters live in MariaDB, so two API instances on one database share them.
import { randomBytes, randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MariaDbStore, RateLimitTable } from '../../apps/api/src/middleware/rate-limit-store';
import { createLogger } from '../../apps/api/src/lib/logger';
import { createTestApp, type TestApp } from '../setup/app';
import { GOOD_PASSWORD, linkFromMail, partnerWithTeam, signUpAndVerify, tokenOf, uniqueEmail } from '../setup/accounts';

// one proxy hop in front, so X-Forwarded-For gives each request the address of a caller of its own
const BEHIND_PROXY = { TRUST_PROXY: '1' };
const junkToken = () => randomBytes(32).toString('base64url');
const from = (ip: string) => ({ 'x-forwarded-for': ip });

describe('link-token routes are not one bucket for everyone', () => {
  let t: TestApp;
  beforeAll(async () => {
    // the default limits: five resets an hour per account, thirty invitation acceptances
    t = await createTestApp(BEHIND_PROXY);
  });
  afterAll(() => t.close());

  it('junk reset requests with made-up tokens do not block a real reset from another address', async () => {
    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/auth/forgot-password').set(from('198.51.100.20')).send({ email: owner.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, owner.email, 'reset-password'));

    for (let i = 0; i < 5; i++) {
      const junk = await request(t.app).post('/api/auth/reset-password').set(from('203.0.113.7')).send({ token: junkToken(), password: 'a-brand-new-password' });
      expect(junk.body.code).toBe('INVALID_LINK');
    }
    await request(t.app).post('/api/auth/reset-password').set(from('198.51.100.20')).send({ token, password: 'a-brand-new-password' }).expect(200);
  });

  it('requests that name neither a token nor an address count against their own address only', async () => {
    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/auth/forgot-password').set(from('198.51.100.22')).send({ email: owner.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, owner.email, 'reset-password'));
    for (let i = 0; i < 5; i++) await request(t.app).post('/api/auth/reset-password').set(from('203.0.113.8')).send({}).expect(400);
    await request(t.app).post('/api/auth/reset-password').set(from('203.0.113.8')).send({}).expect(429);
    await request(t.app).post('/api/auth/reset-password').set(from('198.51.100.22')).send({ token, password: 'a-brand-new-password' }).expect(200);
  });

  it('junk invitation acceptances do not block a real one from another address', async () => {
    const { admin, orgId } = await partnerWithTeam(t.app, t.dataSource);
    const email = uniqueEmail('invitee');
    await request(t.app).post(`/api/orgs/${orgId}/invitations`).auth(admin.accessToken, { type: 'bearer' }).send({ email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(t.dataSource, email, 'invitation'));

    for (let i = 0; i < 30; i++) {
      const junk = await request(t.app).post('/api/auth/invitations/accept').set(from('203.0.113.9')).send({ token: junkToken(), name: 'Junk', password: GOOD_PASSWORD });
      expect(junk.body.code).toBe('INVITATION_INVALID');
    }
    await request(t.app).post('/api/auth/invitations/accept').set(from('198.51.100.21')).send({ token, name: 'Real technician', password: GOOD_PASSWORD }).expect(200);
  });
});

describe('link-token routes count per token and per account', () => {
  const tight = { perIp: 1000, perAccount: 3, windowMinutes: 60 };
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp(BEHIND_PROXY, { limits: { reset: tight, invitation: tight } });
  });
  afterAll(() => t.close());

  it('one token tried again and again is stopped, from any address', async () => {
    const token = junkToken();
    for (let i = 0; i < 3; i++) {
      const res = await request(t.app).post('/api/auth/reset-password').set(from(`203.0.113.${10 + i}`)).send({ token, password: 'a-brand-new-password' });
      expect(res.body.code).toBe('INVALID_LINK');
    }
    const limited = await request(t.app).post('/api/auth/reset-password').set(from('203.0.113.20')).send({ token, password: 'a-brand-new-password' }).expect(429);
    expect(limited.body.code).toBe('TOO_MANY_REQUESTS');
    // the counter is keyed on the token's hash, not on the token
    expect(limited.text).not.toContain(token);
  });

  it('a made-up token in the body takes no request out of its address\'s count', async () => {
    const email = uniqueEmail('mailbomb');
    for (let i = 0; i < 3; i++) await request(t.app).post('/api/auth/forgot-password').set(from(`203.0.113.${50 + i}`)).send({ email, token: junkToken() }).expect(202);
    await request(t.app).post('/api/auth/forgot-password').set(from('203.0.113.60')).send({ email, token: junkToken() }).expect(429);
  });

  it('tokens of one account count against that account', async () => {
    const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
    const tokens: string[] = [];
    for (let i = 0; i < 3; i++) {
      // each new link replaces the last; the old ones still name the account
      await request(t.app).post('/api/auth/forgot-password').set(from(`198.51.100.${30 + i}`)).send({ email: owner.email }).expect(202);
      tokens.push(tokenOf(await linkFromMail(t.dataSource, owner.email, 'reset-password')));
    }
    // three tries with two of the tokens (each below its own token's limit) use up the account's
    for (const token of [tokens[0], tokens[1], tokens[0]]) {
      const res = await request(t.app).post('/api/auth/reset-password').set(from('203.0.113.40')).send({ token, password: 'short' });
      expect(res.status).toBe(400);
    }
    await request(t.app).post('/api/auth/reset-password').set(from('198.51.100.40')).send({ token: tokens[2], password: 'a-brand-new-password' }).expect(429);
    // another account is not affected
    const other = await signUpAndVerify(t.app, t.dataSource, 'owner');
    await request(t.app).post('/api/auth/forgot-password').set(from('198.51.100.41')).send({ email: other.email }).expect(202);
    const token = tokenOf(await linkFromMail(t.dataSource, other.email, 'reset-password'));
    await request(t.app).post('/api/auth/reset-password').set(from('198.51.100.41')).send({ token, password: 'a-brand-new-password' }).expect(200);
  });
});

describe('limits hold across two API instances on one database', () => {
  const scope = `shared-${randomUUID()}:`;
  const limits = { signIn: { perIp: 6, perAccount: 4, windowMinutes: 15 } };
  let a: TestApp;
  let b: TestApp;
  beforeAll(async () => {
    a = await createTestApp(BEHIND_PROXY, { limits, limitScope: scope });
    b = await createTestApp(BEHIND_PROXY, { limits, limitScope: scope });
  });
  afterAll(async () => {
    await a.close();
    await b.close();
  });

  it('per account: requests split across the instances reach the limit at N, not 2N', async () => {
    const email = uniqueEmail('nobody');
    const signIn = (t: TestApp, i: number) => request(t.app).post('/api/auth/sign-in').set(from(`192.0.2.${i}`)).send({ email, password: 'wrong-password-x' });
    for (let i = 0; i < 4; i++) expect((await signIn(i % 2 ? b : a, i)).status).toBe(401);
    expect((await signIn(a, 10)).status).toBe(429);
    expect((await signIn(b, 11)).status).toBe(429);
  });

  it('per IP: the same across the instances', async () => {
    const signIn = (t: TestApp) => request(t.app).post('/api/auth/sign-in').set(from('192.0.2.50')).send({ email: uniqueEmail(), password: 'wrong-password-x' });
    for (let i = 0; i < 6; i++) expect((await signIn(i % 2 ? b : a)).status).toBe(401);
    expect((await signIn(a)).status).toBe(429);
    expect((await signIn(b)).status).toBe(429);
  });

  it('an app of another scope keeps counters of its own', async () => {
    const email = uniqueEmail('nobody');
    const other = await createTestApp(BEHIND_PROXY, { limits });
    try {
      for (let i = 0; i < 4; i++) await request(a.app).post('/api/auth/sign-in').send({ email, password: 'wrong-password-x' }).expect(401);
      await request(a.app).post('/api/auth/sign-in').send({ email, password: 'wrong-password-x' }).expect(429);
      await request(other.app).post('/api/auth/sign-in').send({ email, password: 'wrong-password-x' }).expect(401);
    } finally {
      await other.close();
    }
  });
});

describe('the MariaDB store', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());
  const store = (prefix: string, windowMs: number) => {
    const s = new MariaDbStore(new RateLimitTable(t.dataSource, createLogger('silent')), prefix);
    s.init({ windowMs } as Parameters<MariaDbStore['init']>[0]);
    return s;
  };

  it('counts in a fixed window and starts afresh when it has lapsed', async () => {
    const prefix = `store-${randomUUID()}:`;
    const one = store(prefix, 1000);
    const two = store(prefix, 1000);
    const first = await one.increment('k');
    expect(first.totalHits).toBe(1);
    expect(first.resetTime!.getTime() - Date.now()).toBeGreaterThan(500);
    expect((await two.increment('k')).totalHits).toBe(2);
    expect((await one.increment('k')).resetTime).toEqual(first.resetTime);
    expect((await two.get('k'))?.totalHits).toBe(3);
    expect((await one.increment('other')).totalHits).toBe(1);
    await two.decrement('k');
    expect((await one.get('k'))?.totalHits).toBe(2);

    await new Promise((r) => setTimeout(r, 1100));
    expect(await one.get('k')).toBeUndefined();
    const again = await two.increment('k');
    expect(again.totalHits).toBe(1);
    expect(again.resetTime!.getTime()).toBeGreaterThan(first.resetTime!.getTime());
    await one.resetKey('k');
    expect(await two.get('k')).toBeUndefined();
  });

  it('counts concurrent hits exactly', async () => {
    const s = store(`store-${randomUUID()}:`, 60_000);
    const hits = await Promise.all(Array.from({ length: 40 }, () => s.increment('busy')));
    expect(hits.map((h) => h.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
  });

  it('sweeps rows whose window lapsed a while ago, and leaves live ones', async () => {
    const lapsed = randomBytes(32);
    await t.dataSource.query('INSERT INTO rate_limit_counter (key_hash, hits, window_ends_at) VALUES (?, 3, UTC_TIMESTAMP(3) - INTERVAL 2 MINUTE)', [lapsed]);
    const s = store(`store-${randomUUID()}:`, 60_000);
    await s.increment('live');
    const count = async (key: Buffer) => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM rate_limit_counter WHERE key_hash = ?', [key]))[0].n);
    for (let i = 0; i < 50 && (await count(lapsed)) > 0; i++) await new Promise((r) => setTimeout(r, 20));
    expect(await count(lapsed)).toBe(0);
    expect((await s.get('live'))?.totalHits).toBe(1);
  });
});
