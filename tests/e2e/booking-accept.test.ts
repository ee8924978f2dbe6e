// The whole booking with real e-mail: Clara books Glutwerk Mobil (auto-confirm switched off for
// this run) and pays with a test card; the booking waits for the partner; Lena accepts it in the
// Console; Clara's page shows it confirmed, and the confirmation e-mail, sent by the Bree job
// through the SMTP capture server, carries the .ics invitation (RFC 5545: VCALENDAR/VEVENT with
// DTSTART in UTC matching the booking's start).
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { startMailCapture, type CapturedMail, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { createScheduler, type Scheduler } from '../../apps/api/src/jobs/scheduler';
import { createLogger } from '../../apps/api/src/lib/logger';
import { dbEnv } from '../../scripts/lib/project';
import { TEST_CARD } from '../setup/payments';
import { bookUpToPay, payWith } from './booking-steps';
import { DESKTOP, expectAccessible, openPage, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
let capture: MailCapture;
let scheduler: Scheduler;
let partnerId = '';

beforeAll(async () => {
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  const mailEnv = { SMTP_URL: `smtp://127.0.0.1:${capture.smtpPort}`, MAIL_INTERVAL_SECONDS: '1' };
  h = await startHarness(mailEnv);
  scheduler = createScheduler({ env: { ...process.env, ...dbEnv(inject('db')), NODE_ENV: 'test', LOG_LEVEL: 'silent', BCRYPT_COST: '4', ...mailEnv }, logger: createLogger('silent') });
  await scheduler.start();
  const partners = ((await (await fetch(`${h.baseUrl}/api/partners`)).json()) as { data: { id: string; tradingName: string }[] }).data;
  partnerId = partners.find((p) => p.tradingName === 'Glutwerk Mobil')!.id;
  // the partner answers each request itself in this run
  await h.t.dataSource.query('UPDATE organisation SET auto_confirm_bookings = 0 WHERE id = ?', [partnerId]);
});
afterAll(async () => {
  await h?.t.dataSource.query('UPDATE organisation SET auto_confirm_bookings = 1 WHERE id = ?', [partnerId]).catch(() => undefined);
  await scheduler?.stop();
  await h?.close();
  await capture?.stop();
});

async function mailTo(to: string, subject: RegExp, also: (m: CapturedMail) => boolean = () => true): Promise<CapturedMail> {
  const until = Date.now() + 45_000;
  while (Date.now() < until) {
    const found = capture.messages().find((m) => m.to.includes(to) && subject.test(m.subject) && also(m));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  const outbox: { subject: string; status: string; last_error: string | null }[] = await h.t.dataSource.query('SELECT subject, status, last_error FROM mail_outbox WHERE to_address = ? ORDER BY created_at', [to]).catch((e: Error) => [{ subject: e.message, status: '?', last_error: null }]);
  throw new Error(`no e-mail to ${to} matching ${subject} arrived in the capture server; outbox: ${JSON.stringify(outbox)}; captured: ${JSON.stringify(capture.messages().map((m) => m.subject))}`);
}

it('an owner books and pays, the partner accepts in the Console, the owner sees it confirmed and gets the .ics', { timeout: 240_000 }, async () => {
  // ---- the owner books and pays: the booking now waits for the partner ----
  const owner = await openPage(h, DESKTOP);
  await bookUpToPay(owner.page, partnerId, null);
  const back = await payWith(h, owner.page, owner.problems, TEST_CARD.succeeds);
  await owner.page.waitForURL(/\/bookings\/[0-9a-f-]+\?paid=1$/);
  back();
  await owner.page.getByRole('heading', { level: 1, name: /waiting for Glutwerk Mobil to accept/ }).waitFor({ timeout: 30_000 });
  expect(await owner.page.locator('[data-testid="standing"] [data-status]').getAttribute('data-status')).toBe('requested');
  const bookingId = new URL(owner.page.url()).pathname.split('/').at(-1)!;
  const [row] = await h.t.dataSource.query('SELECT reference, start_at FROM booking WHERE id = ?', [bookingId]);
  const reference = String(row.reference);
  // Clara's account reads German: match the reference, not the wording
  const received = await mailTo('clara@owners.example', new RegExp(reference));
  expect(received.attachments ?? []).toEqual([]);

  // ---- the partner admin accepts it in the Console ----
  const partner = await openPage(h, DESKTOP);
  await partner.page.goto(`/console/sign-in?redirect=${encodeURIComponent(`/bookings/${bookingId}`)}`);
  await partner.page.getByLabel('E-mail address').fill('lena@glutwerk.example');
  await partner.page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await partner.page.getByRole('button', { name: 'Sign in' }).last().click();
  await partner.page.getByRole('heading', { name: `Booking ${reference}` }).waitFor();
  const actions = partner.page.getByTestId('booking-actions');
  await actions.getByRole('button', { name: 'Accept' }).click();
  await partner.page.getByTestId('booking-status').getByText('Confirmed').waitFor();
  await screenshot(partner.page, 'console-booking-accepted-1440');
  await expectAccessible(partner.page, 'accepted booking');

  // ---- the owner sees it confirmed ----
  await owner.page.goto(`/bookings/${bookingId}`);
  await owner.page.getByRole('heading', { level: 1, name: /Your booking is confirmed/ }).waitFor();
  expect(await owner.page.locator('[data-testid="standing"] [data-status]').getAttribute('data-status')).toBe('confirmed');
  await screenshot(owner.page, 'directory-booking-accepted-1440');

  // ---- and has the confirmation e-mail with the calendar invitation ----
  const isIcs = (a: { filename: string; contentType: string }) => a.contentType.startsWith('text/calendar') || a.filename.endsWith('.ics');
  const mail = await mailTo('clara@owners.example', new RegExp(reference), (m) => (m.attachments ?? []).some(isIcs));
  const ics = (mail.attachments ?? []).find(isIcs);
  expect(ics, 'an .ics attachment').toBeDefined();
  const text = ics!.text!;
  // RFC 5545 §3.4/§3.6: a VCALENDAR object holding one VEVENT
  expect(text).toMatch(/^BEGIN:VCALENDAR\r?\n/);
  expect(text).toMatch(/BEGIN:VEVENT[\s\S]*END:VEVENT/);
  // RFC 5545 §3.3.5: DTSTART as a UTC date-time (form #2, trailing Z) at the booking's start
  const start = new Date(row.start_at as string | Date);
  const utc = start.toISOString().replace(/[-:]/g, '').replace(/\.\d{3}Z$/, 'Z');
  expect(text).toContain(`DTSTART:${utc}`);

  expect(owner.problems).toEqual([]);
  expect(partner.problems).toEqual([]);
  await owner.context.close();
  await partner.context.close();
});
