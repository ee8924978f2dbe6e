// A job's day in the browser: the owner books and pays Glutwerk Mobil; in the Console the partner
// admin cannot start the job before its window ("Start the job" greyed out, with the time it
// opens); once the appointment has come the job is started, marked as done after a confirmation
// that names the payment taken, and the owner receives the receipt by e-mail.
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import { startMailCapture, type CapturedMail, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { createScheduler, type Scheduler } from '../../apps/api/src/jobs/scheduler';
import { createLogger } from '../../apps/api/src/lib/logger';
import { dbEnv } from '../../scripts/lib/project';
import { appointmentStartsNow } from '../setup/bookings';
import { TEST_CARD } from '../setup/payments';
import { bookUpToPay, payWith } from './booking-steps';
import { DESKTOP, openPage, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
let capture: MailCapture;
let scheduler: Scheduler;
let partnerId = '';

beforeAll(async () => {
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  const mailEnv = { SMTP_URL: `smtp://127.0.0.1:${capture.smtpPort}`, MAIL_INTERVAL_SECONDS: '1' };
  h = await startHarness(mailEnv);
  scheduler = createScheduler({ env: { ...process.env, ...dbEnv(inject('db')), NODE_ENV: 'test', LOG_LEVEL: 'silent', PASSWORD_HASH_COST: '4', ...mailEnv }, logger: createLogger('silent') });
  await scheduler.start();
  const partners = ((await (await fetch(`${h.baseUrl}/api/partners`)).json()) as { data: { id: string; tradingName: string }[] }).data;
  partnerId = partners.find((p) => p.tradingName === 'Glutwerk Mobil')!.id;
});
afterAll(async () => {
  await scheduler?.stop();
  await h?.close();
  await capture?.stop();
});

async function mailTo(to: string, match: (m: CapturedMail) => boolean): Promise<CapturedMail> {
  const until = Date.now() + 45_000;
  while (Date.now() < until) {
    const found = capture.messages().find((m) => m.to.includes(to) && match(m));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no matching e-mail to ${to}; captured: ${JSON.stringify(capture.messages().map((m) => m.subject))}`);
}

it('a job cannot start before its window; started on the day and marked done, the owner gets the receipt', { timeout: 240_000 }, async () => {
  const owner = await openPage(h, DESKTOP);
  await bookUpToPay(owner.page, partnerId, null);
  const back = await payWith(h, owner.page, owner.problems, TEST_CARD.succeeds);
  await owner.page.waitForURL(/\/bookings\/[0-9a-f-]+\?paid=1$/);
  back();
  const bookingId = new URL(owner.page.url()).pathname.split('/').at(-1)!;
  await owner.page.locator('[data-testid="standing"] [data-status="confirmed"]').waitFor({ timeout: 30_000 });
  const [row] = await h.t.dataSource.query('SELECT reference FROM booking WHERE id = ?', [bookingId]);
  const reference = String(row.reference);

  // ---- too early: the button is greyed out and says from when ----
  const partner = await openPage(h, DESKTOP);
  await partner.page.goto(`/console/sign-in?redirect=${encodeURIComponent(`/bookings/${bookingId}`)}`);
  await partner.page.getByLabel('E-mail address').fill('lena@glutwerk.example');
  await partner.page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await partner.page.getByRole('button', { name: 'Sign in' }).last().click();
  await partner.page.getByRole('heading', { name: `Booking ${reference}` }).waitFor();
  const actions = partner.page.getByTestId('booking-actions');
  const start = actions.getByRole('button', { name: 'Start the job' });
  await start.waitFor();
  expect(await start.isDisabled()).toBe(true);
  expect(await partner.page.getByTestId('start-hint').textContent()).toMatch(/You can start this job from .+, on the day of the appointment\./);
  await screenshot(partner.page, 'console-booking-start-too-early-1440');

  // ---- the appointment has come: start, then mark as done after the confirmation ----
  await appointmentStartsNow(h.t.dataSource, bookingId);
  await partner.page.reload();
  await start.waitFor();
  expect(await start.isDisabled()).toBe(false);
  await start.click();
  await partner.page.getByTestId('booking-status').getByText('Under way').waitFor();
  await actions.getByRole('button', { name: 'Mark as done' }).click();
  const dialog = partner.page.getByRole('dialog');
  await dialog.getByText(/This takes .+’s payment of .+ gets the receipt by e-mail\./).waitFor();
  await dialog.getByRole('button', { name: 'Mark as done' }).click();
  await partner.page.getByTestId('booking-status').getByText('Done', { exact: true }).waitFor();
  await screenshot(partner.page, 'console-booking-completed-1440');

  // ---- the owner's receipt (Clara's account reads German) ----
  const receipt = await mailTo('clara@owners.example', (m) => m.subject.includes(reference) && m.subject.startsWith('Auftrag erledigt'));
  expect(receipt.subject).toContain(reference);
  const [paid] = await h.t.dataSource.query('SELECT payment_status FROM booking WHERE id = ?', [bookingId]);
  expect(paid.payment_status).toBe('captured');

  expect(owner.problems).toEqual([]);
  expect(partner.problems).toEqual([]);
  await owner.context.close();
  await partner.context.close();
});
