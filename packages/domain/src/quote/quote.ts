// The quote: labour + parts kit + travel, each line with VAT, in integer minor units, through
// dinero.js. The VAT rule (Council Directive 2006/112/EC): work on a vehicle for a consumer is
// taxed where it is physically carried out (Art. 54(2)(b)); a business customer with a valid VAT
// ID of another member state than the supplier's is charged no VAT and accounts for it itself
// (Art. 44 with the reverse charge of Art. 196). Rounding: VAT is computed per line and rounded
// half up to the currency's minor unit (commercial rounding); totals are sums of rounded lines.
import { add, allocate, dinero, halfUp, multiply, toSnapshot, transformScale, type Dinero, type DineroCurrency } from 'dinero.js';
import { isValidVatId } from '../schemas/onboarding';
import type { Cancellation, Currency, Deposit } from '../schemas/offers';
import { isEuVatCountry, standardVatRate, vatCountryOf, VAT_RATES, type VatRateEntry } from './vat-rates';

/** ISO 4217 minor units of the currencies we price in (2 for each; checked against currency-codes). */
export const CURRENCY_MINOR_UNITS: Readonly<Record<Currency, number>> = Object.freeze({ EUR: 2, SEK: 2, NOK: 2, DKK: 2, CHF: 2 });

const currencyOf = (code: Currency): DineroCurrency<number> => ({ code, base: 10, exponent: CURRENCY_MINOR_UNITS[code] });

export type QuoteLineKind = 'labour' | 'parts' | 'travel';
export type Customer = { kind: 'consumer' } | { kind: 'business'; vatId: string };

export interface QuoteInput {
  currency: Currency;
  lines: ReadonlyArray<{ kind: QuoteLineKind; description: string; netMinor: number }>;
  /** Where the work is physically done (the owner's place or the workshop), ISO alpha-2. */
  workCountry: string;
  /** Where the partner is established, ISO alpha-2. */
  supplierCountry: string;
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

export type VatTreatment = 'standard' | 'reverse-charge';

export interface Quote {
  currency: Currency;
  minorUnits: number;
  lines: QuoteLine[];
  netMinor: number;
  vatMinor: number;
  grossMinor: number;
  vat: { treatment: VatTreatment; country: string; rateBp: number; validFrom: string | null; note: string | null };
  /** Due at booking; the rest on completion. */
  depositMinor: number;
  /** Free until `freeUntilHours` before the start, then `feeMinor` (never more than the gross). */
  cancellation: { freeUntilHours: number; feeMinor: number };
  partner: { commissionBp: number; commissionMinor: number; partnerShareMinor: number; processingFeeEstimateMinor: number };
}

export const REVERSE_CHARGE_NOTE = 'Reverse charge: VAT to be accounted for by the recipient (Council Directive 2006/112/EC, Art. 196).';

const amountOf = (d: Dinero<number>) => toSnapshot(d).amount;

/** `minor × bp / 10 000`, rounded half up to the currency's minor unit. */
function shareOf(currency: Currency, minor: number, bp: number): number {
  const d = dinero({ amount: minor, currency: currencyOf(currency) });
  return amountOf(transformScale(multiply(d, { amount: bp, scale: 4 }), CURRENCY_MINOR_UNITS[currency], halfUp));
}

function assertMinor(label: string, v: number): void {
  if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${label} must be a whole number of minor units ≥ 0, got ${v}`);
}

/** VAT country, rate and treatment for a supply. */
export function vatTreatment(input: Pick<QuoteInput, 'workCountry' | 'supplierCountry' | 'customer' | 'supplyDate' | 'rates'>): Quote['vat'] {
  const supplier = vatCountryOf(input.supplierCountry);
  if (input.customer.kind === 'business') {
    const id = input.customer.vatId.replace(/[\s.-]/g, '').toUpperCase();
    if (!isValidVatId(id)) throw new RangeError(`The VAT ID ${input.customer.vatId} is not valid`);
    const customerCountry = vatCountryOf(id.slice(0, 2));
    if (isEuVatCountry(customerCountry) && isEuVatCountry(supplier) && customerCountry !== supplier) {
      return { treatment: 'reverse-charge', country: customerCountry, rateBp: 0, validFrom: null, note: REVERSE_CHARGE_NOTE };
    }
  }
  const rate = standardVatRate(input.workCountry, input.supplyDate, input.rates ?? VAT_RATES);
  return { treatment: 'standard', country: rate.country, rateBp: rate.standardBp, validFrom: rate.validFrom, note: null };
}

export function computeQuote(input: QuoteInput): Quote {
  const currency = input.currency;
  const exponent = CURRENCY_MINOR_UNITS[currency];
  if (exponent === undefined) throw new RangeError(`Unknown currency ${currency}`);
  input.lines.forEach((l, i) => assertMinor(`line ${i + 1}`, l.netMinor));
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

  let depositMinor = 0;
  if (input.deposit.kind === 'fixed') depositMinor = Math.min(input.deposit.amountMinor, grossMinor);
  if (input.deposit.kind === 'percent') depositMinor = shareOf(currency, grossMinor, input.deposit.percent * 100);

  // commission on labour and travel; the partner keeps the rest of the net (parts in full)
  const commissionBase = sum((l) => (l.kind === 'parts' ? 0 : l.netMinor));
  const commissionMinor = shareOf(currency, commissionBase, input.commissionBp);
  const processingFeeEstimateMinor = shareOf(currency, grossMinor, input.processingFee.percentBp) + input.processingFee.fixedMinor;

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
    partner: { commissionBp: input.commissionBp, commissionMinor, partnerShareMinor: netMinor - commissionMinor, processingFeeEstimateMinor },
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
