// Amounts typed in major units (180.50) and stored as integer minor units (18050), converted by
// the domain's money helper: ISO 4217 minor units, exact decimals, refusals rather than rounding.
import { currencyExponent, fromMajor, MoneyInputError, toMajorString, type MoneyInputReason } from '@emberline/domain';

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

const PROBLEMS: Partial<Record<MoneyInputReason, MajorTextProblem>> = { negative: 'negative', 'too-many-decimals': 'tooPrecise', 'too-large': 'tooLarge' };

/**
 * Reads an amount as typed ("180", "180.5", "180,50") through the domain's `fromMajor`: what is
 * not a plain amount of the currency, below 0 or above `maxMinor` is named, never clamped to fit.
 */
export function parseMajorText(text: string, currency: string, maxMinor: number): { minor: number } | { problem: MajorTextProblem } | null {
  const typed = text.trim().replace(/\s/g, '').replace(/^(-?\d+),(\d*)$/, '$1.$2');
  if (!typed) return null;
  try {
    const minor = fromMajor(typed, currency);
    return minor > maxMinor ? { problem: 'tooLarge' } : { minor };
  } catch (e) {
    if (e instanceof MoneyInputError) return { problem: PROBLEMS[e.reason] ?? 'notNumber' };
    throw e;
  }
}

/** 18050 EUR -> "180.50", the way the price field shows a stored amount. */
export const minorToText = (minor: number, currency: string): string => toMajorString(minor, currency);
