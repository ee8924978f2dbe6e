// The one error middleware: RFC 9457 problem details with a stable code, field errors and the
// request id; unknown errors are logged with their cause and masked as 500.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { PROBLEM_CONTENT_TYPE, type ProblemDetails } from '@emberline/domain';
import { HttpError, Internal, MalformedJson, PayloadTooLarge, RouteNotFound } from '../lib/errors';

function fromUnknown(err: unknown): HttpError {
  if (err instanceof HttpError) return err;
  const e = err as { type?: string; status?: number; expose?: boolean };
  // body-parser marks its own errors with a type
  if (e?.type === 'entity.parse.failed') return MalformedJson('Check the JSON syntax of the request body.');
  if (e?.type === 'entity.too.large') return PayloadTooLarge('The request body exceeds the allowed size.');
  if (e?.expose && e.status && e.status >= 400 && e.status < 500) {
    return new HttpError('BAD_REQUEST', e.status, 'The request could not be understood', (err as Error).message);
  }
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
    type: `urn:emberline:problem:${problem.code.toLowerCase().replace(/_/g, '-')}`,
    title: problem.title,
    status: problem.status,
    code: problem.code,
    detail: problem.detail,
    instance: req.originalUrl.split('?')[0],
    errors: problem.errors,
    requestId: requestId || undefined,
  };
  res.status(problem.status).type(PROBLEM_CONTENT_TYPE).send(JSON.stringify(body));
};
