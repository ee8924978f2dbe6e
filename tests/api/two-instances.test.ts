// Two API instances on one MariaDB, as behind a load balancer: a session from one works on the
// other, each scheduled job runs on one instance while the other finds its lock taken, and a change
// through one is in the next search on the other. (Rate limits across instances have their own
// test; search-index.test.ts covers the search index's change log case by case.)
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SEARCH_LIMIT } from '@emberline/domain';
import { enqueueMail, OUTBOX_ID_HEADER, OUTBOX_LOCK, processOutbox, type MailTransport } from '../../apps/api/src/mail/outbox';
import { BOOKING_REMINDERS_LOCK, EXPIRE_HOLDS_LOCK, runBookingReminders, runExpireHolds } from '../../apps/api/src/services/booking-jobs.service';
import { INSURANCE_LOCK, runInsuranceExpiry } from '../../apps/api/src/services/insurance-expiry.service';
import { todayUtc } from '../../apps/api/src/services/onboarding.service';
import { GOOD_PASSWORD, signIn } from '../setup/accounts';
import { createTestApp, type TestApp } from '../setup/app';
import { book, bookablePartner, bookingRequest, bookingRow, deliverWebhooksTo, insertBooking, mails, newOwner, slotStarts, type BookablePartner } from '../setup/bookings';
import { isoDay } from '../setup/files';
import { approvedPartner, bearer } from '../setup/onboarding';
import { startPaymentsFake, type TestPaymentsFake } from '../setup/payments';

const PUBLIC_URL = 'http://emberline.test';
/** The search partner's base: a town no other test file puts anyone in, so the search lists few. */
const KIRUNA = { lat: 67.8558, lng: 20.2253 };

let a: TestApp;
let b: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;

beforeAll(async () => {
  fake = await startPaymentsFake();
  a = await createTestApp(fake.env);
  b = await createTestApp(fake.env);
  deliverWebhooksTo(fake, a.app);
  P = await bookablePartner(a.app, a.dataSource);
}, 120_000);

afterAll(async () => {
  await a?.close();
  await b?.close();
  await fake?.close();
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitUntil(check: () => Promise<boolean>, what: string, ms = 10_000): Promise<void> {
  const until = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`timed out waiting until ${what}`);
    await sleep(20);
  }
}

/**
 * Starts `job` on A and holds it up inside its run (a third connection has locked a row it must
 * write), then runs the same job on B. B must find the job's lock taken and return at once;
 * without the lock it would do the same work, or wait on the same row until the timeout here.
 */
async function onBothAtOnce<R extends { skipped: boolean }>(lock: string, row: { table: 'booking' | 'organisation' | 'mail_outbox'; id: string }, job: (t: TestApp) => Promise<R>) {
  const blocker = a.dataSource.createQueryRunner();
  await blocker.connect();
  await blocker.startTransaction();
  try {
    await blocker.query(`SELECT id FROM ${row.table} WHERE id = ? FOR UPDATE`, [row.id]);
    const runOnA = job(a);
    await waitUntil(async () => (await b.dataSource.query('SELECT IS_USED_LOCK(?) AS holder', [lock]))[0].holder !== null, `A holds ${lock}`);
    const onB = await Promise.race([job(b), sleep(5_000).then(() => 'still running' as const)]);
    await blocker.commitTransaction();
    const onA = await runOnA;
    expect(onB, 'B ran the job while A was running it').not.toBe('still running');
    return { onA, onB: onB as R };
  } finally {
    if (blocker.isTransactionActive) await blocker.rollbackTransaction();
    await blocker.release();
  }
}

describe('two API instances on one database', () => {
  it('accepts on one instance the access token and the refresh cookie issued by the other', async () => {
    const owner = await newOwner(a.app, a.dataSource);
    const session = await signIn(a.app, owner.email, GOOD_PASSWORD);
    const me = await request(b.app).get('/api/me').set(bearer(session)).expect(200);
    expect(me.body.data.id).toBe(owner.userId);
    // rotation is recorded in the database: the cookie B rotated is spent on A too
    const rotated = await request(b.app).post('/api/auth/refresh').set('cookie', session.cookie).expect(200);
    await request(a.app).get('/api/me').set(bearer(rotated.body.data)).expect(200);
    await request(a.app).post('/api/auth/refresh').set('cookie', session.cookie).expect(401);
  });

  it('expire-holds: releases a lapsed hold once, on one instance', async () => {
    const owner = await newOwner(a.app, a.dataSource);
    const [start] = await slotStarts(a.app, P.orgId);
    const held = await book(a.app, owner, bookingRequest(P.orgId, start!));
    expect(held.status, JSON.stringify(held.body)).toBe(201);
    const id: string = held.body.data.id;
    await a.dataSource.query('UPDATE booking SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 60_000), id]);

    const { onA, onB } = await onBothAtOnce(EXPIRE_HOLDS_LOCK, { table: 'booking', id }, (t) => runExpireHolds({ dataSource: t.dataSource, payments: fake.gateway, publicUrl: PUBLIC_URL }));
    expect(onB).toMatchObject({ skipped: true, released: 0 });
    expect(onA.skipped).toBe(false);
    expect(onA.released).toBeGreaterThanOrEqual(1);
    const row = await bookingRow(a.dataSource, id);
    expect(row.status).toBe('released');
    expect(Number((await a.dataSource.query("SELECT COUNT(*) AS n FROM booking_event WHERE booking_id = ? AND to_status = 'released'", [id]))[0].n)).toBe(1);
    expect(fake.state().checkoutSessions.find((s) => s.id === row.checkout_session_id)!.status).toBe('expired');
  });

  it('booking-reminders: sends one reminder, from one instance', async () => {
    const owner = await newOwner(a.app, a.dataSource);
    const soon = await insertBooking(a.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: owner.userId, offerId: P.offerId, start: new Date(Date.now() + 20 * 3_600_000), status: 'confirmed' });

    const { onA, onB } = await onBothAtOnce(BOOKING_REMINDERS_LOCK, { table: 'booking', id: soon.id }, (t) => runBookingReminders({ dataSource: t.dataSource, publicUrl: PUBLIC_URL }));
    expect(onB).toEqual({ sent: 0, skipped: true });
    expect(onA.sent).toBeGreaterThanOrEqual(1);
    expect(await mails(a.dataSource, owner.email, 'booking-reminder')).toHaveLength(1);
  });

  it('insurance-expiry: suspends a partner whose insurance expired once, from one instance', async () => {
    const p = await approvedPartner(a.app, a.dataSource);
    await a.dataSource.query('UPDATE partner_document SET expires_on = ? WHERE id = ?', [isoDay(-1), p.insuranceId]);

    const { onA, onB } = await onBothAtOnce(INSURANCE_LOCK, { table: 'organisation', id: p.orgId }, (t) => runInsuranceExpiry({ dataSource: t.dataSource, today: todayUtc(), publicUrl: PUBLIC_URL }));
    expect(onB).toEqual({ reminders: 0, suspended: 0, skipped: true });
    expect(onA.suspended).toBeGreaterThanOrEqual(1);
    expect((await a.dataSource.query('SELECT status FROM organisation WHERE id = ?', [p.orgId]))[0].status).toBe('suspended');
    expect(Number((await a.dataSource.query("SELECT COUNT(*) AS n FROM audit_log WHERE organisation_id = ? AND action = 'organisation.suspend'", [p.orgId]))[0].n)).toBe(1);
  });

  it('send-mail: sends a queued message once, from one instance', async () => {
    const { id } = await enqueueMail(a.dataSource.manager, { to: 'two-instances@test.example', template: 'verify-email', locale: 'en', data: { name: 'Two', link: `${PUBLIC_URL}/verify-email?token=two-instances-token&app=directory` } });
    // first in line and alone in the batch: mail that other test files queued is left for them
    await a.dataSource.query("UPDATE mail_outbox SET created_at = '2000-01-01 00:00:00' WHERE id = ?", [id]);
    const sent: string[] = [];
    const transport: MailTransport = {
      sendMail: async (mail) => {
        sent.push(String(mail.headers?.[OUTBOX_ID_HEADER]));
        return {};
      },
    };

    const { onA, onB } = await onBothAtOnce(OUTBOX_LOCK, { table: 'mail_outbox', id }, (t) => processOutbox({ dataSource: t.dataSource, transport, from: 'Emberline <no-reply@emberline.test>', batchSize: 1 }));
    expect(onB).toEqual({ sent: 0, retried: 0, failed: 0, skipped: true });
    expect(onA.sent).toBeGreaterThanOrEqual(1);
    expect(sent.filter((x) => x === id)).toHaveLength(1);
    expect(new Set(sent).size, 'no message sent twice').toBe(sent.length);
  });

  it('lists in the next search on one instance a change made through the other, both ways', async () => {
    const S = await bookablePartner(a.app, a.dataSource, { area: { baseLabel: 'Kiruna', baseLat: KIRUNA.lat, baseLng: KIRUNA.lng, mode: 'mobile', radiusKm: 80, workshopAddress: null } });
    const search = (t: TestApp) => request(t.app).get('/api/search').query({ serviceType: 'handset-pairing', ...KIRUNA, mode: 'mobile', limit: SEARCH_LIMIT.max }).expect(200);
    const resultOn = async (t: TestApp) => (await search(t)).body.data.find((r: { partnerId: string }) => r.partnerId === S.orgId) as { labourMinor: number } | undefined;

    expect((await resultOn(b))?.labourMinor).toBe(4500);
    await request(a.app).patch(`/api/orgs/${S.orgId}/offers/${S.offerId}`).set(bearer(S.admin)).send({ priceMinor: 5200 }).expect(200);
    expect((await resultOn(b))?.labourMinor).toBe(5200);

    expect((await resultOn(a))?.labourMinor).toBe(5200);
    await request(b.app).delete(`/api/orgs/${S.orgId}/offers/${S.offerId}`).set(bearer(S.admin)).expect(200);
    expect(await resultOn(a)).toBeUndefined();
  });
});
