// The one error middleware: RFC 9457 problem details with a stable code, field errors and the
// request id; unknown errors are logged with their cause and masked as 500.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { PROBLEM_CONTENT_TYPE, type ProblemDetails } from '@emberline/domain';
import { HttpError, Internal, MalformedJson, MalformedUrl, PayloadTooLarge, RouteNotFound, ServiceUnavailable } from '../lib/errors';

/** Seconds a client should wait before trying again when the database is unreachable. */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

// mysql2's codes (and errno 1040, 1053) for a server that is down, restarting or full; a query the
// server rejected has other codes and stays a 500
const DB_UNREACHABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST', 'PROTOCOL_SEQUENCE_TIMEOUT', 'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR', 'PROTOCOL_ENQUEUE_AFTER_QUIT',
  'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED', 'POOL_CLOSED',
]);
const DB_UNREACHABLE_MESSAGE = /connection lost|closed state|pool is closed|queue limit reached|timeout acquiring|connect etimedout|connection is in closed state/i;

/** True for mysql2/TypeORM errors that say the database cannot be reached, however they are wrapped. */
export function isDatabaseUnreachable(err: unknown): boolean {
  const seen = new Set<unknown>();
  const queue = [err];
  while (queue.length) {
    const e = queue.shift() as { code?: unknown; errno?: unknown; fatal?: unknown; message?: unknown; driverError?: unknown; cause?: unknown; errors?: unknown } | undefined;
    if (!e || typeof e !== 'object' || seen.has(e) || e instanceof HttpError) continue;
    seen.add(e);
    if (typeof e.code === 'string' && DB_UNREACHABLE_CODES.has(e.code)) return true;
    if (e.errno === 1040 || e.errno === 1053) return true;
    // mysql2 marks errors that ended the connection as fatal
    if (e.fatal === true) return true;
    if (typeof e.message === 'string' && DB_UNREACHABLE_MESSAGE.test(e.message)) return true;
    queue.push(e.driverError, e.cause, ...(Array.isArray(e.errors) ? e.errors : []));
  }
  return false;
}

function fromUnknown(err: unknown): HttpError {
  if (err instanceof HttpError) return err;
  const e = err as { type?: string; status?: number; expose?: boolean };
  // body-parser marks its own errors with a type
  if (e?.type === 'entity.parse.failed') return MalformedJson('Check the JSON syntax of the request body.');
  if (e?.type === 'entity.too.large') return PayloadTooLarge('The request body exceeds the allowed size.');
  // the router marks a path parameter it cannot percent-decode with 400, but not as safe to show
  if (err instanceof URIError && e.status === 400) return MalformedUrl('A part of the address is not valid percent-encoded UTF-8.');
  if (e?.expose && e.status && e.status >= 400 && e.status < 500) {
    return new HttpError('BAD_REQUEST', e.status, 'The request could not be understood', (err as Error).message);
  }
  if (isDatabaseUnreachable(err)) return ServiceUnavailable('The database cannot be reached at the moment. Please try again in a few seconds.');
  return Internal('Please try again. If it keeps happening, contact support with the request id.');
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(RouteNotFound(`${req.method} ${req.originalUrl.split('?')[0]} is not part of the Emberline API.`));
};

export const problemDetails: ErrorRequestHandler = (err, req, res, _next) => {
  const problem = fromUnknown(err);
  const requestId = String(req.id ?? '');
  if (problem.status >= 500) req.log?.error({ err }, 'request failed');
  else req.log?.info({ code: problem.code, status: problem.status }, 'request refused');
  const body: ProblemDetails = {
    ...problem.extensions,
    type: `urn:emberline:problem:${problem.code.toLowerCase().replace(/_/g, '-')}`,
    title: problem.title,
    status: problem.status,
    code: problem.code,
    detail: problem.detail,
    instance: req.originalUrl.split('?')[0],
    errors: problem.errors,
    requestId: requestId || undefined,
  };
  // a 503 is temporary by definition: tell clients (and the payments provider's webhooks) when to come back
  const retryAfter = problem.retryAfterSeconds ?? (problem.status === 503 ? DATABASE_RETRY_AFTER_SECONDS : undefined);
  if (retryAfter !== undefined && !res.get('Retry-After')) res.set('Retry-After', String(Math.ceil(retryAfter)));
  res.status(problem.status).type(PROBLEM_CONTENT_TYPE).send(JSON.stringify(body));
};
