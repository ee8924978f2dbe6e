// The mail capture server: parsing, JSON API, keeping mail across restarts, busy ports, standalone entry.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { extractLinks, MailCaptureListenError, startMailCapture, type CapturedMail, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createMailTransport } from '../../apps/api/src/mail/outbox';
import { renderMail } from '../../apps/api/src/mail/render';
import { root } from '../../scripts/lib/project';

const tmp = mkdtempSync(path.join(os.tmpdir(), 'emberline-mail-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

async function send(capture: MailCapture, to: string, subject = 'Hello') {
  const transport = createMailTransport(`smtp://127.0.0.1:${capture.smtpPort}`);
  try {
    const mail = renderMail('password-changed', 'en', { name: 'Anna' });
    await transport.sendMail({ from: 'Emberline <no-reply@emberline.test>', to, ...mail, subject, messageId: `<${subject}@emberline.test>`, headers: { 'X-Emberline-Outbox-Id': subject } });
  } finally {
    transport.close();
  }
}

const api = async (capture: MailCapture, pathAndQuery: string, init?: RequestInit) => fetch(`http://127.0.0.1:${capture.httpPort}${pathAndQuery}`, init);

describe('the JSON API', () => {
  let capture: MailCapture;
  beforeAll(async () => {
    capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  });
  afterAll(() => capture.stop());

  it('reports its real ports when started on port 0', async () => {
    expect(capture.smtpPort).toBeGreaterThan(0);
    expect(capture.httpPort).toBeGreaterThan(0);
    const res = await api(capture, '/health');
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ data: { status: 'ok', smtpPort: capture.smtpPort, messages: 0 } });
  });

  it('lists messages newest first, filters by recipient, shows one, and clears them', async () => {
    await send(capture, 'first@example.org', 'one');
    await send(capture, 'Second@Example.org', 'two');

    const all = (await (await api(capture, '/messages')).json()) as { data: CapturedMail[] };
    expect(all.data.map((m) => m.subject)).toEqual(['two', 'one']);
    expect(all.data[0]).toMatchObject({ to: ['second@example.org'], headers: { 'x-emberline-outbox-id': 'two', 'message-id': '<two@emberline.test>' } });
    expect(all.data[0]!.text).toContain('Hello Anna,');
    expect(all.data[0]!.html).toContain('<h1 ');

    const filtered = (await (await api(capture, '/messages?to=SECOND%40example.org')).json()) as { data: CapturedMail[] };
    expect(filtered.data.map((m) => m.subject)).toEqual(['two']);

    const one = await api(capture, `/messages/${all.data[1]!.id}`);
    expect(((await one.json()) as { data: CapturedMail }).data.subject).toBe('one');
    expect((await api(capture, '/messages/no-such-id')).status).toBe(404);

    expect((await api(capture, '/messages', { method: 'DELETE' })).status).toBe(204);
    expect(capture.messages()).toEqual([]);
  });

  it('decodes non-ASCII subjects', async () => {
    await send(capture, 'umlaut@example.org', 'Ihr Passwort wurde geändert – 5 °C');
    expect(capture.messages()[0]!.subject).toBe('Ihr Passwort wurde geändert – 5 °C');
  });
});

describe('extractLinks', () => {
  it('finds http(s) links in HTML and text once each, decoding entities and skipping other schemes', () => {
    const html = '<a href="https://a.test/x?y=1&amp;z=2">go</a> <a href=\'mailto:a@b.test\'>m</a> <a href="http://b.test/">b</a>';
    expect(extractLinks(html, 'see https://a.test/x?y=1&z=2 and https://c.test/path.')).toEqual(['https://a.test/x?y=1&z=2', 'http://b.test/', 'https://c.test/path.']);
  });
});

describe('keeping mail in a file', () => {
  it('loads the captured messages again after a restart', async () => {
    const dataFile = path.join(tmp, 'nested', 'mail.json');
    const first = await startMailCapture({ smtpPort: 0, httpPort: 0, dataFile });
    await send(first, 'kept@example.org', 'kept');
    await first.stop();

    const second = await startMailCapture({ smtpPort: 0, httpPort: 0, dataFile });
    try {
      expect(second.messages().map((m) => m.subject)).toEqual(['kept']);
      await send(second, 'new@example.org', 'new');
      expect(second.messages().map((m) => m.subject)).toEqual(['new', 'kept']);
    } finally {
      await second.stop();
    }
  });
});

describe('busy ports', () => {
  let blocker: net.Server;
  let busyPort: number;
  beforeAll(async () => {
    blocker = net.createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', resolve));
    busyPort = (blocker.address() as net.AddressInfo).port;
  });
  afterAll(() => new Promise<void>((resolve) => blocker.close(() => resolve())));

  it('rejects with a clear error naming the port, and frees the other port', async () => {
    const error = await startMailCapture({ smtpPort: 0, httpPort: busyPort }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(MailCaptureListenError);
    expect(error).toMatchObject({ service: 'HTTP', code: 'EADDRINUSE', port: busyPort });
    expect((error as Error).message).toBe(`The mail capture HTTP port 127.0.0.1:${busyPort} is already in use`);
    await expect(startMailCapture({ smtpPort: busyPort, httpPort: 0 })).rejects.toMatchObject({ service: 'SMTP', code: 'EADDRINUSE' });
  });

  describe('the standalone server', () => {
    const children: ReturnType<typeof spawn>[] = [];
    afterEach(() => {
      for (const child of children.splice(0)) if (child.exitCode === null) child.kill('SIGKILL');
    });

    const start = (env: Record<string, string>) => {
      const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'apps/api/src/fakes/mail/server.ts')], { cwd: root, env: { ...process.env, ...env } });
      children.push(child);
      let output = '';
      child.stdout.on('data', (d) => (output += d));
      child.stderr.on('data', (d) => (output += d));
      const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
      const ready = new Promise<string>((resolve, reject) => {
        child.stdout.on('data', () => output.includes('\n') && resolve(output));
        child.on('exit', () => reject(new Error(output)));
      });
      // only awaited by tests that expect the server to come up
      ready.catch(() => undefined);
      return { child, exited, ready, output: () => output };
    };

    it('prints one line when ready and stops cleanly on SIGTERM', async () => {
      const server = start({ MAIL_CAPTURE_SMTP_PORT: '0', MAIL_CAPTURE_HTTP_PORT: '0' });
      const line = await server.ready;
      expect(line).toMatch(/^Mail capture ready: SMTP smtp:\/\/127\.0\.0\.1:\d+, messages http:\/\/127\.0\.0\.1:\d+\/messages\n$/);
      server.child.kill('SIGTERM');
      expect(await server.exited).toBe(0);
    });

    it('exits non-zero, naming the port and the variable, when a port is in use', async () => {
      const server = start({ MAIL_CAPTURE_SMTP_PORT: String(busyPort), MAIL_CAPTURE_HTTP_PORT: '0' });
      expect(await server.exited).toBe(4);
      expect(server.output()).toContain(`The mail capture SMTP port 127.0.0.1:${busyPort} is already in use`);
      expect(server.output()).toContain('MAIL_CAPTURE_SMTP_PORT');
    });
  });
});
