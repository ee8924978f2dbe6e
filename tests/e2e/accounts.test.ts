// The accounts journey in the browser, with real e-mail: an owner signs up, the confirmation
// arrives in the SMTP capture server (sent by the Bree job from the outbox), and its link
// confirms the account; a partner signs up, invites a technician, the technician accepts and
// sees only that organisation.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startMailCapture, type CapturedMail, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createScheduler, type Scheduler } from '../../apps/api/src/jobs/scheduler';
import { createLogger } from '../../apps/api/src/lib/logger';
import { dbEnv } from '../../scripts/lib/project';
import { GOOD_PASSWORD, uniqueEmail } from '../setup/accounts';
import { TEST_JWT_SECRET } from '../setup/app';
import { profilePath } from './booking-steps';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
let capture: MailCapture;
let scheduler: Scheduler;

beforeAll(async () => {
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  const mailEnv = { SMTP_URL: `smtp://127.0.0.1:${capture.smtpPort}`, MAIL_INTERVAL_SECONDS: '1' };
  h = await startHarness(mailEnv);
  // the sender opens the links' sealed tokens with the key of the app's secret, as the server hands it over
  scheduler = createScheduler({ env: { ...process.env, ...dbEnv(inject('db')), NODE_ENV: 'test', LOG_LEVEL: 'silent', BCRYPT_COST: '4', JWT_SECRET: TEST_JWT_SECRET, ...mailEnv }, logger: createLogger('silent') });
  await scheduler.start();
});
afterAll(async () => {
  await scheduler?.stop();
  await h?.close();
  await capture?.stop();
});

async function mailTo(to: string, subject: RegExp): Promise<CapturedMail> {
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    const found = capture.messages().find((m) => m.to.includes(to) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail to ${to} matching ${subject} arrived in the capture server`);
}

const linkIn = (mail: CapturedMail, route: string) => {
  const link = mail.links.find((l) => l.includes(route));
  expect(link, `a ${route} link in "${mail.subject}"`).toBeDefined();
  return link!;
};

describe('owner', () => {
  it('signs up, receives the confirmation e-mail, and the link confirms the account', async () => {
    const { page, context, problems } = await openPage(h, PHONE);
    const email = uniqueEmail('e2e-owner');
    await page.goto('/sign-up');
    await page.getByLabel('Your name').fill('Ella Owner');
    await page.getByLabel('E-mail address').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(GOOD_PASSWORD);
    await screenshot(page, 'directory-sign-up-390');
    await expectAccessible(page, 'sign-up');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your inbox').first().waitFor();

    const mail = await mailTo(email, /confirm/i);
    expect(mail.html).toContain('Ella Owner');
    expect(mail.text).toContain('/verify-email?token=');
    await page.goto(linkIn(mail, '/verify-email'));
    await page.getByText('Your e-mail address is confirmed').waitFor();
    await screenshot(page, 'directory-verified-390');

    // the link worked once; signed in, the header names the owner even after a reload
    await page.reload();
    await page.getByText('Ella Owner').first().waitFor();
    expect(problems).toEqual([]);
    await context.close();
  });

  it('signs up in the middle of booking, and the confirmation link lands back on the booking step', { timeout: 120_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    const partners = ((await (await fetch(`${h.baseUrl}/api/partners`)).json()) as { data: { id: string; tradingName: string }[] }).data;
    const partnerId = partners.find((p) => p.tradingName === 'Glutwerk Mobil')!.id;
    await page.goto(profilePath(partnerId));
    await page.getByTestId('book-slot').first().click();
    // "Book 10:00" asks a stranger to sign in; she has no account yet
    await page.waitForURL((url) => url.pathname === '/sign-in' && !!url.searchParams.get('redirect')?.startsWith(`/book/${partnerId}?`));
    const bookPath = new URL(page.url()).searchParams.get('redirect')!;
    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-up' && url.searchParams.get('redirect') === bookPath);

    const email = uniqueEmail('e2e-booker');
    await page.getByLabel('Your name').fill('Nora Booker');
    await page.getByLabel('E-mail address').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(GOOD_PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Check your inbox').first().waitFor();

    const link = new URL(linkIn(await mailTo(email, /confirm/i), '/verify-email'));
    expect(link.searchParams.get('next')).toBe(bookPath);
    await page.goto(link.toString());
    // confirmed and signed in: back on the first step, with the time she chose
    await page.waitForURL((url) => `${url.pathname}${url.search}` === bookPath);
    await page.getByRole('heading', { level: 1, name: 'Book Seasonal heater service' }).waitFor();
    await page.getByTestId('slot-local').waitFor();
    await screenshot(page, 'directory-book-after-sign-up-1440');
    await page.getByTestId('slot-continue').click();
    await page.getByTestId('book-details').waitFor();

    expect(problems).toEqual([]);
    await context.close();
  });

  it('cannot sign in with a wrong password and is told so', async () => {
    const { page, context } = await openPage(h, DESKTOP);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail address').fill('clara@owners.example');
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).last().click();
    await page.getByText(/not right/).first().waitFor();
    await screenshot(page, 'directory-sign-in-error-1440');
    await context.close();
  });
});

describe('partner and technician', () => {
  it('a partner signs up and invites a technician, who accepts and sees only that organisation', async () => {
    const partner = await openPage(h, DESKTOP);
    const partnerEmail = uniqueEmail('e2e-partner');
    const business = `Glimmwerk ${partnerEmail.slice(12, 18)}`;
    await partner.page.goto('/console/join');
    await partner.page.getByLabel('Your name').fill('Petra Partner');
    await partner.page.getByLabel('E-mail address').fill(partnerEmail);
    await partner.page.getByLabel('Password', { exact: true }).fill(GOOD_PASSWORD);
    await partner.page.getByLabel('Business name').fill(business);
    await partner.page.getByRole('button', { name: 'Create account' }).click();
    await partner.page.getByText('Check your inbox').first().waitFor();

    const confirm = await mailTo(partnerEmail, /confirm/i);
    await partner.page.goto(linkIn(confirm, '/console/verify-email'));
    await partner.page.getByText('Your e-mail address is confirmed').waitFor();

    await partner.page.goto('/console/team');
    await partner.page.getByRole('heading', { name: 'Team' }).first().waitFor();
    const technicianEmail = uniqueEmail('e2e-tech');
    const invite = partner.page.locator('form').filter({ hasText: 'Send invitation' });
    await invite.getByLabel('E-mail address').fill(technicianEmail);
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await partner.page.getByText(`Invitation sent to ${technicianEmail}`).waitFor();
    await partner.page.getByRole('cell', { name: technicianEmail }).first().waitFor();
    await screenshot(partner.page, 'console-team-1440');
    await expectAccessible(partner.page, 'team page');
    expect(partner.problems).toEqual([]);

    const invitation = await mailTo(technicianEmail, /invit/i);
    const technician = await openPage(h, PHONE);
    await technician.page.goto(linkIn(invitation, '/console/accept-invitation'));
    await technician.page.getByText(business).first().waitFor();
    await technician.page.getByLabel('Your name').fill('Tarek Technician');
    await technician.page.getByLabel('Password', { exact: true }).fill(GOOD_PASSWORD);
    await screenshot(technician.page, 'console-accept-invitation-390');
    await technician.page.getByRole('button', { name: 'Join the team' }).click();
    await technician.page.waitForURL(/\/console\/dashboard$/);

    await technician.page.goto('/console/team');
    await technician.page.getByRole('cell', { name: partnerEmail }).first().waitFor();
    await technician.page.getByRole('cell', { name: technicianEmail }).first().waitFor();
    // a technician sees the team but cannot invite
    expect(await technician.page.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    // only this organisation: the session knows exactly one membership
    const me = await technician.page.evaluate(async () => {
      const refresh = await fetch('/api/auth/refresh', { method: 'POST' });
      return (await refresh.json()) as { data: { user: { memberships: { organisationName: string; role: string }[] } } };
    });
    expect(me.data.user.memberships).toEqual([expect.objectContaining({ organisationName: business, role: 'technician' })]);
    // and a demo organisation's team stays closed to them
    const other = await technician.page.evaluate(async () => {
      const res = await fetch('/api/auth/refresh', { method: 'POST' });
      const token = ((await res.json()) as { data: { accessToken: string } }).data.accessToken;
      const probe = await fetch('/api/orgs/00000000-0000-4000-8000-000000000000/team', { headers: { authorization: `Bearer ${token}` } });
      return probe.status;
    });
    expect(other).toBe(404);
    await screenshot(technician.page, 'console-team-technician-390');
    await technician.context.close();
    await partner.context.close();
  });
});
