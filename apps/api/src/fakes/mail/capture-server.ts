// Local SMTP capture server for development and tests: keeps every message, parsed, behind a JSON API.
import { randomUUID } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** Lower-case header names; repeated headers joined with ", ". */
  headers: Record<string, string>;
  /** http(s) links found in the HTML and text parts, in order, without duplicates. */
  links: string[];
  /** Attached files; text types (e.g. text/calendar) with their content decoded as UTF-8. */
  attachments?: { filename: string; contentType: string; size: number; text: string | null }[];
}

export interface MailCaptureOptions {
  host?: string;
  /** 0 picks a free port; the chosen one is on the result. */
  smtpPort: number;
  httpPort: number;
  /** JSON file the messages are kept in across restarts (development). */
  dataFile?: string;
  /** Newest messages kept; older ones are dropped. */
  maxMessages?: number;
}

export interface MailCapture {
  host: string;
  smtpPort: number;
  httpPort: number;
  /** Newest first. */
  messages(): CapturedMail[];
  clear(): void;
  stop(): Promise<void>;
}

/** Thrown when a port cannot be bound; `code` is the system's (e.g. EADDRINUSE). */
export class MailCaptureListenError extends Error {
  constructor(
    readonly service: 'SMTP' | 'HTTP',
    readonly host: string,
    readonly port: number,
    readonly code: string | undefined,
    cause: Error,
  ) {
    super(
      code === 'EADDRINUSE'
        ? `The mail capture ${service} port ${host}:${port} is already in use`
        : `The mail capture ${service} server could not listen on ${host}:${port}: ${cause.message}`,
      { cause },
    );
    this.name = 'MailCaptureListenError';
  }
}

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

const decodeEntities = (s: string) =>
  s.replace(/&(#x[0-9a-f]+|#\d+|amp|lt|gt|quot|apos);/gi, (m, e: string) => {
    const lower = e.toLowerCase();
    if (lower.startsWith('#x')) return String.fromCodePoint(parseInt(lower.slice(2), 16));
    if (lower.startsWith('#')) return String.fromCodePoint(parseInt(lower.slice(1), 10));
    return ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" } as Record<string, string>)[lower] ?? m;
  });

export function extractLinks(html: string, text: string): string[] {
  const found: string[] = [];
  for (const m of html.matchAll(/\bhref\s*=\s*(?:"([^"]*)"|'([^']*)')/gi)) found.push(decodeEntities((m[1] ?? m[2] ?? '').trim()));
  for (const m of text.matchAll(/https?:\/\/[^\s<>"')\]]+/gi)) found.push(m[0]);
  return [...new Set(found.filter((l) => /^https?:\/\//i.test(l)))];
}

async function parse(raw: Buffer, envelope: { from: string; to: string[] }): Promise<CapturedMail> {
  const mail = await simpleParser(raw, { skipImageLinks: true });
  const headers: Record<string, string> = {};
  for (const { key, line } of mail.headerLines) {
    // decoded text where mailparser has it (subjects arrive as encoded words), else the raw line unfolded
    const decoded = mail.headers.get(key);
    const value =
      typeof decoded === 'string' ? decoded
      : decoded && typeof decoded === 'object' && 'text' in decoded && typeof decoded.text === 'string' ? decoded.text
      : line.slice(line.indexOf(':') + 1).replace(/\r?\n[ \t]+/g, ' ').trim();
    headers[key] = headers[key] === undefined ? value : `${headers[key]}, ${value}`;
  }
  const html = typeof mail.html === 'string' ? mail.html : '';
  const text = mail.text ?? '';
  return {
    id: randomUUID(),
    receivedAt: new Date().toISOString(),
    from: mail.from?.text || envelope.from,
    to: envelope.to,
    subject: mail.subject ?? '',
    text,
    html,
    headers,
    links: extractLinks(html, text),
    attachments: mail.attachments.map((a) => ({
      filename: a.filename ?? '',
      contentType: a.contentType,
      size: a.size,
      text: a.contentType.startsWith('text/') ? a.content.toString('utf8') : null,
    })),
  };
}

function loadMessages(dataFile: string): CapturedMail[] {
  if (!existsSync(dataFile)) return [];
  try {
    const parsed: unknown = JSON.parse(readFileSync(dataFile, 'utf8'));
    if (!Array.isArray(parsed)) throw new Error('not a JSON array');
    return parsed as CapturedMail[];
  } catch (err) {
    throw new Error(`Cannot read captured mail from ${dataFile} (${(err as Error).message}); delete the file to start afresh`, { cause: err });
  }
}

function listen(server: http.Server | SMTPServer, service: 'SMTP' | 'HTTP', host: string, port: number): Promise<number> {
  const emitter = server as http.Server;
  return new Promise((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => reject(new MailCaptureListenError(service, host, port, err.code, err));
    emitter.once('error', onError);
    const target = service === 'SMTP' ? (server as SMTPServer).server : (server as http.Server);
    target.once('listening', () => {
      emitter.off('error', onError);
      resolve((target.address() as AddressInfo).port);
    });
    server.listen(port, host);
  });
}

export async function startMailCapture(options: MailCaptureOptions): Promise<MailCapture> {
  const host = options.host ?? '127.0.0.1';
  const maxMessages = options.maxMessages ?? 500;
  const { dataFile } = options;
  // newest first, which is the order every reader wants
  let messages: CapturedMail[] = dataFile ? loadMessages(dataFile) : [];

  let writes = Promise.resolve();
  const persist = () => {
    if (!dataFile) return;
    const snapshot = JSON.stringify(messages);
    // one write at a time, through a temporary file, so a crash never leaves half a file
    writes = writes
      .then(async () => {
        await mkdir(path.dirname(dataFile), { recursive: true });
        const tmp = `${dataFile}.${process.pid}.tmp`;
        await writeFile(tmp, snapshot);
        await rename(tmp, dataFile);
      })
      .catch((err: unknown) => {
        process.stderr.write(`mail capture: could not save ${dataFile}: ${(err as Error).message}\n`);
      });
  };

  const smtp = new SMTPServer({
    disabledCommands: ['AUTH', 'STARTTLS'],
    authOptional: true,
    disableReverseLookup: true,
    logger: false,
    size: MAX_MESSAGE_BYTES,
    // stop() should not wait the default 30 s for idle clients
    closeTimeout: 1000,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
        };
        parse(Buffer.concat(chunks), envelope).then(
          (mail) => {
            messages = [mail, ...messages].slice(0, maxMessages);
            persist();
            callback();
          },
          (err: Error) => callback(Object.assign(new Error(`Could not parse the message: ${err.message}`), { responseCode: 554 })),
        );
      });
    },
  });

  const api = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://capture.invalid');
    const send = (status: number, body?: unknown) => {
      res.writeHead(status, body === undefined ? {} : { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
      res.end(body === undefined ? undefined : JSON.stringify(body));
    };
    const one = /^\/messages\/([\w-]+)$/.exec(url.pathname);
    if (req.method === 'GET' && url.pathname === '/health') return send(200, { data: { status: 'ok', smtpPort: capture.smtpPort, messages: messages.length } });
    if (req.method === 'GET' && url.pathname === '/messages') {
      const to = url.searchParams.get('to')?.toLowerCase();
      return send(200, { data: to ? messages.filter((m) => m.to.includes(to)) : messages });
    }
    if (req.method === 'GET' && one) {
      const found = messages.find((m) => m.id === one[1]);
      return found ? send(200, { data: found }) : send(404, { title: 'No captured message with this id', status: 404 });
    }
    if (req.method === 'DELETE' && url.pathname === '/messages') {
      capture.clear();
      return send(204);
    }
    send(404, { title: 'Not found', status: 404 });
  });

  // a client that drops mid-session must not take the capture server down (listen failures
  // still reach listen() below, which has its own listener)
  smtp.on('error', () => undefined);
  const smtpPort = await listen(smtp, 'SMTP', host, options.smtpPort);
  let httpPort: number;
  try {
    httpPort = await listen(api, 'HTTP', host, options.httpPort);
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }

  const capture: MailCapture = {
    host,
    smtpPort,
    httpPort,
    messages: () => [...messages],
    clear() {
      messages = [];
      persist();
    },
    async stop() {
      api.closeAllConnections();
      await Promise.all([
        new Promise<void>((resolve) => smtp.close(() => resolve())),
        new Promise<void>((resolve) => api.close(() => resolve())),
      ]);
      await writes;
    },
  };
  return capture;
}
