// Amounts typed in major units (180.50) and stored as integer minor units (18050), converted by
// the domain's money helper: ISO 4217 minor units, exact decimals, refusals rather than rounding.
import { currencyExponent, fromMajor, toMajorString } from '@emberline/domain';

/** Decimal places of a currency: 2 for EUR, SEK, NOK, DKK and CHF. */
export function minorDigits(currency: string): number {
  return currencyExponent(currency);
}

/** 180.5 EUR -> 18050; null for an empty entry or one the currency cannot hold (1.005 EUR), so the schema names the field. */
export function majorToMinor(major: number | null | undefined, currency: string): number | null {
  if (typeof major !== 'number' || !Number.isFinite(major)) return null;
  try {
    return fromMajor(major, currency);
  } catch {
    return null;
  }
}

/** 18050 EUR -> 180.5, for filling a form from a stored amount. */
export function minorToMajor(minor: number | null | undefined, currency: string): number | null {
  if (typeof minor !== 'number' || !Number.isFinite(minor)) return null;
  return Number(toMajorString(minor, currency));
}

/** A number from an InputNumber's update, or null when the field was cleared. */
export const numberOrNull = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

export type MajorTextProblem = 'notNumber' | 'negative' | 'tooPrecise' | 'tooLarge';

/**
 * Reads an amount as typed ("180", "180.5", "180,50") without changing it: what is not a plain
 * amount of the currency, below 0 or above `maxMinor` is named, never clamped or turned into 0.
 */
export function parseMajorText(text: string, currency: string, maxMinor: number): { minor: number } | { problem: MajorTextProblem } | null {
  const typed = text.trim().replace(/\s/g, '');
  if (!typed) return null;
  const m = /^(-?)(\d+)(?:[.,](\d*))?$/.exec(typed);
  if (!m) return { problem: 'notNumber' };
  const digits = minorDigits(currency);
  const fraction = m[3] ?? '';
  if (m[1] === '-' && /[1-9]/.test(m[2]! + fraction)) return { problem: 'negative' };
  if (fraction.replace(/0+$/, '').length > digits) return { problem: 'tooPrecise' };
  // whole digits and fraction as text, so 99999999 and 0.1 + 0.2 never pass through a float
  const minor = Number(BigInt(m[2]!) * 10n ** BigInt(digits) + BigInt((fraction + '0'.repeat(digits)).slice(0, digits) || '0'));
  if (minor > maxMinor) return { problem: 'tooLarge' };
  return { minor };
}

/** 18050 EUR -> "180.50", the way the price field shows a stored amount. */
export const minorToText = (minor: number, currency: string): string => (minor / 10 ** minorDigits(currency)).toFixed(minorDigits(currency));
