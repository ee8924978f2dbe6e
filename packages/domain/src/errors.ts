// The domain's refusals: input a rule cannot work with, as RangeErrors with a stable code.

/** Input outside what a domain rule accepts (a latitude of 95, a fractional amount, a malformed date). */
export class DomainInputError extends RangeError {
  readonly code: string;

  constructor(message: string, code = 'DOMAIN_INPUT') {
    super(message);
    this.name = 'DomainInputError';
    this.code = code;
  }
}

/** Why the VAT treatment of a supply cannot be decided from the data given. */
export type VatUndecidableReason = 'supplier-country-missing' | 'work-country-missing' | 'customer-country-missing' | 'country-unknown';

/** The data does not decide the VAT treatment; the caller must ask for it rather than guess. */
export class VatUndecidableError extends DomainInputError {
  constructor(
    readonly reason: VatUndecidableReason,
    message: string,
  ) {
    super(message, 'VAT_UNDECIDABLE');
    this.name = 'VatUndecidableError';
  }
}
