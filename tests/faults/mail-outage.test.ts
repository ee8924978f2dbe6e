// Fault: the SMTP server is down when an owner signs up. Nothing may be lost: the message waits
// in the outbox, is delivered exactly once when the server is back, and its link still works.
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { startMailCapture, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createMailTransport, processOutbox } from '../../apps/api/src/mail/outbox';
import { createTestApp, type TestApp } from '../setup/app';
import { GOOD_PASSWORD, tokenOf, uniqueEmail } from '../setup/accounts';

let t: TestApp;
let capture: MailCapture;
beforeAll(async () => {
  t = await createTestApp();
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
});
afterAll(async () => {
  await capture?.stop();
  await t?.close();
});

it('signs up during an SMTP outage and delivers the confirmation exactly once afterwards', async () => {
  const port = capture.smtpPort;
  const transport = createMailTransport(`smtp://127.0.0.1:${port}`);
  const from = 'Emberline <no-reply@emberline.test>';
  const email = uniqueEmail('outage');
  // earlier test files leave unsent mail behind; this test needs the outbox to itself
  await t.dataSource.query('DELETE FROM mail_outbox');
  try {
    await capture.stop();
    await request(t.app).post('/api/auth/sign-up').send({ name: 'Outage Owner', email, password: GOOD_PASSWORD }).expect(202);

    const t0 = new Date();
    const failed = await processOutbox({ dataSource: t.dataSource, transport, from, now: t0 });
    expect(failed.sent).toBe(0);
    const [pending] = await t.dataSource.query('SELECT status, attempts FROM mail_outbox WHERE to_address = ?', [email]);
    expect(pending).toMatchObject({ status: 'pending', attempts: 1 });

    capture = await startMailCapture({ smtpPort: port, httpPort: 0 });
    // past the first backoff step
    await processOutbox({ dataSource: t.dataSource, transport, from, now: new Date(t0.getTime() + 60_000) });
    await processOutbox({ dataSource: t.dataSource, transport, from, now: new Date(t0.getTime() + 600_000) });

    const delivered = capture.messages().filter((m) => m.to.includes(email));
    expect(delivered).toHaveLength(1);
    expect(delivered[0]!.subject).toMatch(/confirm/i);
    const link = delivered[0]!.links.find((l) => l.includes('verify-email'))!;
    const verified = await request(t.app).post('/api/auth/verify-email').send({ token: tokenOf(link) }).expect(200);
    expect(verified.body.data.user.emailVerified).toBe(true);
  } finally {
    transport.close();
  }
});
