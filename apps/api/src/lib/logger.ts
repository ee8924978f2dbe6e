// One pino logger for the API; request logs add a request id through pino-http.
import { pino, type DestinationStream, type Logger, type LoggerOptions } from 'pino';

export type { Logger };

/** Writes to stdout unless given a `destination` (tests read every line from one). */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options: LoggerOptions = {
    level,
    base: { service: 'emberline-api' },
    redact: { paths: ['req.headers.authorization', 'req.headers.cookie', '*.password'], censor: '[redacted]' },
  };
  return destination ? pino(options, destination) : pino(options);
}
