// Password guessing on MariaDB: pauses per address and client IP that a stranger cannot turn
// against the owner, answers that do not tell known from unknown addresses, the account lock
// that only the owner's e-mailed link lifts, and invitations held to the same throttle.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACCOUNT_LOCK_FAILURES } from '../../apps/api/src/services/auth.service';
import { FREE_FAILURES, pauseSeconds, throttleKeys } from '../../apps/api/src/services/sign-in-throttle.service';
import { createTestApp, type TestApp } from '../setup/app';
import { GOOD_PASSWORD, linkFromMail, signUpAndVerify, tokenOf, uniqueEmail } from '../setup/accounts';

// the rate limiters are another guard (tests/api/rate-limits.test.ts); here they stay out of the way
const lifted = { perIp: 100_000, perAccount: 100_000, windowMinutes: 15 };
const options = { limits: { signIn: lifted, reset: lifted, invitation: lifted } };
// one proxy in front, so each request may come from an address of its own (X-Forwarded-For)
const env = { TRUST_PROXY: '1' };

let a: TestApp;
let b: TestApp;
beforeAll(async () => {
  [a, b] = await Promise.all([createTestApp(env, options), createTestApp(env, options)]);
});
afterAll(async () => {
  await Promise.all([a.close(), b.close()]);
});

const from = (ip: string) => ({ 'x-forwarded-for': ip });
const withoutIds = (body: Record<string, unknown>) => ({ ...body, requestId: undefined, instance: undefined });
const signInFrom = (t: TestApp, ip: string, email: string, password: string) => request(t.app).post('/api/auth/sign-in').set(from(ip)).send({ email, password });

/** Seconds the pair of `email` and `ip` is paused for from now, read from the shared table. */
async function pausedFor(email: string, ip: string): Promise<number> {
  const rows: { s: number | null }[] = await a.dataSource.query('SELECT TIMESTAMPDIFF(SECOND, UTC_TIMESTAMP(3), blocked_until) AS s FROM sign_in_throttle WHERE key_hash = ?', [throttleKeys(email, ip).pair]);
  return Number(rows[0]?.s ?? 0);
}
/** Lets a pause run out, as if the time had passed. */
const endPause = (email: string, ip: string) =>
  a.dataSource.query('UPDATE sign_in_throttle SET blocked_until = UTC_TIMESTAMP(3) - INTERVAL 1 SECOND WHERE key_hash = ?', [throttleKeys(email, ip).pair]);

describe('sign-in rate limit as configured by default', () => {
  it("does not let a stranger's guesses from a few addresses stop the owner signing in", async () => {
    // the default limits (no override): the per-address limit must sit above what the throttle allows a stranger
    const t = await createTestApp(env, { limits: { reset: lifted, invitation: lifted } });
    try {
      const owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
      for (let i = 0; i < 30; i++) await signInFrom(t, `203.0.113.${100 + (i % 5)}`, owner.email, `guess-number-${i}`);
      await signInFrom(t, '198.51.100.200', owner.email, GOOD_PASSWORD).expect(200);
    } finally {
      await t.close();
    }
  });
});

describe('sign-in throttle', () => {
  it('answers a known and an unknown address identically through eleven failures', async () => {
    const known = (await signUpAndVerify(a.app, a.dataSource, 'owner')).email;
    const unknown = uniqueEmail('ghost');
    const ip = '198.51.100.7';
    for (let i = 1; i <= 11; i++) {
      const k = await signInFrom(a, ip, known, 'wrong-password-x');
      const u = await signInFrom(a, ip, unknown, 'wrong-password-x');
      expect([i, k.status], `attempt ${i}`).toEqual([i, u.status]);
      expect(withoutIds(k.body), `attempt ${i}`).toEqual(withoutIds(u.body));
      expect(k.status).toBe(i <= FREE_FAILURES ? 401 : 429);
      if (k.status === 429) {
        expect(k.body.code).toBe('SIGN_IN_PAUSED');
        // the first pause is a minute: the client is told when to come back
        expect(Number(k.headers['retry-after'])).toBeGreaterThan(0);
        expect(Number(k.headers['retry-after'])).toBeLessThanOrEqual(60);
      }
    }
    // paused is paused: the right password waits too, and says nothing more
    const right = await signInFrom(a, ip, known, GOOD_PASSWORD).expect(429);
    const ghost = await signInFrom(a, ip, unknown, GOOD_PASSWORD).expect(429);
    expect(withoutIds(right.body)).toEqual(withoutIds(ghost.body));
  });

  it("lets the owner in from elsewhere while a stranger's guesses are paused", async () => {
    const owner = await signUpAndVerify(a.app, a.dataSource, 'owner');
    for (let i = 0; i < 12; i++) await signInFrom(a, '203.0.113.9', owner.email, `guess-number-${i}`);
    await signInFrom(a, '203.0.113.9', owner.email, GOOD_PASSWORD).expect(429);
    const res = await signInFrom(a, '198.51.100.20', owner.email, GOOD_PASSWORD).expect(200);
    expect(res.body.data.user.email).toBe(owner.email);
    await request(a.app).get('/api/me').auth(res.body.data.accessToken, { type: 'bearer' }).expect(200);
  });

  it('pauses for 1, 2, then 4 minutes, on every API instance sharing the database', async () => {
    expect([0, 1, 2, 3, 4, 5, 6, 7, 20].map(pauseSeconds)).toEqual([0, 0, 0, 0, 0, 60, 120, 240, 3600]);
    const email = uniqueEmail('paused');
    const ip = '192.0.2.44';
    for (let i = 0; i < FREE_FAILURES; i++) await signInFrom(i % 2 ? a : b, ip, email, 'wrong-password-x').expect(401);
    const first = await signInFrom(b, ip, email, 'wrong-password-x').expect(429);
    expect(first.body.detail).toMatch(/wait 1 minute/);
    expect(await pausedFor(email, ip)).toBeGreaterThan(55);

    await endPause(email, ip);
    await signInFrom(b, ip, email, 'wrong-password-x').expect(401);
    expect(await pausedFor(email, ip)).toBeGreaterThan(115);
    expect((await signInFrom(a, ip, email, 'wrong-password-x').expect(429)).body.detail).toMatch(/wait 2 minute/);

    await endPause(email, ip);
    await signInFrom(a, ip, email, 'wrong-password-x').expect(401);
    expect((await signInFrom(b, ip, email, 'wrong-password-x').expect(429)).body.detail).toMatch(/wait 4 minute/);
    // another address from the same IP is not paused
    await signInFrom(b, ip, uniqueEmail('other'), 'wrong-password-x').expect(401);
  });

  it('does not let parallel guesses slip past the pause', async () => {
    const email = uniqueEmail('burst');
    const answers = await Promise.all(Array.from({ length: 12 }, () => signInFrom(a, '192.0.2.77', email, 'wrong-password-x')));
    expect(answers.filter((r) => r.status === 401)).toHaveLength(FREE_FAILURES);
    expect(answers.filter((r) => r.status === 429)).toHaveLength(12 - FREE_FAILURES);
  });
});

describe('account lock', () => {
  it('locks after failures from many addresses, answers like a wrong password, and the e-mailed link lifts it', async () => {
    const owner = await signUpAndVerify(a.app, a.dataSource, 'owner');
    const perIp = FREE_FAILURES - 1;
    for (let n = 0; n < ACCOUNT_LOCK_FAILURES; n++) {
      await signInFrom(a, `10.1.${Math.floor(n / perIp)}.1`, owner.email, `guess-${n}`).expect(401);
    }
    // locked: the right password from a fresh address gets the answer an unknown address gets
    const right = await signInFrom(a, '198.51.100.99', owner.email, GOOD_PASSWORD).expect(401);
    const ghost = await signInFrom(a, '198.51.100.99', uniqueEmail('ghost'), GOOD_PASSWORD).expect(401);
    expect(withoutIds(right.body)).toEqual(withoutIds(ghost.body));
    const [{ n }] = await a.dataSource.query("SELECT COUNT(*) AS n FROM mail_outbox WHERE to_address = ? AND template = 'account-locked'", [owner.email]);
    expect(Number(n)).toBe(1);

    const link = await linkFromMail(a.dataSource, owner.email, 'account-locked');
    await request(a.app).post('/api/auth/reset-password').set(from('198.51.100.99')).send({ token: tokenOf(link), password: 'a-fresh-new-password' }).expect(200);
    await signInFrom(a, '198.51.100.99', owner.email, 'a-fresh-new-password').expect(200);
    // the count started afresh: one more failure does not lock again
    await signInFrom(a, '10.9.9.9', owner.email, 'wrong-password-x').expect(401);
    await signInFrom(a, '10.9.9.10', owner.email, 'a-fresh-new-password').expect(200);
  });
});

describe('invitation acceptance', () => {
  it('checks an existing account’s password through the same throttle as sign-in', async () => {
    const admin = await signUpAndVerify(a.app, a.dataSource, 'partner');
    const orgId = admin.body.data.user.memberships[0]!.organisationId;
    const existing = await signUpAndVerify(a.app, a.dataSource, 'owner');
    await request(a.app).post(`/api/orgs/${orgId}/invitations`).auth(admin.accessToken, { type: 'bearer' }).send({ email: existing.email, role: 'technician' }).expect(201);
    const token = tokenOf(await linkFromMail(a.dataSource, existing.email, 'invitation'));
    const accept = (ip: string, password: string) => request(a.app).post('/api/auth/invitations/accept').set(from(ip)).send({ token, password });

    const ip = '203.0.113.50';
    for (let i = 0; i < FREE_FAILURES; i++) expect((await accept(ip, `guess-number-${i}`).expect(401)).body.code).toBe('INVALID_CREDENTIALS');
    const paused = await accept(ip, GOOD_PASSWORD).expect(429);
    expect(paused.body.code).toBe('SIGN_IN_PAUSED');
    // one throttle: sign-in from that IP waits as well
    await signInFrom(a, ip, existing.email, GOOD_PASSWORD).expect(429);
    // the owner, elsewhere, accepts
    const accepted = await accept('198.51.100.61', GOOD_PASSWORD).expect(200);
    expect(accepted.body.data.user.memberships).toContainEqual(expect.objectContaining({ organisationId: orgId, role: 'technician' }));
  });
});
