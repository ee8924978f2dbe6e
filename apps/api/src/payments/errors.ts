// Our errors for the payments provider's failures; each is an HttpError, so the error middleware
// turns it into problem details (urn:emberline:problem:payments-unavailable, …) without more code.
import { HttpError } from '../lib/errors';

/** The provider cannot be used right now: unreachable, failing, rate limiting, or refusing our key. */
export class PaymentsUnavailable extends HttpError {
  constructor(
    readonly reason: 'unreachable' | 'provider_error' | 'rate_limited' | 'not_authorised',
    detail = 'The payments provider cannot be reached at the moment. Please try again in a few minutes.',
    readonly providerRequestId?: string,
  ) {
    super('PAYMENTS_UNAVAILABLE', 503, 'Payments are unavailable at the moment', detail);
    this.name = 'PaymentsUnavailable';
  }
}

/** The card was declined; `declineCode` says why (generic_decline, insufficient_funds, …). */
export class PaymentDeclined extends HttpError {
  constructor(
    readonly providerCode: string,
    readonly declineCode: string | undefined,
    detail: string,
  ) {
    super('PAYMENT_DECLINED', 402, 'The card was declined', detail);
    this.name = 'PaymentDeclined';
  }
}

/** The provider refused the change: the payment is in the wrong state, an amount is too large, an id is unknown. */
export class PaymentRejected extends HttpError {
  constructor(
    readonly providerCode: string | undefined,
    detail: string,
    readonly param?: string,
  ) {
    super('PAYMENT_REJECTED', 409, 'The payments provider refused this change', detail);
    this.name = 'PaymentRejected';
  }
}

/** An idempotency key came back with different parameters: a bug in the caller, never retried. */
export class PaymentIdempotencyConflict extends HttpError {
  constructor(detail: string) {
    super('PAYMENT_IDEMPOTENCY_CONFLICT', 409, 'This payment request was already made with different details', detail);
    this.name = 'PaymentIdempotencyConflict';
  }
}

/** A webhook whose signature does not verify (wrong secret, changed body, too old, missing header). */
export class WebhookSignatureInvalid extends HttpError {
  constructor(detail: string) {
    super('WEBHOOK_SIGNATURE_INVALID', 400, 'The webhook signature is not valid', detail);
    this.name = 'WebhookSignatureInvalid';
  }
}
