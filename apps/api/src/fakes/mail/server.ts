// Runs the mail capture server on its own: `node --import tsx apps/api/src/fakes/mail/server.ts`.
import { MailCaptureListenError, startMailCapture } from './capture-server';

function port(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0 || value > 65535) {
    process.stderr.write(`✖ ${name} must be a port number (0–65535), not "${raw}"\n`);
    process.exit(2);
  }
  return value;
}

const smtpPort = port('MAIL_CAPTURE_SMTP_PORT', 2525);
const httpPort = port('MAIL_CAPTURE_HTTP_PORT', 2580);
const dataFile = process.env.MAIL_CAPTURE_FILE || undefined;

try {
  const capture = await startMailCapture({ smtpPort, httpPort, dataFile });
  let stopping = false;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    void capture.stop().finally(() => process.exit(0));
    setTimeout(() => process.exit(0), 3000).unref();
  };
  // handlers first: whoever reads the ready line may send a signal straight away
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  // one line, which the start scripts wait for and people read
  process.stdout.write(
    `Mail capture ready: SMTP smtp://${capture.host}:${capture.smtpPort}, messages http://${capture.host}:${capture.httpPort}/messages` +
      (dataFile ? ` (kept in ${dataFile})` : '') +
      '\n',
  );
} catch (err) {
  if (err instanceof MailCaptureListenError && err.code === 'EADDRINUSE') {
    const variable = err.service === 'SMTP' ? 'MAIL_CAPTURE_SMTP_PORT' : 'MAIL_CAPTURE_HTTP_PORT';
    process.stderr.write(`✖ ${err.message}. Stop the other program (another capture server?) or set ${variable}.\n`);
    process.exit(4);
  }
  process.stderr.write(`✖ The mail capture server could not start: ${(err as Error).message}\n`);
  process.exit(1);
}
