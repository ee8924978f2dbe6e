// Secrets never logged: the one-time tokens of verification, reset, invitation and lock-out mail
// reach only the recipient's inbox, never a log line, the stored outbox or the admin mail logs.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createApp, type EmberlineApp } from '../../apps/api/src/app';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { MailOutboxSecrets1764914130000 } from '../../apps/api/src/db/migrations/1764914130000-mail-outbox-secrets';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { MailOutboxEntity } from '../../apps/api/src/entities/mail-outbox.entity';
import { startMailCapture, type CapturedMail, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createLogger } from '../../apps/api/src/lib/logger';
import { createMailTransport, enqueueMail, processOutbox, type MailTransport } from '../../apps/api/src/mail/outbox';
import { useMailSecretKey } from '../../apps/api/src/mail/secret-data';
import type { LimitSettings } from '../../apps/api/src/middleware/rate-limits';
import { dbEnv } from '../../scripts/lib/project';
import { TEST_JWT_SECRET } from '../setup/app';
import { GOOD_PASSWORD, sessionOf, signIn, uniqueEmail } from '../setup/accounts';

const FROM = 'Emberline <no-reply@emberline.test>';
const roomy = { perIp: 1000, perAccount: 1000, windowMinutes: 60 };
// this file counts tokens, not tries: the limits are tested elsewhere
const LIMITS: Partial<LimitSettings> = { signIn: roomy, signUp: roomy, reset: roomy, invitation: roomy };

/** Every line the API logs, at the most verbose level. */
const logLines: string[] = [];
const logger = createLogger('trace', {
  write: (chunk: string) => void logLines.push(...chunk.split('\n').filter(Boolean)),
});
let app: EmberlineApp;
let dataSource: DataSource;
let capture: MailCapture;
let transport: ReturnType<typeof createMailTransport>;

beforeAll(async () => {
  const config = loadConfig({
    ...dbEnv(inject('db')),
    NODE_ENV: 'test',
    LOG_LEVEL: 'trace',
    SERVE_APPS: 'false',
    DB_POOL_SIZE: '4',
    BCRYPT_COST: '4',
    PUBLIC_URL: 'http://emberline.test',
    RUN_SCHEDULER: 'false',
  });
  dataSource = await createDataSource(config).initialize();
  app = createApp({ config, dataSource, logger, version: 'test', jwtSecret: TEST_JWT_SECRET, limits: LIMITS });
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  transport = createMailTransport(`smtp://127.0.0.1:${capture.smtpPort}`);
  // mail left queued by earlier test files would fill the sender's batches ahead of this file's
  await dataSource.query("DELETE FROM mail_outbox WHERE status = 'pending'");
});

afterAll(async () => {
  transport?.close();
  await capture?.stop();
  await dataSource?.destroy();
});

/** Messages captured after the first `before` ones (the capture lists newest first). */
const newSince = (before: number) => capture.messages().slice(0, capture.messages().length - before);
const bearer = (token: string) => ({ authorization: `Bearer ${token}` });
const tokenIn = (link: string) => new URL(link).searchParams.get('token');

/** Places a token could leak to, snapshotted while the mail waits and again after it went out. */
const surfaces: { where: string; text: string }[] = [];
/** Tokens as the recipients received them, by template. */
const issued = new Map<string, Set<string>>();

async function snapshot(moment: string, admin: string, addresses: string[]): Promise<void> {
  const rows: unknown[] = await dataSource.query('SELECT * FROM mail_outbox');
  surfaces.push({ where: `mail_outbox table ${moment}`, text: JSON.stringify(rows) });
  const all = await request(app).get('/api/admin/mail-log').query({ limit: 500 }).set(bearer(admin)).expect(200);
  surfaces.push({ where: `mail log ${moment}`, text: JSON.stringify(all.body) });
  for (const to of addresses) {
    const mine = await request(app).get('/api/admin/mail-log').query({ to }).set(bearer(admin)).expect(200);
    surfaces.push({ where: `mail log for ${to} ${moment}`, text: JSON.stringify(mine.body) });
  }
  const audit = await request(app).get('/api/admin/audit-log').query({ limit: 500 }).set(bearer(admin)).expect(200);
  surfaces.push({ where: `audit log ${moment}`, text: JSON.stringify(audit.body) });
}

/**
 * Snapshots what is stored, sends the queue through the capture server, snapshots again and
 * returns the newly delivered messages, their tokens recorded.
 */
async function deliver(admin: string, addresses: string[]): Promise<CapturedMail[]> {
  const before = capture.messages().length;
  await snapshot('before sending', admin, addresses);
  await processOutbox({ dataSource, transport, from: FROM, logger });
  await snapshot('after sending', admin, addresses);
  // only this test's people count here
  const delivered = newSince(before).filter((m) => addresses.some((to) => m.to.includes(to)));
  for (const mail of delivered) {
    const template = mail.headers['x-emberline-outbox-id'] ? await templateOf(mail.headers['x-emberline-outbox-id']) : 'unknown';
    for (const link of mail.links) {
      const token = tokenIn(link);
      if (token) issued.set(template, (issued.get(template) ?? new Set()).add(token));
    }
  }
  return delivered;
}

const templateOf = async (id: string) => (await dataSource.getRepository(MailOutboxEntity).findOneByOrFail({ id })).template;

function tokenOfMail(delivered: CapturedMail[], to: string, subject: RegExp): string {
  const mail = delivered.find((m) => m.to.includes(to) && subject.test(m.subject));
  expect(mail, `a mail to ${to} matching ${subject}`).toBeDefined();
  const token = mail!.links.map(tokenIn).find(Boolean);
  expect(token, `a link token in the mail to ${to}`).toBeTruthy();
  return token!;
}

describe('one-time link tokens', () => {
  it('reach only the inbox: not the logs, the outbox, the mail log or the audit log', async () => {
    const admin = (await signIn(app, 'admin@emberline.example', DEMO_PASSWORD)).accessToken;
    const owner = uniqueEmail('secret-owner');
    const partner = uniqueEmail('secret-partner');
    const technician = uniqueEmail('secret-tech');
    const addresses = [owner, partner, technician];

    // sign-up: verification links for an owner and a partner admin
    await request(app).post('/api/auth/sign-up').send({ name: 'Secret Owner', email: owner, password: GOOD_PASSWORD }).expect(202);
    await request(app).post('/api/auth/partner-sign-up').send({ name: 'Secret Partner', email: partner, password: GOOD_PASSWORD, organisationName: `Org ${partner}` }).expect(202);
    let delivered = await deliver(admin, addresses);
    await request(app).post('/api/auth/verify-email').send({ token: tokenOfMail(delivered, owner, /confirm/i) }).expect(200);
    const partnerAdmin = sessionOf(await request(app).post('/api/auth/verify-email').send({ token: tokenOfMail(delivered, partner, /confirm/i) }).expect(200), partner);
    const orgId = partnerAdmin.body.data.user.memberships[0]!.organisationId;

    // invitation: previewed (the token in the path) and accepted
    await request(app).post(`/api/orgs/${orgId}/invitations`).set(bearer(partnerAdmin.accessToken)).send({ email: technician, role: 'technician' }).expect(201);
    delivered = await deliver(admin, addresses);
    const invitation = tokenOfMail(delivered, technician, /invit|join/i);
    await request(app).get(`/api/auth/invitations/${invitation}`).expect(200);
    await request(app).post('/api/auth/invitations/accept').send({ token: invitation, name: 'Secret Technician', password: GOOD_PASSWORD }).expect(200);

    // forgotten password: the reset link works once
    await request(app).post('/api/auth/forgot-password').send({ email: owner }).expect(202);
    delivered = await deliver(admin, addresses);
    const reset = tokenOfMail(delivered, owner, /reset/i);
    await request(app).post('/api/auth/reset-password').send({ token: reset, password: 'autumn-spark-lid-77' }).expect(200);
    await signIn(app, owner, 'autumn-spark-lid-77');

    for (const template of ['verify-email', 'invitation', 'reset-password']) expect(issued.get(template)?.size, `tokens of ${template} mail`).toBeGreaterThan(0);
    const tokens = [...issued.values()].flatMap((set) => [...set]);
    expect(tokens.every((token) => token.length >= 32)).toBe(true);

    const leaks = [
      ...logLines.map((text, i) => ({ where: `log line ${i + 1}`, text })),
      ...surfaces,
    ].flatMap(({ where, text }) => tokens.filter((token) => text.includes(token)).map((token) => `${where}: …${text.slice(Math.max(0, text.indexOf(token) - 60), text.indexOf(token) + 50)}…`));
    expect(leaks).toEqual([]);
    // and the log is not empty: the invitation preview was logged, its token redacted
    expect(logLines.length).toBeGreaterThan(20);
    expect(logLines.some((line) => line.includes('/api/auth/invitations/[redacted]'))).toBe(true);

    // the mail log still shows each message, its link with the token redacted
    const log = await request(app).get('/api/admin/mail-log').query({ to: technician }).set(bearer(admin)).expect(200);
    const invitationEntry = log.body.data.find((m: { template: string }) => m.template === 'invitation');
    expect(invitationEntry.text).toContain('accept-invitation?token=[redacted]');
    expect(invitationEntry.html).toContain('accept-invitation?token=[redacted]');
  }, 60_000);
});

describe('sealed link data in the outbox', () => {
  const LINK = 'https://emberline.test/reset-password?token=sealed-token-0123456789abcdefghijklmnop';
  const enqueueReset = (to: string) => enqueueMail(dataSource.manager, { to, template: 'reset-password', locale: 'en', data: { name: 'Ada', link: LINK, minutes: 30 } });
  const stored = (id: string) => dataSource.getRepository(MailOutboxEntity).findOneByOrFail({ id });

  it('is stored sealed, sent with the real link, and wiped once sent', async () => {
    const row = await enqueueReset(uniqueEmail('sealed'));
    const pending = await stored(row.id);
    expect(pending.secretData).toMatch(/^v1\./);
    expect(JSON.stringify(pending)).not.toContain('sealed-token');
    expect(pending.templateData).toMatchObject({ name: 'Ada', link: 'https://emberline.test/reset-password?token=[redacted]', minutes: 30 });
    expect(pending.text).toContain('reset-password?token=[redacted]');
    expect(pending.html).toContain('reset-password?token=[redacted]');

    const before = capture.messages().length;
    await processOutbox({ dataSource, transport, from: FROM });
    const mail = newSince(before).find((m) => m.headers['x-emberline-outbox-id'] === row.id);
    expect(mail?.links).toEqual([LINK]);
    expect(mail?.text).toContain(LINK);
    const sent = await stored(row.id);
    expect(sent).toMatchObject({ status: 'sent', secretData: null });
    expect(sent.text).toContain('reset-password?token=[redacted]');
  });

  it('covers the lock-out mail’s reset link too', async () => {
    const row = await enqueueMail(dataSource.manager, { to: uniqueEmail('locked'), template: 'account-locked', locale: 'de', data: { name: 'Ada', minutes: 1440, resetLink: LINK } });
    const pending = await stored(row.id);
    expect(JSON.stringify(pending)).not.toContain('sealed-token');
    expect(pending.templateData).toMatchObject({ resetLink: 'https://emberline.test/reset-password?token=[redacted]' });
    const before = capture.messages().length;
    await processOutbox({ dataSource, transport, from: FROM });
    expect(newSince(before).find((m) => m.headers['x-emberline-outbox-id'] === row.id)?.links).toEqual([LINK]);
    expect(await stored(row.id)).toMatchObject({ status: 'sent', secretData: null });
  });

  it('is wiped when the sender gives up, and a seal made under another secret fails at once', async () => {
    const refused = await enqueueReset(uniqueEmail('refused'));
    const failing: MailTransport = { sendMail: async () => Promise.reject(Object.assign(new Error(`550 no such user (${LINK})`), { code: 'EENVELOPE', responseCode: 550 })) };
    await dataSource.getRepository(MailOutboxEntity).update({ id: refused.id }, { attempts: 7 });
    await processOutbox({ dataSource, transport: failing, from: FROM });
    const gaveUp = await stored(refused.id);
    expect(gaveUp).toMatchObject({ status: 'failed', secretData: null });
    expect(gaveUp.lastError).toContain('550');
    expect(gaveUp.lastError).not.toContain('sealed-token');

    // queued by an instance with another server secret: no retry could ever open it
    const other = await createDataSource(loadConfig({ ...dbEnv(inject('db')), NODE_ENV: 'test', DB_POOL_SIZE: '2' })).initialize();
    try {
      useMailSecretKey(other, 'another-server-secret-another-server-secret');
      const foreign = await enqueueMail(other.manager, { to: uniqueEmail('foreign'), template: 'verify-email', locale: 'en', data: { name: 'Ada', link: LINK } });
      const before = capture.messages().length;
      await processOutbox({ dataSource, transport, from: FROM });
      expect(newSince(before).filter((m) => m.headers['x-emberline-outbox-id'] === foreign.id)).toEqual([]);
      expect(await stored(foreign.id)).toMatchObject({ status: 'failed', secretData: null });
    } finally {
      await other.destroy();
    }
  });

  it('is bound to its row: copied onto a message to someone else it does not open', async () => {
    const victim = await enqueueReset(uniqueEmail('victim'));
    const attacker = await enqueueReset(uniqueEmail('attacker'));
    const { secretData } = await stored(victim.id);
    await dataSource.getRepository(MailOutboxEntity).update({ id: attacker.id }, { secretData });
    const before = capture.messages().length;
    await processOutbox({ dataSource, transport, from: FROM });
    const delivered = newSince(before);
    expect(delivered.filter((m) => m.headers['x-emberline-outbox-id'] === attacker.id)).toEqual([]);
    expect(delivered.find((m) => m.headers['x-emberline-outbox-id'] === victim.id)?.links).toEqual([LINK]);
    expect(await stored(attacker.id)).toMatchObject({ status: 'failed', secretData: null });
  });
});

describe('rows queued before tokens were redacted', () => {
  const legacyLink = (n: number) => `https://emberline.test/reset-password?token=legacy-token-${n}-0123456789abcdefghijklmnopqrstu`;
  const legacyRow = (status: string, n: number) => {
    const link = legacyLink(n);
    return [randomUUID(), uniqueEmail(`legacy-${status}`), 'reset-password', 'en', 'Reset your Emberline password', `Hello,\n\nChoose a new password:\n${link}\n`, `<a href="${link}">${link}</a>`, status];
  };

  it('are redacted by the migration once finished; pending ones go out with their link, then are redacted', async () => {
    const runner = dataSource.createQueryRunner();
    const migration = new MailOutboxSecrets1764914130000();
    const rows = [legacyRow('sent', 1), legacyRow('failed', 2), legacyRow('pending', 3)];
    await runner.connect();
    try {
      await migration.down(runner);
      try {
        for (const row of rows) {
          await runner.query('INSERT INTO mail_outbox (id, to_address, template, locale, subject, text_body, html_body, status, next_attempt_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, CURRENT_TIMESTAMP(3))', row);
        }
      } finally {
        await migration.up(runner);
      }
    } finally {
      await runner.release();
    }
    const [sent, failed, pending] = await Promise.all(rows.map((row) => dataSource.getRepository(MailOutboxEntity).findOneByOrFail({ id: row[0]! })));
    for (const row of [sent!, failed!]) {
      expect(`${row.text}${row.html}`).not.toContain('legacy-token');
      expect(row.text).toContain('reset-password?token=[redacted]');
      expect(row.html).toContain('reset-password?token=[redacted]');
    }
    expect(pending!.text).toContain(legacyLink(3));

    // the mail log shows the waiting one redacted all the same
    const admin = (await signIn(app, 'admin@emberline.example', DEMO_PASSWORD)).accessToken;
    const log = await request(app).get('/api/admin/mail-log').query({ to: pending!.to }).set(bearer(admin)).expect(200);
    expect(JSON.stringify(log.body)).not.toContain('legacy-token');
    expect(log.body.data[0].text).toContain('reset-password?token=[redacted]');

    const before = capture.messages().length;
    await processOutbox({ dataSource, transport, from: FROM });
    expect(newSince(before).find((m) => m.headers['x-emberline-outbox-id'] === pending!.id)?.links).toEqual([legacyLink(3)]);
    const after = await dataSource.getRepository(MailOutboxEntity).findOneByOrFail({ id: pending!.id });
    expect(after.status).toBe('sent');
    expect(`${after.text}${after.html}`).not.toContain('legacy-token');
  });
});
