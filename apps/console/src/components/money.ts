// Amounts typed in major units (180.50) and stored as integer minor units (18050), with the number
// of minor digits taken from the currency itself (Intl knows ISO 4217), never assumed.

/** Decimal places of a currency: 2 for EUR, SEK, NOK, DKK and CHF. */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

/** 180.5 EUR -> 18050; null for an empty or malformed entry (the schema then names the field). */
export function majorToMinor(major: number | null | undefined, currency: string): number | null {
  if (typeof major !== 'number' || !Number.isFinite(major)) return null;
  // rounding removes float noise such as 180.1 × 100 = 18010.000000000002
  return Math.round(major * 10 ** minorDigits(currency));
}

/** 18050 EUR -> 180.5, for filling a form from a stored amount. */
export function minorToMajor(minor: number | null | undefined, currency: string): number | null {
  if (typeof minor !== 'number' || !Number.isFinite(minor)) return null;
  return minor / 10 ** minorDigits(currency);
}

/** A number from an InputNumber's update, or null when the field was cleared. */
export const numberOrNull = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
