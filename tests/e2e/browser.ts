// Browser-test harness: the real app serving the built Directory and Console on a random port,
// driven by playwright-core in Debian's Chromium, with axe-core for accessibility checks.
import { createRequire } from 'node:module';
import { mkdirSync } from 'node:fs';
import net, { type AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { expect } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { startPaymentsFake, type TestPaymentsFake } from '../setup/payments';
import { root } from '../../scripts/lib/project';

const require = createRequire(import.meta.url);
export const shotsDir = path.join(root, 'var/screenshots');

export interface Harness {
  t: TestApp;
  baseUrl: string;
  browser: Browser;
  /** The payments fake the app pays through; its webhooks go to this app's /api/payments/webhook. */
  payments: TestPaymentsFake;
  close(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const probe = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

export async function startHarness(env: Record<string, string> = {}): Promise<Harness> {
  // the port is chosen first so that links in e-mails point at this very server
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const payments = await startPaymentsFake({ webhookTarget: `${baseUrl}/api/payments/webhook` });
  const t = await createTestApp({ SERVE_APPS: 'true', PUBLIC_URL: baseUrl, ...payments.env, ...env });
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(port, '127.0.0.1', () => resolve(s));
  });
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  mkdirSync(shotsDir, { recursive: true });
  return {
    t,
    baseUrl,
    browser,
    payments,
    async close() {
      await browser.close();
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await payments.close();
      await t.close();
    },
  };
}

export const DESKTOP = { width: 1440, height: 900 };
export const PHONE = { width: 390, height: 844 };

/** A page that fails the test on any console error or failed same-origin request. */
export async function openPage(h: Harness, viewport = DESKTOP): Promise<{ context: BrowserContext; page: Page; problems: string[] }> {
  // bypassCSP lets the test inject axe-core; the app itself runs under the real policy
  const context = await h.browser.newContext({ viewport, baseURL: h.baseUrl, locale: 'en-GB', bypassCSP: true });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e?.message ?? String(e)} ${e?.stack?.split('\n').slice(0, 3).join(' | ') ?? ''}`.trim()));
  // a request the browser itself cancels because the page moved on (ERR_ABORTED) is not a fault
  page.on('requestfailed', (r) => {
    if (r.failure()?.errorText !== 'net::ERR_ABORTED') problems.push(`request failed: ${r.url()} ${r.failure()?.errorText}`);
  });
  return { context, page, problems };
}

/** axe-core (the reference accessibility engine) run in the page; serious and critical findings fail. */
export async function expectAccessible(page: Page, label: string): Promise<void> {
  await page.addScriptTag({ path: require.resolve('axe-core/axe.min.js') });
  const result = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
  });
  const serious = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(serious.map((v) => `${label}: ${v.id} (${v.help}) at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
}

export async function screenshot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: path.join(shotsDir, `${name}.png`), fullPage: false });
}
