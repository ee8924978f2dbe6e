// Standard VAT rates as dated data: each entry holds from its valid-from date until the next
// entry for the same country. Rates in basis points (1/100 of a per cent: 25.5 % = 2550).
// Source of the rates in force on 1 January 2026: European Commission, "VAT rates applied in the
// Member States of the European Union" (Taxes in Europe Database); CH, NO and GB from their tax
// authorities (Swiss Federal Tax Administration, Norwegian Tax Administration, HMRC), listed
// in docs/references.md. Earlier entries are from memory and only
// show that a change of rate is a new row, not an edit.

import { DomainInputError } from '../errors';
import { LocalDateSchema } from '../schemas/hours';

export interface VatRateEntry {
  /** ISO 3166-1 alpha-2, except Greece which VAT writes EL. */
  country: string;
  standardBp: number;
  /** First day (YYYY-MM-DD, local to the country) the rate applies. */
  validFrom: string;
}

/** EU member states by their VAT country code. */
export const EU_VAT_COUNTRIES = ['AT', 'BE', 'BG', 'HR', 'CY', 'CZ', 'DK', 'EE', 'FI', 'FR', 'DE', 'EL', 'HU', 'IE', 'IT', 'LV', 'LT', 'LU', 'MT', 'NL', 'PL', 'PT', 'RO', 'SK', 'SI', 'ES', 'SE'] as const;

export const VAT_RATES: readonly VatRateEntry[] = Object.freeze([
  { country: 'AT', standardBp: 2000, validFrom: '2016-01-01' },
  { country: 'BE', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'BG', standardBp: 2000, validFrom: '2016-01-01' },
  { country: 'HR', standardBp: 2500, validFrom: '2016-01-01' },
  { country: 'CY', standardBp: 1900, validFrom: '2016-01-01' },
  { country: 'CZ', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'DK', standardBp: 2500, validFrom: '2016-01-01' },
  // from memory: 20 % until 2023, 22 % in 2024 and the first half of 2025
  { country: 'EE', standardBp: 2000, validFrom: '2016-01-01' },
  { country: 'EE', standardBp: 2200, validFrom: '2024-01-01' },
  { country: 'EE', standardBp: 2400, validFrom: '2025-07-01' },
  // from memory: 24 % until the end of August 2024
  { country: 'FI', standardBp: 2400, validFrom: '2016-01-01' },
  { country: 'FI', standardBp: 2550, validFrom: '2024-09-01' },
  { country: 'FR', standardBp: 2000, validFrom: '2016-01-01' },
  { country: 'DE', standardBp: 1900, validFrom: '2021-01-01' },
  { country: 'EL', standardBp: 2400, validFrom: '2016-06-01' },
  { country: 'HU', standardBp: 2700, validFrom: '2016-01-01' },
  { country: 'IE', standardBp: 2300, validFrom: '2021-03-01' },
  { country: 'IT', standardBp: 2200, validFrom: '2016-01-01' },
  { country: 'LV', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'LT', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'LU', standardBp: 1700, validFrom: '2024-01-01' },
  { country: 'MT', standardBp: 1800, validFrom: '2016-01-01' },
  { country: 'NL', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'PL', standardBp: 2300, validFrom: '2016-01-01' },
  { country: 'PT', standardBp: 2300, validFrom: '2016-01-01' },
  // from memory: 19 % until the end of July 2025
  { country: 'RO', standardBp: 1900, validFrom: '2017-01-01' },
  { country: 'RO', standardBp: 2100, validFrom: '2025-08-01' },
  // from memory: 20 % until the end of 2024
  { country: 'SK', standardBp: 2000, validFrom: '2016-01-01' },
  { country: 'SK', standardBp: 2300, validFrom: '2025-01-01' },
  { country: 'SI', standardBp: 2200, validFrom: '2016-01-01' },
  { country: 'ES', standardBp: 2100, validFrom: '2016-01-01' },
  { country: 'SE', standardBp: 2500, validFrom: '2016-01-01' },
  // outside the EU
  { country: 'CH', standardBp: 810, validFrom: '2024-01-01' },
  { country: 'NO', standardBp: 2500, validFrom: '2016-01-01' },
  { country: 'GB', standardBp: 2000, validFrom: '2016-01-01' },
]);

/** VAT writes Greece as EL; ISO 3166 as GR. Accepts either. */
export function vatCountryOf(iso: string): string {
  const c = iso.toUpperCase();
  return c === 'GR' ? 'EL' : c;
}

export function isEuVatCountry(country: string): boolean {
  return (EU_VAT_COUNTRIES as readonly string[]).includes(vatCountryOf(country));
}

/**
 * A calendar date YYYY-MM-DD as a number (UTC midnight, ms) to compare as a date: compared as
 * text, "2024-8-31" sorts after "2024-09-01", so anything else is refused.
 */
export function calendarDayOf(date: string, label = 'date'): number {
  const parsed = LocalDateSchema.safeParse(date);
  if (!parsed.success) throw new DomainInputError(`The ${label} must be a calendar date written YYYY-MM-DD, got "${date}"`);
  return Date.parse(`${date}T00:00:00Z`);
}

/** The standard rate in force in `country` on `date` (YYYY-MM-DD); throws when the table has none. */
export function standardVatRate(country: string, date: string, table: readonly VatRateEntry[] = VAT_RATES): VatRateEntry {
  const c = vatCountryOf(country);
  const day = calendarDayOf(date, 'supply date');
  let found: { entry: VatRateEntry; from: number } | undefined;
  for (const entry of table) {
    if (entry.country !== c) continue;
    const from = calendarDayOf(entry.validFrom, `valid-from date of the ${c} rate`);
    if (from > day) continue;
    if (!found || from > found.from) found = { entry, from };
  }
  if (!found) throw new DomainInputError(`No standard VAT rate for ${c} on ${date}`);
  return found.entry;
}

/** True when the table holds a rate for `country` at all (on some date). */
export function hasVatRates(country: string, table: readonly VatRateEntry[] = VAT_RATES): boolean {
  const c = vatCountryOf(country);
  return table.some((entry) => entry.country === c);
}
