// One error factory for the API: every failure leaves the server as RFC 9457 problem details.
import type { FieldError } from '@emberline/domain';

export class HttpError extends Error {
  /** Seconds the client should wait before trying again; sent as Retry-After. */
  retryAfterSeconds?: number;
  /** Extension members of the problem details (RFC 9457, 3.2), e.g. `earliestStart`. */
  extensions?: Record<string, string>;

  constructor(
    readonly code: string,
    readonly status: number,
    readonly title: string,
    readonly detail?: string,
    readonly errors?: FieldError[],
  ) {
    super(detail ?? title);
    this.name = 'HttpError';
  }
}

export function createError(code: string, status: number, title: string) {
  return (detail?: string, errors?: FieldError[]) => new HttpError(code, status, title, detail, errors);
}

export const NotFound = createError('NOT_FOUND', 404, 'Not found');
export const RouteNotFound = createError('ROUTE_NOT_FOUND', 404, 'There is no such API route');
export const ValidationFailed = createError('VALIDATION_FAILED', 400, 'Some fields need your attention');
/** The data does not decide the VAT (a country is missing): asked for, never guessed. */
export const VatUndecidable = createError('VAT_UNDECIDABLE', 422, 'The VAT cannot be worked out from what was given');
export const MalformedJson = createError('MALFORMED_JSON', 400, 'The request body is not valid JSON');
export const MalformedUrl = createError('MALFORMED_URL', 400, 'The address is not validly encoded');
export const UnsupportedMediaType = createError('UNSUPPORTED_MEDIA_TYPE', 415, 'The request body is not in a format this route accepts');
export const PayloadTooLarge = createError('PAYLOAD_TOO_LARGE', 413, 'The request body is too large');
export const ServiceUnavailable = createError('SERVICE_UNAVAILABLE', 503, 'The service is temporarily unavailable');
export const Internal = createError('INTERNAL', 500, 'Something went wrong on our side');
