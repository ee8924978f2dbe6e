// One pino logger for the API; request logs add a request id through pino-http.
import { pino, type Logger } from 'pino';

export type { Logger };

export function createLogger(level: string): Logger {
  return pino({
    level,
    base: { service: 'emberline-api' },
    redact: { paths: ['req.headers.authorization', 'req.headers.cookie', '*.password'], censor: '[redacted]' },
  });
}
