// The quote: labour + parts kit + travel, each line with VAT, in integer minor units, through
// dinero.js. Which VAT applies is the case table of vat-rules.ts (Council Directive 2006/112/EC).
// Input outside the rules (fractional amounts, a commission below 0, totals beyond 2^53) is
// refused with a DomainInputError. Rounding: VAT is computed per line and rounded
// half up to the currency's minor unit (commercial rounding); totals are sums of rounded lines.
import { add, allocate, dinero, halfUp, multiply, toSnapshot, transformScale, type Dinero, type DineroCurrency } from 'dinero.js';
import { DomainInputError } from '../errors';
import { currencyExponent } from '../money/units';
import { CancellationSchema, CURRENCIES, DepositSchema, type Cancellation, type Currency, type Deposit } from '../schemas/offers';
import { partnerShareLines } from './partner-share';
import type { VatRateEntry } from './vat-rates';
import { vatTreatment, type Customer, type VatOutcome, type VatSupply } from './vat-rules';

/** ISO 4217 minor units of the currencies we price in (2 for each; checked against currency-codes). */
export const CURRENCY_MINOR_UNITS = Object.freeze(Object.fromEntries(CURRENCIES.map((c) => [c, currencyExponent(c)]))) as Readonly<Record<Currency, number>>;

const currencyOf = (code: Currency): DineroCurrency<number> => ({ code, base: 10, exponent: CURRENCY_MINOR_UNITS[code] });

export type QuoteLineKind = 'labour' | 'parts' | 'travel';

export interface QuoteInput {
  currency: Currency;
  lines: ReadonlyArray<{ kind: QuoteLineKind; description: string; netMinor: number }>;
  /** Where the work is physically done (the owner's place or the workshop), ISO alpha-2; a consumer's quote needs it. */
  workCountry?: VatSupply['workCountry'];
  /** Where the partner is established, ISO alpha-2; never guessed (VatUndecidableError when missing). */
  supplierCountry: VatSupply['supplierCountry'];
  customer: Customer;
  /** The day of the work, YYYY-MM-DD: the rate in force then applies. */
  supplyDate: string;
  deposit: Deposit;
  cancellation: Cancellation;
  /** Platform commission on labour and travel, basis points (12 % = 1200). */
  commissionBp: number;
  /** Estimate of the payment processing fee: a share of the gross plus a fixed amount. */
  processingFee: { percentBp: number; fixedMinor: number };
  rates?: readonly VatRateEntry[];
}

export interface QuoteLine {
  kind: QuoteLineKind;
  description: string;
  netMinor: number;
  vatRateBp: number;
  vatMinor: number;
  grossMinor: number;
}

export interface Quote {
  currency: Currency;
  minorUnits: number;
  lines: QuoteLine[];
  netMinor: number;
  vatMinor: number;
  grossMinor: number;
  vat: VatOutcome;
  /** Due at booking; the rest on completion. */
  depositMinor: number;
  /** Free until `freeUntilHours` before the start, then `feeMinor` (never more than the gross). */
  cancellation: { freeUntilHours: number; feeMinor: number };
  /** The share is the net less commission and fee estimate (`partnerShareLines`); the VAT stays the partner's to declare. */
  partner: { commissionBp: number; commissionMinor: number; partnerShareMinor: number; processingFeeEstimateMinor: number };
}

const amountOf = (d: Dinero<number>) => toSnapshot(d).amount;

/** `minor × bp / 10 000`, rounded half up to the currency's minor unit. */
function shareOf(currency: Currency, minor: number, bp: number): number {
  // dinero.js multiplies in plain numbers: beyond 2^53 the product silently loses units
  if (!Number.isSafeInteger(minor * bp)) throw new DomainInputError(`${minor} × ${bp} basis points is beyond what whole numbers hold exactly (2^53)`);
  const d = dinero({ amount: minor, currency: currencyOf(currency) });
  return amountOf(transformScale(multiply(d, { amount: bp, scale: 4 }), CURRENCY_MINOR_UNITS[currency], halfUp));
}

function assertMinor(label: string, v: number): void {
  if (!Number.isSafeInteger(v) || v < 0) throw new DomainInputError(`${label} must be a whole number of minor units ≥ 0, got ${v}`);
}

function assertBasisPoints(label: string, v: number): void {
  if (!Number.isInteger(v) || v < 0 || v > 10_000) throw new DomainInputError(`${label} must be whole basis points from 0 to 10 000 (0 to 100 %), got ${v}`);
}

/** The offer's terms through the same schemas that check the offer form, so a quote cannot hold what an offer could not. */
function assertTerms(input: Pick<QuoteInput, 'deposit' | 'cancellation' | 'commissionBp' | 'processingFee'>): void {
  const deposit = DepositSchema.safeParse(input.deposit);
  if (!deposit.success) throw new DomainInputError(`deposit: ${deposit.error.issues[0]?.message ?? 'not valid'}`);
  const cancellation = CancellationSchema.safeParse(input.cancellation);
  if (!cancellation.success) throw new DomainInputError(`cancellation: ${cancellation.error.issues[0]?.message ?? 'not valid'}`);
  assertBasisPoints('commission', input.commissionBp);
  assertBasisPoints('processing fee share', input.processingFee.percentBp);
  assertMinor('processing fee fixed amount', input.processingFee.fixedMinor);
}

export function computeQuote(input: QuoteInput): Quote {
  const currency = input.currency;
  const exponent = CURRENCY_MINOR_UNITS[currency];
  if (exponent === undefined) throw new RangeError(`Unknown currency ${currency}`);
  input.lines.forEach((l, i) => assertMinor(`line ${i + 1}`, l.netMinor));
  assertTerms(input);
  const vat = vatTreatment(input);

  const lines: QuoteLine[] = input.lines.map((l) => {
    const vatMinor = shareOf(currency, l.netMinor, vat.rateBp);
    return { kind: l.kind, description: l.description, netMinor: l.netMinor, vatRateBp: vat.rateBp, vatMinor, grossMinor: l.netMinor + vatMinor };
  });
  const zero = dinero({ amount: 0, currency: currencyOf(currency) });
  const sum = (pick: (l: QuoteLine) => number) => amountOf(lines.reduce((acc, l) => add(acc, dinero({ amount: pick(l), currency: currencyOf(currency) })), zero));
  const netMinor = sum((l) => l.netMinor);
  const vatMinor = sum((l) => l.vatMinor);
  const grossMinor = sum((l) => l.grossMinor);
  // a sum past 2^53 rounds to a float that is no longer a whole number of units
  if (!Number.isSafeInteger(grossMinor)) throw new DomainInputError(`The total is beyond what whole numbers hold exactly (2^53 minor units)`);

  let depositMinor = 0;
  // the offer form keeps a fixed deposit within the price, so one above the total is a bad input
  if (input.deposit.kind === 'fixed' && input.deposit.amountMinor > grossMinor) throw new DomainInputError(`The deposit (${input.deposit.amountMinor}) is more than the total (${grossMinor})`);
  if (input.deposit.kind === 'fixed') depositMinor = input.deposit.amountMinor;
  if (input.deposit.kind === 'percent') depositMinor = shareOf(currency, grossMinor, input.deposit.percent * 100);

  // commission on labour and travel only (parts pass through at cost to the partner)
  const commissionBase = sum((l) => (l.kind === 'parts' ? 0 : l.netMinor));
  const commissionMinor = shareOf(currency, commissionBase, input.commissionBp);
  // nothing taken from the owner, nothing for the provider to charge
  const processingFeeEstimateMinor = grossMinor === 0 ? 0 : shareOf(currency, grossMinor, input.processingFee.percentBp) + input.processingFee.fixedMinor;
  const { shareMinor } = partnerShareLines({ grossMinor, vatMinor, commissionMinor, processingFeeEstimateMinor });

  return {
    currency,
    minorUnits: exponent,
    lines,
    netMinor,
    vatMinor,
    grossMinor,
    vat,
    depositMinor,
    cancellation: { freeUntilHours: input.cancellation.freeUntilHours, feeMinor: Math.min(input.cancellation.feeMinor, grossMinor) },
    partner: { commissionBp: input.commissionBp, commissionMinor, partnerShareMinor: shareMinor, processingFeeEstimateMinor },
  };
}

/**
 * Splits an amount by ratios without losing a minor unit (dinero's allocate: the remainder goes
 * to the first shares), e.g. a partial refund across the lines of a quote.
 */
export function splitMinor(currency: Currency, amountMinor: number, ratios: number[]): number[] {
  assertMinor('amount', amountMinor);
  if (!ratios.length || ratios.some((r) => !Number.isInteger(r) || r < 0) || ratios.every((r) => r === 0)) throw new RangeError('ratios must be whole numbers ≥ 0, not all 0');
  return allocate(dinero({ amount: amountMinor, currency: currencyOf(currency) }), ratios).map(amountOf);
}
