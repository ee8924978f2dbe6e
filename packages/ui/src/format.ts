// The one place numbers, durations, money and dates become text: Intl only, no concatenation.
import { currencyExponent, toMajorString } from '@emberline/domain';

/** Our message locales mapped to the Intl locale used for formatting. */
const INTL_LOCALES: Record<string, string> = { en: 'en-GB', de: 'de-DE' };

export function toIntlLocale(locale: string): string {
  return INTL_LOCALES[locale] ?? locale;
}

export function formatNumber(value: number, locale: string, options?: Intl.NumberFormatOptions): string {
  return new Intl.NumberFormat(toIntlLocale(locale), options).format(value);
}

/** "1 hr 30 mins" / "1 Std., 30 Min.": hours and minutes as Intl units joined by Intl.ListFormat. */
export function formatDuration(minutes: number, locale: string): string {
  const intlLocale = toIntlLocale(locale);
  const total = Math.max(0, Math.round(minutes));
  const hours = Math.floor(total / 60);
  const rest = total % 60;
  const unit = (u: 'hour' | 'minute', n: number) =>
    new Intl.NumberFormat(intlLocale, { style: 'unit', unit: u, unitDisplay: 'short' }).format(n);
  const parts: string[] = [];
  if (hours > 0) parts.push(unit('hour', hours));
  if (rest > 0 || hours === 0) parts.push(unit('minute', rest));
  return new Intl.ListFormat(intlLocale, { type: 'unit', style: 'narrow' }).format(parts);
}

/**
 * Money arrives as integer minor units plus an ISO 4217 code. `minorUnits` is the number of
 * decimal places of that currency (2 for EUR, 0 for JPY); a stored amount that carries its own
 * passes it, otherwise ISO 4217's comes from the domain. The domain's `toMajorString` hands Intl
 * an exact decimal string, never a float.
 */
export function formatMoney(amountMinor: number | bigint, currency: string, locale: string, minorUnits = currencyExponent(currency)): string {
  const decimal = toMajorString(amountMinor, currency, minorUnits);
  const formatter = new Intl.NumberFormat(toIntlLocale(locale), {
    style: 'currency',
    currency,
    minimumFractionDigits: minorUnits,
    maximumFractionDigits: minorUnits,
  });
  return formatter.format(decimal as Intl.StringNumericLiteral);
}

export function formatDate(
  value: Date | string | number,
  locale: string,
  options: Intl.DateTimeFormatOptions = { dateStyle: 'medium' },
): string {
  return new Intl.DateTimeFormat(toIntlLocale(locale), options).format(new Date(value));
}

/** A country's name from its ISO 3166-1 alpha-2 code, in the given locale ("AT" -> "Austria"). */
export function formatRegion(code: string, locale: string): string {
  try {
    return new Intl.DisplayNames([toIntlLocale(locale)], { type: 'region' }).of(code) ?? code;
  } catch {
    return code;
  }
}

/** File sizes in kB/MB with Intl units ("2.4 MB"). */
export function formatBytes(bytes: number, locale: string): string {
  const mb = bytes / (1024 * 1024);
  const [value, unit] = mb >= 1 ? [mb, 'megabyte'] : [Math.max(bytes / 1024, 0.1), 'kilobyte'];
  return new Intl.NumberFormat(toIntlLocale(locale), { style: 'unit', unit, unitDisplay: 'short', maximumFractionDigits: 1 }).format(value);
}
