// Money between integer minor units (18050) and major-unit decimals ("180.50"): the one place.
import { dinero, toDecimal, type DineroCurrency } from 'dinero.js';
import { dinero as dineroBig, toDecimal as toDecimalBig } from 'dinero.js/bigint';
import * as ISO_4217 from 'dinero.js/currencies';
import { DomainInputError } from '../errors';

/** Why an amount or currency was refused; apps map it to their own words. */
export type MoneyInputReason = 'not-a-number' | 'too-many-decimals' | 'negative' | 'too-large' | 'unknown-currency';

export class MoneyInputError extends DomainInputError {
  constructor(
    readonly reason: MoneyInputReason,
    message: string,
  ) {
    super(message, 'MONEY_INPUT');
    this.name = 'MoneyInputError';
  }
}

const TABLE = ISO_4217 as unknown as Readonly<Record<string, DineroCurrency<number> | undefined>>;

/**
 * The ISO 4217 minor unit of a currency: 2 for EUR, 0 for JPY, 3 for BHD. Taken from dinero.js's
 * ISO 4217 table rather than Intl, whose CLDR data gives display digits (0 for HUF and IQD, where
 * ISO 4217 has 2 and 3). Currencies whose minor unit is not a power of ten (MGA, MRU) are refused.
 */
export function currencyExponent(code: string): number {
  const c = Object.hasOwn(TABLE, code) ? TABLE[code] : undefined;
  if (!c || c.code !== code) throw new MoneyInputError('unknown-currency', `${code} is not an ISO 4217 currency code`);
  if (c.base !== 10) throw new MoneyInputError('unknown-currency', `${code} has no decimal minor unit`);
  return c.exponent;
}

const MAX_SAFE = BigInt(Number.MAX_SAFE_INTEGER);

function wholeMinor(minor: number): number {
  if (!Number.isInteger(minor)) throw new MoneyInputError('not-a-number', `An amount must be a whole number of minor units, got ${minor}`);
  if (!Number.isSafeInteger(minor)) throw new MoneyInputError('too-large', `${minor} minor units is beyond what whole numbers hold exactly (2^53); pass a bigint`);
  return minor;
}

/**
 * 18050 EUR → "180.50", 500 JPY → "500", 1234 BHD → "1.234": the exact decimal, never a float
 * division. `exponent` is for a stored amount that carries its own (a quote's `minorUnits`).
 */
export function toMajorString(minor: number | bigint, currency: string, exponent = currencyExponent(currency)): string {
  if (!Number.isInteger(exponent) || exponent < 0 || exponent > 8) throw new MoneyInputError('unknown-currency', `A minor unit of ${exponent} decimals is not one ISO 4217 uses`);
  // a bigint amount (a sum past 2^53) goes through dinero's bigint calculator, exact at any size
  if (typeof minor === 'bigint') return toDecimalBig(dineroBig({ amount: minor, currency: { code: currency, base: 10n, exponent: BigInt(exponent) } }));
  return toDecimal(dinero({ amount: wholeMinor(minor), currency: { code: currency, base: 10, exponent } }));
}

/**
 * "180.50" or 180.5 EUR → 18050. Refuses rather than rounds: more decimals than the currency has
 * ("1.005" EUR, or 0.1 + 0.2, which is 0.30000000000000004), text that is not a plain decimal
 * number, NaN, a negative amount unless `allowNegative`, and amounts past 2^53 minor units.
 * Zeros after the last decimal the currency has ("12.500" EUR) change nothing and are accepted.
 */
export function fromMajor(input: string | number, currency: string, options: { allowNegative?: boolean } = {}): number {
  const exponent = currencyExponent(currency);
  let text: string;
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) throw new MoneyInputError('not-a-number', `An amount must be a number, got ${input}`);
    text = String(input);
    // String() writes 1e21 and 1e-7 in exponent form: far beyond any amount, or beyond any minor unit
    if (/e/i.test(text)) throw Math.abs(input) < 1 ? new MoneyInputError('too-many-decimals', `${text} ${currency} has more decimals than ${exponent}`) : new MoneyInputError('too-large', `${text} ${currency} is too large`);
  } else {
    text = input.trim();
  }
  const m = /^(-?)(\d+)(?:\.(\d+))?$/.exec(text);
  if (!m) throw new MoneyInputError('not-a-number', `"${text}" is not an amount (digits with an optional decimal point)`);
  const [, sign, whole, fraction = ''] = m as unknown as [string, string, string, string | undefined];
  if (/[^0]/.test(fraction.slice(exponent))) {
    throw new MoneyInputError('too-many-decimals', `${text} ${currency} has more decimals than the ${exponent} ISO 4217 gives ${currency}`);
  }
  const digits = BigInt(whole + fraction.slice(0, exponent).padEnd(exponent, '0'));
  if (digits > MAX_SAFE) throw new MoneyInputError('too-large', `${text} ${currency} is beyond what whole numbers hold exactly (2^53 minor units)`);
  if (digits === 0n) return 0;
  if (sign === '-' && !options.allowNegative) throw new MoneyInputError('negative', `An amount cannot be negative, got ${text}`);
  return Number(sign === '-' ? -digits : digits);
}
