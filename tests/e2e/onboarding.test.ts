// The vetting journey in the browser with real file uploads: a partner applies, a network admin
// requests changes with a note beside a field, the partner fixes it and resubmits, the admin
// approves, and the organisation appears in the public partner list the Directory reads.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { root } from '../../scripts/lib/project';
import { GOOD_PASSWORD, signUpAndVerify } from '../setup/accounts';
import { isoDay, pdfBytes, PNG_BYTES } from '../setup/files';
import { DESKTOP, expectAccessible, openPage, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
const files = path.join(root, 'var/e2e-files');
beforeAll(async () => {
  h = await startHarness();
  mkdirSync(files, { recursive: true });
  writeFileSync(path.join(files, 'insurance.pdf'), pdfBytes('Liability insurance certificate', 'Mobile vehicle work covered'));
  writeFileSync(path.join(files, 'registration.pdf'), pdfBytes('Trade register extract'));
  writeFileSync(path.join(files, 'interface.png'), PNG_BYTES);
});
afterAll(() => h?.close());

async function signInConsole(page: Page, email: string, password: string, to: string) {
  await page.goto(`/console/sign-in?redirect=${encodeURIComponent(to)}`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).last().click();
}

const saveAndContinue = (page: Page) => page.getByRole('button', { name: 'Save and continue' }).click();

it('a partner applies, the admin requests changes, the partner resubmits, the admin approves', async () => {
  const partner = await signUpAndVerify(h.t.app, h.t.dataSource, 'partner', { organisationName: 'Firnglut Service' });
  const tradingName = `Firnglut Service ${partner.email.slice(8, 14)}`;
  const p = await openPage(h, DESKTOP);
  await signInConsole(p.page, partner.email, GOOD_PASSWORD, '/application');
  await p.page.getByRole('heading', { name: 'Your application to the network' }).waitFor();

  // 1 business
  await p.page.getByLabel('Legal name').fill('Firnglut Service e.U.');
  await p.page.getByLabel('Trading name').fill(tradingName);
  await p.page.getByLabel('Country').selectOption('AT');
  await p.page.getByLabel('Street and number').fill('Museumstraße 1');
  await p.page.getByLabel('Postal code').fill('6020');
  await p.page.getByLabel('Town or city').fill('Innsbruck');
  await p.page.getByLabel('VAT ID (optional)').fill('ATU13585627');
  await p.page.getByLabel('Phone').fill('+43 512 123456');
  await screenshot(p.page, 'console-application-business-1440');
  await saveAndContinue(p.page);

  // 2 where they work (coordinates typed; the map is the other way to set them)
  await p.page.getByLabel('Base (place name)').fill('Innsbruck West');
  await p.page.getByLabel('Latitude').fill('47.2692');
  await p.page.getByLabel('Longitude').fill('11.4041');
  await p.page.getByText('Mobile: I drive to the customer').click();
  await p.page.getByLabel('Service radius (km)').fill('80');
  await p.page.locator('.leaflet-container').first().waitFor();
  await screenshot(p.page, 'console-application-area-1440');
  await saveAndContinue(p.page);

  // 3 equipment
  for (const name of ['Vehicle communication interface', 'Digital multimeter with current clamp', 'Battery support unit']) {
    await p.page.getByText(name, { exact: true }).first().click();
  }
  await saveAndContinue(p.page);

  // 4 documents: real uploads, type sniffed on the server
  const insurance = p.page.locator('section[data-kind="insurance"]');
  await insurance.locator('input[type="file"]').setInputFiles(path.join(files, 'insurance.pdf'));
  await insurance.getByLabel('Expires on').fill(isoDay(200));
  await insurance.getByRole('button', { name: 'Upload' }).click();
  await insurance.getByText('insurance.pdf uploaded.').waitFor();
  const registration = p.page.locator('section[data-kind="registration"]');
  await registration.locator('input[type="file"]').setInputFiles(path.join(files, 'registration.pdf'));
  await registration.getByRole('button', { name: 'Upload' }).click();
  await registration.getByText('registration.pdf uploaded.').waitFor();
  await screenshot(p.page, 'console-application-documents-1440');
  await saveAndContinue(p.page);

  // 5 submit
  await p.page.getByText('Everything needed is there.').waitFor();
  await p.page.getByRole('button', { name: 'Submit application' }).first().click();
  await p.page.locator('.ant-popover').getByRole('button', { name: 'Submit application' }).click();
  await p.page.getByText('Application submitted').first().waitFor();

  // the admin asks for a change to the phone number
  const a = await openPage(h, DESKTOP);
  await signInConsole(a.page, 'admin@emberline.example', DEMO_PASSWORD, '/admin/applications');
  await a.page.getByRole('link', { name: tradingName }).click();
  await a.page.locator('.leaflet-container').first().waitFor();
  await screenshot(a.page, 'console-application-review-1440');
  await expectAccessible(a.page, 'application review');
  // the partner's papers can be read in the page (a PDF from an object URL the CSP allows) and saved
  const paper = a.page.getByTestId('document-card').filter({ hasText: 'insurance.pdf' });
  await paper.getByRole('button', { name: 'Show PDF' }).click();
  await paper.locator('iframe').waitFor();
  const [saved] = await Promise.all([a.page.waitForEvent('download'), paper.getByRole('button', { name: 'Download insurance.pdf' }).click()]);
  expect(saved.suggestedFilename()).toBe('insurance.pdf');
  const savedBytes = readFileSync((await saved.path())!);
  expect(savedBytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  await screenshot(a.page, 'console-application-document-1440');
  await a.page.locator('[data-decision="request_changes"]').click();
  await a.page.getByLabel('Message to the partner').fill('Please give a phone number that reaches the workshop.');
  await a.page.getByRole('button', { name: 'Add a note' }).click();
  await a.page.getByLabel('Field', { exact: true }).selectOption('business.phone');
  await a.page.getByLabel('Note', { exact: true }).fill('This number does not answer.');
  await a.page.getByRole('button', { name: 'Send decision' }).click();
  await a.page.locator('.ant-popover').getByRole('button', { name: 'Yes, send' }).click();
  await a.page.getByText('Decision sent.').waitFor();

  // the partner sees the note next to the phone field, fixes it and resubmits
  await p.page.goto('/console/application');
  await p.page.getByText('Changes requested').first().waitFor();
  await p.page.getByText('This number does not answer.').first().waitFor();
  await screenshot(p.page, 'console-application-changes-1440');
  await p.page.getByLabel('Phone').fill('+43 512 654321');
  await saveAndContinue(p.page);
  await saveAndContinue(p.page);
  await saveAndContinue(p.page);
  await saveAndContinue(p.page);
  await p.page.getByRole('button', { name: 'Submit application' }).first().click();
  await p.page.locator('.ant-popover').getByRole('button', { name: 'Submit application' }).click();
  await p.page.getByText('Application submitted').first().waitFor();

  // before approval the public list does not know the partner
  const before = await request(h.t.app).get('/api/partners').expect(200);
  expect(before.body.data.map((x: { tradingName: string }) => x.tradingName)).not.toContain(tradingName);

  await a.page.reload();
  await a.page.locator('[data-decision="approve"]').click();
  await a.page.getByRole('button', { name: 'Send decision' }).click();
  await a.page.locator('.ant-popover').getByRole('button', { name: 'Yes, send' }).click();
  await a.page.getByText('Decision sent.').waitFor();

  const after = await request(h.t.app).get('/api/partners').expect(200);
  const listed = after.body.data.find((x: { tradingName: string }) => x.tradingName === tradingName);
  expect(listed).toMatchObject({ city: 'Innsbruck', country: 'AT', mode: 'mobile', radiusKm: 80 });
  expect(listed.capabilities).toEqual(expect.arrayContaining(['vci-pass-thru', 'digital-multimeter', 'battery-support-unit']));
  expect(p.problems).toEqual([]);
  expect(a.problems).toEqual([]);
  await p.context.close();
  await a.context.close();
}, 180_000);
