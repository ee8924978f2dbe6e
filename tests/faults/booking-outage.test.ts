// Fault: MariaDB is killed (SIGKILL, by its pid) while bookings stream in, and the supervisor that
// `npm start` runs starts it again. Every answer is 201 or 503 problem details (never 500), the API
// recovers without a restart, no accepted booking is lost or doubled, and a payment made during
// the outage is applied once the webhook gets through.
import request from 'supertest';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { startMariaDb, superviseMariaDb, type SupervisorEvent } from '../../scripts/lib/mariadb';
import { createTestApp, type TestApp } from '../setup/app';
import { book, bookablePartner, bookingRequest, bookingRow, deliverWebhooksTo, newOwner, slotStarts, type BookablePartner } from '../setup/bookings';
import type { SignedIn } from '../setup/accounts';
import { startPaymentsFake, TEST_CARD, type TestPaymentsFake } from '../setup/payments';
import { eventually, killDb, printFigures } from './fault-helpers';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;
const owners: SignedIn[] = [];
const WORKERS = 4;

beforeAll(async () => {
  // retries that outlast a MariaDB restart (about 1–3 s here), as the provider's hours-long ones do
  fake = await startPaymentsFake({ webhookRetryDelaysMs: [500, 1000, 2000, 4000, 8000] });
  t = await createTestApp(fake.env);
  deliverWebhooksTo(fake, t.app);
  P = await bookablePartner(t.app, t.dataSource);
  for (let i = 0; i < WORKERS; i++) owners.push(await newOwner(t.app, t.dataSource));
}, 120_000);
afterAll(async () => {
  await t?.close();
  await fake?.close();
});

interface Attempt {
  start: string;
  status: number;
  id?: string;
  code?: string;
  retryAfter?: string;
  at: number;
}

it('answers 201 or 503 while MariaDB is killed and restarted, loses and doubles nothing, and settles a payment made meanwhile', async () => {
  const db = inject('db');
  // the slot list gives a few days at a time
  const later = new Date(Date.now() + 6 * 86_400_000).toISOString();
  const listed = [...new Set([...(await slotStarts(t.app, P.orgId, { days: 5 })), ...(await slotStarts(t.app, P.orgId, { from: later, days: 5 }))])].sort();
  // 30-minute jobs: starts at least 30 minutes apart never overlap, so a 409 could only mean a
  // booking that was saved although its answer was lost
  const starts = listed.reduce<string[]>((kept, s) => (kept.length === 0 || Date.parse(s) - Date.parse(kept.at(-1)!) >= 30 * 60_000 ? [...kept, s] : kept), []);
  expect(starts.length).toBeGreaterThan(40);

  // a held booking whose owner pays while the database is down
  const early = await book(t.app, owners[0]!, bookingRequest(P.orgId, starts[0]!)).expect(201);
  const earlyId: string = early.body.data.id;
  const earlySession: string = (await bookingRow(t.dataSource, earlyId)).checkout_session_id;

  const queue = starts.slice(1);
  const attempts: Attempt[] = [];
  const accepted = new Map<string, string>();
  const t0 = Date.now();
  let killedAt = 0;
  let restartedAt = 0;
  let firstAcceptedAfterRestart = 0;
  let acceptedAfterRestart = 0;
  const events: SupervisorEvent[] = [];

  // the supervisor of `npm start`, watching the test server by its pid
  const instance = await startMariaDb(db.dir, db.port);
  const supervisor = superviseMariaDb(instance, {
    checkEveryMs: 100,
    backoffMs: [1000],
    onEvent: (e) => {
      events.push(e);
      if (e.type === 'restarted') restartedAt = Date.now();
    },
  });

  const done = () => queue.length === 0 || acceptedAfterRestart >= 12 || Date.now() - t0 > 45_000;
  async function worker(owner: SignedIn) {
    while (!done()) {
      const start = queue.shift()!;
      const res = await book(t.app, owner, bookingRequest(P.orgId, start));
      const a: Attempt = { start, status: res.status, at: Date.now(), code: res.body?.code, retryAfter: res.headers['retry-after'] };
      attempts.push(a);
      if (res.status === 201) {
        a.id = res.body.data.id;
        accepted.set(a.id!, start);
        if (restartedAt) {
          acceptedAfterRestart += 1;
          firstAcceptedAfterRestart ||= a.at;
        }
      } else if (res.status !== 409) {
        // as a client would: the same start again later (sooner than Retry-After, to keep the test short)
        queue.push(start);
        await new Promise((r) => setTimeout(r, 100));
      }
    }
  }
  async function killer() {
    await eventually(async () => accepted.size >= 8, 30_000, 20);
    await killDb('SIGKILL', db);
    killedAt = Date.now();
    // the owner pays while MariaDB is down: the webhook fails and is retried
    expect(fake.pay(earlySession, TEST_CARD.succeeds).outcome).toBe('succeeded');
  }
  try {
    await Promise.all([killer(), ...owners.map(worker)]);
    await eventually(async () => supervisor.restarts > 0, 30_000, 50);
  } finally {
    await supervisor.stop();
  }
  await fake.idle();

  const statuses = attempts.map((a) => a.status);
  const count = (s: number) => statuses.filter((x) => x === s).length;
  const unavailable = attempts.filter((a) => a.status === 503);
  const earlyRow = await bookingRow(t.dataSource, earlyId);
  const deliveries = fake.state().deliveries.filter((d) => d.type === 'checkout.session.completed');
  printFigures('MariaDB killed while bookings stream in', {
    'booking requests': attempts.length,
    '201 accepted': count(201),
    '503 unavailable': count(503),
    '409 slot taken (saved, answer lost)': count(409),
    'other statuses': statuses.filter((s) => ![201, 409, 503].includes(s)).length,
    'MariaDB down (kill → restarted)': `${restartedAt - killedAt} ms`,
    'recovery (kill → first 201)': `${firstAcceptedAfterRestart - killedAt} ms`,
    'recovery (restart → first 201)': `${firstAcceptedAfterRestart - restartedAt} ms`,
    'supervisor restarts': supervisor.restarts,
    'webhook attempts for the payment made during the outage': deliveries.map((d) => `${d.attempts} (${d.status})`).join(', '),
    'run time': `${Date.now() - t0} ms`,
  });

  expect(killedAt).toBeGreaterThan(0);
  expect(supervisor.restarts).toBe(1);
  expect(events.map((e) => e.type)).toEqual(['died', 'restarting', 'restarted']);
  // never a 500: a request either went through or was told to come back
  expect(statuses.filter((s) => s !== 201 && s !== 503 && s !== 409)).toEqual([]);
  expect(unavailable.length).toBeGreaterThan(0);
  for (const a of unavailable) {
    expect(a.code).toBe('SERVICE_UNAVAILABLE');
    expect(a.retryAfter).toMatch(/^\d+$/);
  }
  // recovered without a restart of the API
  expect(acceptedAfterRestart).toBeGreaterThanOrEqual(1);

  // nothing accepted is lost, nothing is doubled: one live booking per start, each 201 among them
  const rows: { id: string; start_at: Date; status: string }[] = await t.dataSource.query(
    "SELECT id, start_at, status FROM booking WHERE organisation_id = ? AND status <> 'released'",
    [P.orgId],
  );
  const byStart = new Map<string, string[]>();
  for (const r of rows) byStart.set(new Date(r.start_at).toISOString(), [...(byStart.get(new Date(r.start_at).toISOString()) ?? []), r.id]);
  expect([...byStart.values()].filter((ids) => ids.length > 1)).toEqual([]);
  const ids = new Set(rows.map((r) => r.id));
  for (const [id, start] of accepted) {
    expect(ids.has(id), `accepted booking ${id} at ${start}`).toBe(true);
    expect(byStart.get(new Date(start).toISOString())).toEqual([id]);
  }
  // a booking nobody was told about can only be one whose 201 was lost with the connection, and
  // then its owner's retry was told 409 for that start
  const told409 = new Set(attempts.filter((a) => a.status === 409).map((a) => new Date(a.start).toISOString()));
  for (const r of rows) {
    if (r.id === earlyId || accepted.has(r.id)) continue;
    expect(told409.has(new Date(r.start_at).toISOString()), `booking ${r.id} with no 201`).toBe(true);
  }

  // the payment made during the outage is settled: the webhook got through once MariaDB was back
  expect(earlyRow).toMatchObject({ status: 'requested', payment_status: 'authorised' });
  expect(deliveries.length).toBeGreaterThan(0);
  expect(deliveries.every((d) => d.status === 'delivered')).toBe(true);
  expect(Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM payment_event WHERE booking_id = ?', [earlyId]))[0].n)).toBeGreaterThan(0);
  expect((await request(t.app).get('/api/health')).status).toBe(200);
}, 100_000);
