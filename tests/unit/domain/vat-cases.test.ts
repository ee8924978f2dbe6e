// The VAT case table, one worked example per row (inputs → country of VAT, rate, reverse charge,
// rule code), each beside the article of Council Directive 2006/112/EC (consolidated text) it
// applies, and the refusals where the data does not decide.
import { describe, expect, it } from 'vitest';
import { computeQuote, VAT_CASES, vatTreatment, VatUndecidableError, type QuoteInput, type VatRuleCode } from '../../../packages/domain/src';

// VAT IDs with valid check digits (jsvat); the numbers are made up except where noted
const AT_BUSINESS = 'ATU13585627';
const DE_BUSINESS = 'DE123456788';
const NO_BUSINESS = 'NO123456785MVA';
const CH_BUSINESS = 'CHE123456788MWST';

const day = '2026-12-10';
const consumer = { kind: 'consumer' } as const;
const business = (vatId: string) => ({ kind: 'business', vatId }) as const;

/** The outcome of one case as the table promises it: [country, rate bp, reverse charge?, rule code]. */
const outcome = (input: Parameters<typeof vatTreatment>[0]) => {
  const v = vatTreatment(input);
  return [v.country, v.rateBp, v.treatment === 'reverse-charge', v.rule.code] as [string, number, boolean, VatRuleCode];
};

describe('the VAT case table', () => {
  it('has one row per rule code, each naming its article', () => {
    expect(new Set(VAT_CASES.map((c) => c.code)).size).toBe(VAT_CASES.length);
    for (const c of VAT_CASES) expect(c.article, c.code).toMatch(/Art\. \d+/);
  });
});

describe('consumers (non-taxable persons)', () => {
  // Art. 54(2)(b): "The place of supply of the following services to a non-taxable person shall be
  // the place where the services are physically carried out: … (b) valuations of and work on
  // movable tangible property" (legislation.gov.uk, eudr/2006/112, Title V, Chapter 3). It displaces
  // the general B2C rule of Art. 45 (the supplier's establishment) for work on a vehicle.
  it('Art. 54(2)(b): Austrian partner, work in Austria → AT 20 %, no reverse charge', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: 'AT', customer: consumer, supplyDate: day })).toEqual(['AT', 2000, false, 'b2c-work-place']);
  });

  it('Art. 54(2)(b): Austrian partner, work in Bavaria → DE 19 %, not the partner\'s AT 20 % (Art. 45 is displaced)', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: 'DE', customer: consumer, supplyDate: day })).toEqual(['DE', 1900, false, 'b2c-work-place']);
  });

  it('Art. 54(2)(b): Swiss partner (outside the EU), work in Germany → still DE 19 %', () => {
    expect(outcome({ supplierCountry: 'CH', workCountry: 'DE', customer: consumer, supplyDate: day })).toEqual(['DE', 1900, false, 'b2c-work-place']);
  });

  it('Art. 54(2)(b) puts the supply outside the EU: Austrian partner, work in Switzerland → no EU VAT (CH, 0, outside scope)', () => {
    const v = vatTreatment({ supplierCountry: 'AT', workCountry: 'CH', customer: consumer, supplyDate: day });
    expect([v.country, v.rateBp, v.treatment, v.rule.code]).toEqual(['CH', 0, 'outside-scope', 'b2c-outside-eu']);
    expect(outcome({ supplierCountry: 'SE', workCountry: 'NO', customer: consumer, supplyDate: day })).toEqual(['NO', 0, false, 'b2c-outside-eu']);
  });

  it('outside the Directive, a domestic supply under national law (from memory): Norwegian partner in Norway → NO 25 %; Swiss in Switzerland → CH 8.1 %', () => {
    expect(outcome({ supplierCountry: 'NO', workCountry: 'NO', customer: consumer, supplyDate: day })).toEqual(['NO', 2500, false, 'b2c-domestic-outside-eu']);
    expect(outcome({ supplierCountry: 'CH', workCountry: 'CH', customer: consumer, supplyDate: day })).toEqual(['CH', 810, false, 'b2c-domestic-outside-eu']);
  });
});

describe('business customers (taxable persons, known by their VAT ID)', () => {
  // Art. 44: "The place of supply of services to a taxable person acting as such shall be the place
  // where that person has established his business" (datenbank.nwb.de, Directive 2006/112/EC Art. 44).
  it('Art. 44: Austrian business, Austrian partner, work in Bavaria → AT 20 %, not DE 19 % (the defect)', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: 'DE', customer: business(AT_BUSINESS), supplyDate: day })).toEqual(['AT', 2000, false, 'b2b-domestic']);
  });

  it('Art. 44: Austrian business, Austrian partner, work in Austria or in Switzerland → AT 20 % either way', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: 'AT', customer: business(AT_BUSINESS), supplyDate: day })).toEqual(['AT', 2000, false, 'b2b-domestic']);
    expect(outcome({ supplierCountry: 'AT', workCountry: 'CH', customer: business(AT_BUSINESS), supplyDate: day })).toEqual(['AT', 2000, false, 'b2b-domestic']);
  });

  it('Art. 44: the place of work is not needed for a business customer', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: null, customer: business(AT_BUSINESS), supplyDate: day })).toEqual(['AT', 2000, false, 'b2b-domestic']);
  });

  // Art. 196: VAT is payable by the taxable person to whom the services referred to in Art. 44 are
  // supplied if the services are supplied by a taxable person not established in that Member State
  // (exlege.bg, Directive 2006/112/EC Art. 196, Bulgarian text; English wording from memory).
  it('Art. 44 + Art. 196: German business, Austrian partner, work in Austria → reverse charge, DE, 0', () => {
    expect(outcome({ supplierCountry: 'AT', workCountry: 'AT', customer: business(DE_BUSINESS), supplyDate: day })).toEqual(['DE', 0, true, 'b2b-reverse-charge']);
  });

  it('Art. 44 + Art. 196: a supplier from outside the EU is "not established" too: Swiss partner, German business → reverse charge, DE', () => {
    expect(outcome({ supplierCountry: 'CH', workCountry: 'DE', customer: business(DE_BUSINESS), supplyDate: day })).toEqual(['DE', 0, true, 'b2b-reverse-charge']);
  });

  it('Art. 44 puts the supply outside the EU: Norwegian or Swiss business, Austrian partner → no EU VAT, outside scope', () => {
    const v = vatTreatment({ supplierCountry: 'AT', workCountry: 'AT', customer: business(NO_BUSINESS), supplyDate: day });
    expect([v.country, v.rateBp, v.treatment, v.rule.code]).toEqual(['NO', 0, 'outside-scope', 'b2b-outside-eu']);
    expect(outcome({ supplierCountry: 'DE', workCountry: 'DE', customer: business(CH_BUSINESS), supplyDate: day })).toEqual(['CH', 0, false, 'b2b-outside-eu']);
  });

  it('outside the Directive, a domestic supply under national law (from memory): Norwegian business, Norwegian partner → NO 25 %', () => {
    expect(outcome({ supplierCountry: 'NO', workCountry: 'NO', customer: business(NO_BUSINESS), supplyDate: day })).toEqual(['NO', 2500, false, 'b2b-domestic-outside-eu']);
  });
});

describe('the quote says which rule applied (a code and its parameters)', () => {
  it('Art. 44: the rule carries the customer, the countries and the place of supply', () => {
    const v = vatTreatment({ supplierCountry: 'AT', workCountry: 'DE', customer: business(AT_BUSINESS), supplyDate: day });
    expect(v.rule).toEqual({ code: 'b2b-domestic', article: 'Art. 44', params: { customer: 'business', supplierCountry: 'AT', workCountry: 'DE', customerCountry: 'AT', placeOfSupply: 'AT' } });
  });

  it('computeQuote carries the rule: 120.00 labour for an Austrian business in Bavaria → 24.00 AT VAT', () => {
    const input: QuoteInput = {
      currency: 'EUR',
      lines: [{ kind: 'labour', description: 'Service', netMinor: 12_000 }],
      workCountry: 'DE',
      supplierCountry: 'AT',
      customer: business(AT_BUSINESS),
      supplyDate: day,
      deposit: { kind: 'none' },
      cancellation: { freeUntilHours: 24, feeMinor: 0 },
      commissionBp: 1200,
      processingFee: { percentBp: 150, fixedMinor: 25 },
    };
    const q = computeQuote(input);
    expect(q.vatMinor).toBe(2_400);
    expect(q.vat.rule).toMatchObject({ code: 'b2b-domestic', params: { placeOfSupply: 'AT' } });
  });
});

describe('refuses rather than guesses', () => {
  it('a missing supplier country is refused, not taken from the place of work', () => {
    for (const supplierCountry of [null, undefined, '']) {
      expect(() => vatTreatment({ supplierCountry, workCountry: 'AT', customer: consumer, supplyDate: day })).toThrow(VatUndecidableError);
    }
  });

  it('a consumer\'s missing place of work is refused (Art. 54(2)(b) needs it), with the reason', () => {
    let error: unknown;
    try {
      vatTreatment({ supplierCountry: 'AT', workCountry: undefined, customer: consumer, supplyDate: day });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(VatUndecidableError);
    expect(error).toMatchObject({ code: 'VAT_UNDECIDABLE', reason: 'work-country-missing' });
  });

  it('a country without VAT data (US, a VAT ID of the EU non-union scheme) is refused, not treated as outside the EU', () => {
    expect(() => vatTreatment({ supplierCountry: 'AT', workCountry: 'US', customer: consumer, supplyDate: day })).toThrow(VatUndecidableError);
    expect(() => vatTreatment({ supplierCountry: 'XX', workCountry: 'AT', customer: consumer, supplyDate: day })).toThrow(VatUndecidableError);
    expect(() => vatTreatment({ supplierCountry: 'AT', workCountry: 'AT', customer: business('EU372000041'), supplyDate: day })).toThrow(VatUndecidableError);
  });
});
