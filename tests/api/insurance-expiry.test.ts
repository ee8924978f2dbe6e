// The daily insurance check on the test MariaDB: reminders 30, 7 and 1 days before expiry and on
// the day, each once; suspension once expired; one run at a time across processes.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it, vi } from 'vitest';
import { startMailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createScheduler } from '../../apps/api/src/jobs/scheduler';
import { createLogger } from '../../apps/api/src/lib/logger';
import { reminderThreshold } from '@emberline/domain';
import { INSURANCE_LOCK, runInsuranceExpiry } from '../../apps/api/src/services/insurance-expiry.service';
import { todayUtc } from '../../apps/api/src/services/onboarding.service';
import { dbEnv } from '../../scripts/lib/project';
import { createTestApp, type TestApp } from '../setup/app';
import { isoDay, pdfBytes } from '../setup/files';
import { approvedPartner, bearer, upload } from '../setup/onboarding';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const PUBLIC_URL = 'http://emberline.test';
const today = todayUtc();
const run = (day = today) => runInsuranceExpiry({ dataSource: t.dataSource, today: day, publicUrl: PUBLIC_URL });
const expireIn = (documentId: string, days: number) => t.dataSource.query('UPDATE partner_document SET expires_on = ? WHERE id = ?', [isoDay(days), documentId]);
const mails = async (to: string, template: string): Promise<{ subject: string; text_body: string }[]> =>
  t.dataSource.query('SELECT subject, text_body FROM mail_outbox WHERE to_address = ? AND template = ? ORDER BY created_at, id', [to, template]);
const reminders = async (documentId: string): Promise<number[]> =>
  (await t.dataSource.query('SELECT days_before FROM insurance_reminder WHERE document_id = ? ORDER BY days_before DESC', [documentId])).map((r: { days_before: number }) => r.days_before);
const statusOf = async (orgId: string) => (await t.dataSource.query('SELECT status, status_reason FROM organisation WHERE id = ?', [orgId]))[0];

describe('reminderThreshold', () => {
  it('picks the tightest threshold reached', () => {
    expect([45, 31, 30, 12, 8, 7, 5, 2, 1, 0, -1].map(reminderThreshold)).toEqual([null, null, 30, 30, 30, 7, 7, 7, 1, 0, null]);
  });
});

describe('runInsuranceExpiry', () => {
  it('reminds the partner admins 30, 7 and 1 days before and on the day, once each', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    await expireIn(p.insuranceId, 30);
    await run();
    await run();
    expect(await reminders(p.insuranceId)).toEqual([30]);
    const [first, ...more] = await mails(p.admin.email, 'insurance-expiring');
    expect(more).toEqual([]);
    // dates in the mail language, e.g. "expires on 14 January 2027"
    const expiry = new Intl.DateTimeFormat('en', { dateStyle: 'long', timeZone: 'UTC' }).format(new Date(`${isoDay(30)}T00:00:00Z`));
    expect(first!.subject).toContain(expiry);
    expect(first!.text_body).toContain(`${PUBLIC_URL}/console/application`);

    for (const [day, expected] of [[10, [30]], [23, [30, 7]], [25, [30, 7]], [29, [30, 7, 1]], [30, [30, 7, 1, 0]], [30, [30, 7, 1, 0]]] as const) {
      await run(isoDay(day));
      expect(await reminders(p.insuranceId), `day ${day}`).toEqual(expected);
    }
    expect(await mails(p.admin.email, 'insurance-expiring')).toHaveLength(4);
    expect(await statusOf(p.orgId)).toEqual({ status: 'approved', status_reason: null });
  });

  it('goes by the certificate that runs longest', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    await expireIn(p.insuranceId, 5);
    // the renewal came early: it sends the partner to review, the network approves it again
    const renewal = await upload(t.app, p.admin, p.orgId, { kind: 'insurance', expiresOn: isoDay(400) }, { bytes: pdfBytes('Renewal'), name: 'renewal.pdf' }).expect(201);
    await request(t.app).post(`/api/admin/applications/${p.orgId}/decision`).set(bearer(p.networkAdmin)).send({ decision: 'approve' }).expect(200);
    await run(isoDay(6));
    expect(await reminders(p.insuranceId)).toEqual([]);
    expect(await reminders(renewal.body.data.id)).toEqual([]);
    expect(await statusOf(p.orgId)).toMatchObject({ status: 'approved' });
  });

  it('suspends an approved partner once its insurance has expired, exactly once with concurrent runs', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    const due = await approvedPartner(t.app, t.dataSource);
    await expireIn(p.insuranceId, -1);
    await expireIn(due.insuranceId, 7);
    const results = await Promise.all([run(), run(), run()]);
    expect(results.some((r) => !r.skipped)).toBe(true);

    expect(await statusOf(p.orgId)).toEqual({ status: 'suspended', status_reason: 'insurance expired' });
    const audit: { actor_user_id: string | null; before_state: object; after_state: object }[] = await t.dataSource.query(
      "SELECT actor_user_id, before_state, after_state FROM audit_log WHERE organisation_id = ? AND action = 'organisation.suspend'",
      [p.orgId],
    );
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actor_user_id: null, before_state: { status: 'approved' }, after_state: { status: 'suspended', statusReason: 'insurance expired' } });
    const partnerMails = await mails(p.admin.email, 'organisation-suspended');
    expect(partnerMails).toHaveLength(1);
    expect(partnerMails[0]!.text_body).toContain('insurance expired');
    // the network admins' mail links to the review page of this organisation
    const adminMails = (await mails('admin@emberline.example', 'partner-suspended')).filter((m) => m.text_body.includes(`/console/admin/applications/${p.orgId}`));
    expect(adminMails).toHaveLength(1);
    expect(adminMails[0]!.subject).toBe('Glimmspur Heiztechnik was suspended automatically');
    // the other partner got its 7-day reminder once
    expect(await reminders(due.insuranceId)).toEqual([7]);
    expect(await mails(due.admin.email, 'insurance-expiring')).toHaveLength(1);

    // gone from the Directory; a later run changes nothing
    const listed = await request(t.app).get('/api/partners').expect(200);
    expect(listed.body.data.map((x: { id: string }) => x.id)).not.toContain(p.orgId);
    await run();
    expect(await mails(p.admin.email, 'organisation-suspended')).toHaveLength(1);

    // a new certificate sends it back for review
    await upload(t.app, p.admin, p.orgId, { kind: 'insurance', expiresOn: isoDay(365) }, { bytes: pdfBytes('New'), name: 'new.pdf' }).expect(201);
    expect(await statusOf(p.orgId)).toEqual({ status: 'submitted', status_reason: null });
  });

  it('does nothing while another process holds the lock', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    await expireIn(p.insuranceId, -3);
    const holder = t.dataSource.createQueryRunner();
    await holder.connect();
    try {
      const [row] = await holder.query('SELECT GET_LOCK(?, 0) AS locked', [INSURANCE_LOCK]);
      expect(Number(row.locked)).toBe(1);
      expect(await run()).toEqual({ reminders: 0, suspended: 0, skipped: true });
      expect(await statusOf(p.orgId)).toMatchObject({ status: 'approved' });
    } finally {
      await holder.query('SELECT RELEASE_LOCK(?)', [INSURANCE_LOCK]);
      await holder.release();
    }
    const result = await run();
    expect(result.skipped).toBe(false);
    expect(result.suspended).toBeGreaterThanOrEqual(1);
    expect(await statusOf(p.orgId)).toMatchObject({ status: 'suspended' });
  });

  it('leaves the demo partners alone: their certificates are valid, and the suspended one stays suspended', async () => {
    await run();
    const rows: { name: string; status: string; status_reason: string | null }[] = await t.dataSource.query(
      "SELECT name, status, status_reason FROM organisation WHERE name IN ('Glutwerk Mobil', 'Varmebil Sjælland', 'Brennpunkt Kfz-Elektrik', 'Alpenglut Technik') ORDER BY name",
    );
    expect(rows).toEqual([
      { name: 'Alpenglut Technik', status: 'submitted', status_reason: null },
      { name: 'Brennpunkt Kfz-Elektrik', status: 'suspended', status_reason: 'insurance expired' },
      { name: 'Glutwerk Mobil', status: 'approved', status_reason: null },
      { name: 'Varmebil Sjælland', status: 'approved', status_reason: null },
    ]);
  });
});

describe('the scheduled job', () => {
  it('runs in a Bree worker when the scheduler starts', async () => {
    const p = await approvedPartner(t.app, t.dataSource);
    await expireIn(p.insuranceId, 1);
    const capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
    const scheduler = createScheduler({
      env: { ...dbEnv(inject('db')), NODE_ENV: 'test', LOG_LEVEL: 'silent', DB_POOL_SIZE: '4', SMTP_URL: `smtp://127.0.0.1:${capture.smtpPort}`, INSURANCE_CHECK_INTERVAL_HOURS: '1' },
      logger: createLogger('silent'),
    });
    await scheduler.start();
    try {
      await vi.waitFor(async () => expect(await reminders(p.insuranceId)).toEqual([1]), { timeout: 15_000, interval: 250 });
    } finally {
      await scheduler.stop();
      await capture.stop();
    }
  }, 25_000);
});
