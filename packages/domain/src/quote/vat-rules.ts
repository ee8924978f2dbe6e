// VAT of a job as a table of cases under Council Directive 2006/112/EC: the country, rate and who pays.
import { DomainInputError, VatUndecidableError, type VatUndecidableReason } from '../errors';
import { vatIdCountry } from '../schemas/onboarding';
import { calendarDayOf, hasVatRates, isEuVatCountry, standardVatRate, vatCountryOf, VAT_RATES, type VatRateEntry } from './vat-rates';

/** A consumer, or a business known by its VAT ID (the ID's country is where it is established). */
export type Customer = { kind: 'consumer' } | { kind: 'business'; vatId: string };

/** `outside-scope`: the place of supply is outside the EU and no VAT is charged on the quote. */
export const VAT_TREATMENTS = ['standard', 'reverse-charge', 'outside-scope'] as const;
export type VatTreatment = (typeof VAT_TREATMENTS)[number];

/** One code per row of `VAT_CASES`. */
export const VAT_RULE_CODES = ['b2c-work-place', 'b2c-domestic-outside-eu', 'b2c-outside-eu', 'b2b-domestic', 'b2b-reverse-charge', 'b2b-domestic-outside-eu', 'b2b-outside-eu'] as const;
export type VatRuleCode = (typeof VAT_RULE_CODES)[number];

/** Where the place of supply lies: in the EU (in the supplier's country or another), or outside it. */
export type VatPlace = 'eu' | 'eu-supplier' | 'eu-other' | 'outside-eu-supplier' | 'outside-eu-other';

export interface VatCase {
  code: VatRuleCode;
  customer: Customer['kind'];
  /** Whose country the article makes the place of supply: the place of work or the customer's establishment. */
  placeOfSupply: 'work' | 'customer';
  place: VatPlace;
  treatment: VatTreatment;
  /** Articles of Council Directive 2006/112/EC. */
  article: string;
}

/**
 * The cases, checked against the Directive's text (Art. 44, 45, 54, 196; see tests/unit/domain/vat-cases.test.ts).
 * Art. 45 (a consumer is supplied where the supplier is established) has no row of its own: every
 * service we sell is work on a vehicle, for which Art. 54(2)(b) displaces it. Art. 54(2)(b) is for
 * consumers only, so a business is supplied where it is established (Art. 44) wherever the work is
 * done. Outside the EU (NO, CH, GB) the Directive puts no EU VAT on the supply; when the supplier is
 * established in that same country it is a domestic supply under that country's own VAT law, taxed
 * at its standard rate (national law, from memory); otherwise the quote charges no VAT and says so.
 */
export const VAT_CASES: readonly VatCase[] = Object.freeze([
  { code: 'b2c-work-place', customer: 'consumer', placeOfSupply: 'work', place: 'eu', treatment: 'standard', article: 'Art. 54(2)(b)' },
  { code: 'b2c-domestic-outside-eu', customer: 'consumer', placeOfSupply: 'work', place: 'outside-eu-supplier', treatment: 'standard', article: 'Art. 54(2)(b)' },
  { code: 'b2c-outside-eu', customer: 'consumer', placeOfSupply: 'work', place: 'outside-eu-other', treatment: 'outside-scope', article: 'Art. 54(2)(b)' },
  { code: 'b2b-domestic', customer: 'business', placeOfSupply: 'customer', place: 'eu-supplier', treatment: 'standard', article: 'Art. 44' },
  { code: 'b2b-reverse-charge', customer: 'business', placeOfSupply: 'customer', place: 'eu-other', treatment: 'reverse-charge', article: 'Art. 44, Art. 196' },
  { code: 'b2b-domestic-outside-eu', customer: 'business', placeOfSupply: 'customer', place: 'outside-eu-supplier', treatment: 'standard', article: 'Art. 44' },
  { code: 'b2b-outside-eu', customer: 'business', placeOfSupply: 'customer', place: 'outside-eu-other', treatment: 'outside-scope', article: 'Art. 44' },
] satisfies VatCase[]);

/** Which rule applied and to what: the apps render it in the reader's language. */
export interface VatRule {
  code: VatRuleCode;
  article: string;
  params: {
    customer: Customer['kind'];
    supplierCountry: string;
    /** Null when not given (a business customer's place of work does not matter). */
    workCountry: string | null;
    /** The country of a business customer's VAT ID; null for a consumer. */
    customerCountry: string | null;
    placeOfSupply: string;
  };
}

export interface VatOutcome {
  treatment: VatTreatment;
  /** The place of supply (VAT writes Greece EL). */
  country: string;
  rateBp: number;
  validFrom: string | null;
  /** The legal mention an invoice with reverse charge must carry; null otherwise. */
  note: string | null;
  rule: VatRule;
}

export interface VatSupply {
  /** Where the partner is established, ISO alpha-2. Required: never taken from elsewhere. */
  supplierCountry: string | null | undefined;
  /** Where the work is physically done, ISO alpha-2; required for a consumer. */
  workCountry?: string | null;
  customer: Customer;
  /** The day of the work, YYYY-MM-DD: the rate in force then applies. */
  supplyDate: string;
  rates?: readonly VatRateEntry[];
}

export const REVERSE_CHARGE_NOTE = 'Reverse charge: VAT to be accounted for by the recipient (Council Directive 2006/112/EC, Art. 196).';

const WHAT: Record<VatUndecidableReason, string> = {
  'supplier-country-missing': 'the country where the partner is established',
  'work-country-missing': 'the country where the work is done',
  'customer-country-missing': 'the country of the business customer',
  'country-unknown': 'a country we hold VAT rates for',
};

/** A VAT country code we hold rates for, or a refusal saying what is missing. */
function knownCountry(value: string | null | undefined, missing: VatUndecidableReason, rates: readonly VatRateEntry[]): string {
  if (value === null || value === undefined || value.trim() === '') throw new VatUndecidableError(missing, `The VAT cannot be worked out without ${WHAT[missing]}.`);
  const country = vatCountryOf(value.trim());
  if (!hasVatRates(country, rates)) throw new VatUndecidableError('country-unknown', `The VAT cannot be worked out for ${country}: there are no VAT rates for it.`);
  return country;
}

/** The row of the table for a supply, the place of supply and the rule's parameters; throws where the data does not decide. */
export function vatCaseOf(input: Omit<VatSupply, 'supplyDate'>): { row: VatCase; rule: VatRule } {
  const rates = input.rates ?? VAT_RATES;
  const supplierCountry = knownCountry(input.supplierCountry, 'supplier-country-missing', rates);
  const given = input.workCountry;
  const workCountry = given === null || given === undefined || given.trim() === '' ? null : knownCountry(given, 'work-country-missing', rates);
  let customerCountry: string | null = null;
  let placeOfSupply: string;
  if (input.customer.kind === 'business') {
    const issuer = vatIdCountry(input.customer.vatId);
    if (!issuer) throw new DomainInputError(`The VAT ID ${input.customer.vatId} is not valid`);
    customerCountry = knownCountry(issuer, 'customer-country-missing', rates);
    placeOfSupply = customerCountry;
  } else {
    placeOfSupply = knownCountry(workCountry, 'work-country-missing', rates);
  }
  const eu = isEuVatCountry(placeOfSupply);
  const own = placeOfSupply === supplierCountry;
  const place: VatPlace = eu ? (own ? 'eu-supplier' : 'eu-other') : own ? 'outside-eu-supplier' : 'outside-eu-other';
  const row = VAT_CASES.find((c) => c.customer === input.customer.kind && (c.place === place || (c.place === 'eu' && eu)));
  // the table covers every combination; a gap is a bug in the table, not the caller's input
  if (!row) throw new Error(`No VAT case for a ${input.customer.kind} with the place of supply ${place}`);
  return { row, rule: { code: row.code, article: row.article, params: { customer: input.customer.kind, supplierCountry, workCountry, customerCountry, placeOfSupply } } };
}

/** VAT country, rate, treatment and the rule that decided them, for a supply. */
export function vatTreatment(input: VatSupply): VatOutcome {
  calendarDayOf(input.supplyDate, 'supply date');
  const { row, rule } = vatCaseOf(input);
  const country = rule.params.placeOfSupply;
  if (row.treatment === 'reverse-charge') return { treatment: row.treatment, country, rateBp: 0, validFrom: null, note: REVERSE_CHARGE_NOTE, rule };
  if (row.treatment === 'outside-scope') return { treatment: row.treatment, country, rateBp: 0, validFrom: null, note: null, rule };
  const rate = standardVatRate(country, input.supplyDate, input.rates ?? VAT_RATES);
  return { treatment: row.treatment, country: rate.country, rateBp: rate.standardBp, validFrom: rate.validFrom, note: null, rule };
}
