// The quote engine against outside values: standard VAT rates of every EU state (European
// Commission, Taxes in Europe Database, rates in force on 1 January 2026, as listed in
// ../shared/REFERENCES.md), ISO 4217 minor units (currency-codes), worked examples computed by
// hand below each check, and properties with fast-check.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import currencyCodes from 'currency-codes';
import { computeQuote, CURRENCIES, CURRENCY_MINOR_UNITS, EU_VAT_COUNTRIES, REVERSE_CHARGE_NOTE, splitMinor, standardVatRate, VAT_RATES, type QuoteInput } from '../../packages/domain/src';

// REFERENCES.md, "VAT (standard rates in force on 1 January 2026)"
const EC_RATES_2026: Record<string, number> = {
  AT: 20, BE: 21, BG: 20, HR: 25, CY: 19, CZ: 21, DK: 25, EE: 24, FI: 25.5, FR: 20, DE: 19, EL: 24, HU: 27, IE: 23,
  IT: 22, LV: 21, LT: 21, LU: 17, MT: 18, NL: 21, PL: 23, PT: 23, RO: 21, SK: 23, SI: 22, ES: 21, SE: 25,
};
const OUTSIDE_EU_2026: Record<string, number> = { CH: 8.1, NO: 25, GB: 20 };

describe('VAT rates as dated data', () => {
  it('holds the European Commission standard rate of each of the 27 member states on 2026-01-01', () => {
    expect([...EU_VAT_COUNTRIES].sort()).toEqual(Object.keys(EC_RATES_2026).sort());
    for (const [country, percent] of Object.entries(EC_RATES_2026)) expect(standardVatRate(country, '2026-01-01').standardBp, country).toBe(Math.round(percent * 100));
  });

  it('holds CH 8.1 %, NO 25 % and GB 20 % on 2026-01-01 (REFERENCES.md, outside the EU)', () => {
    for (const [country, percent] of Object.entries(OUTSIDE_EU_2026)) expect(standardVatRate(country, '2026-01-01').standardBp, country).toBe(Math.round(percent * 100));
  });

  it('a change of rate is a new row: Finland 24 % on 2024-08-31, 25.5 % from 2024-09-01 (earlier rate from memory)', () => {
    expect(standardVatRate('FI', '2024-08-31').standardBp).toBe(2400);
    expect(standardVatRate('FI', '2024-09-01').standardBp).toBe(2550);
    expect(standardVatRate('GR', '2026-01-01').country).toBe('EL');
    expect(() => standardVatRate('AT', '1999-01-01')).toThrow(RangeError);
    expect(VAT_RATES.every((r) => /^\d{4}-\d{2}-\d{2}$/.test(r.validFrom) && Number.isInteger(r.standardBp))).toBe(true);
  });
});

describe('ISO 4217 minor units', () => {
  it('each currency we price in has the minor units ISO 4217 gives it (currency-codes)', () => {
    for (const code of CURRENCIES) expect(CURRENCY_MINOR_UNITS[code], code).toBe(currencyCodes.code(code)!.digits);
  });
});

// The demo brief's conversion (../shared/DEMO.md): labour 180 EUR, kit 85 EUR; travel 32 km × 0.80 EUR.
const conversion: QuoteInput = {
  currency: 'EUR',
  lines: [
    { kind: 'labour', description: 'Conversion', netMinor: 18_000 },
    { kind: 'parts', description: 'Parts kit', netMinor: 8_500 },
    { kind: 'travel', description: 'Travel', netMinor: 2_560 },
  ],
  workCountry: 'AT',
  supplierCountry: 'AT',
  customer: { kind: 'consumer' },
  supplyDate: '2026-12-10',
  deposit: { kind: 'percent', percent: 20 },
  cancellation: { freeUntilHours: 24, feeMinor: 5_000 },
  commissionBp: 1200,
  processingFee: { percentBp: 150, fixedMinor: 25 },
};

describe('computeQuote — worked examples, by hand', () => {
  it('consumer in Innsbruck, AT 20 %: VAT 3 600 + 1 700 + 512 = 5 812; gross 29 060 + 5 812 = 34 872 cents', () => {
    const q = computeQuote(conversion);
    expect(q.lines.map((l) => [l.vatMinor, l.grossMinor])).toEqual([
      [3_600, 21_600],
      [1_700, 10_200],
      [512, 3_072],
    ]);
    expect(q).toMatchObject({ netMinor: 29_060, vatMinor: 5_812, grossMinor: 34_872, vat: { treatment: 'standard', country: 'AT', rateBp: 2000 } });
    // deposit 20 % of 34 872 = 6 974.4 → 6 974; commission 12 % of (18 000 + 2 560) = 2 467.2 → 2 467;
    // processing 1.5 % of 34 872 = 523.08 → 523, + 25 = 548; partner share 29 060 − 2 467 − 548 = 26 045
    expect(q.depositMinor).toBe(6_974);
    expect(q.partner).toEqual({ commissionBp: 1200, commissionMinor: 2_467, partnerShareMinor: 26_045, processingFeeEstimateMinor: 548 });
    expect(q.cancellation).toEqual({ freeUntilHours: 24, feeMinor: 5_000 });
  });

  it('work across the border is taxed where it is done (Art. 54(2)(b)): an Austrian partner in Bavaria charges DE 19 % — 120.00 → 22.80 VAT', () => {
    const q = computeQuote({ ...conversion, workCountry: 'DE', lines: [{ kind: 'labour', description: 'Service', netMinor: 12_000 }] });
    expect(q.vat).toMatchObject({ country: 'DE', rateBp: 1900 });
    expect(q.lines[0]).toMatchObject({ vatMinor: 2_280, grossMinor: 14_280 });
  });

  it('rounds half up per line: FI 25.5 % of 123.45 = 31.47975 → 31.48; of 0.02 = 0.0051 → 0.01; of 0.01 = 0.00255 → 0.00', () => {
    const fi = (netMinor: number) => computeQuote({ ...conversion, workCountry: 'FI', supplierCountry: 'FI', lines: [{ kind: 'labour', description: 'x', netMinor }] }).vatMinor;
    expect(fi(12_345)).toBe(3_148);
    expect(fi(2)).toBe(1);
    expect(fi(1)).toBe(0);
    // per line, not on the total: three lines of 0.01 carry 0 VAT each (the total's 0.00765 would round to 0.01)
    const three = computeQuote({ ...conversion, workCountry: 'FI', supplierCountry: 'FI', lines: [1, 1, 1].map((netMinor) => ({ kind: 'parts' as const, description: 'x', netMinor })) });
    expect(three.vatMinor).toBe(0);
  });

  it('a business with a German VAT ID buying from an Austrian partner: no VAT, reverse-charge note (Art. 44, Art. 196)', () => {
    const q = computeQuote({ ...conversion, customer: { kind: 'business', vatId: 'DE136695976' } });
    expect(q.vat).toEqual({
      treatment: 'reverse-charge',
      country: 'DE',
      rateBp: 0,
      validFrom: null,
      note: REVERSE_CHARGE_NOTE,
      rule: { code: 'b2b-reverse-charge', article: 'Art. 44, Art. 196', params: { customer: 'business', supplierCountry: 'AT', workCountry: 'AT', customerCountry: 'DE', placeOfSupply: 'DE' } },
    });
    expect(q.vatMinor).toBe(0);
    expect(q.grossMinor).toBe(29_060);
  });

  it('a business with a VAT ID of the partner\'s own state pays the standard rate; an invalid VAT ID is refused', () => {
    expect(computeQuote({ ...conversion, customer: { kind: 'business', vatId: 'ATU13585627' } }).vat).toMatchObject({ treatment: 'standard', rateBp: 2000 });
    expect(() => computeQuote({ ...conversion, customer: { kind: 'business', vatId: 'DE123' } })).toThrow(RangeError);
  });

  it('Norway is outside the EU: a Norwegian partner charges NO 25 % in NOK (2 100.00 → 525.00)', () => {
    const q = computeQuote({ ...conversion, currency: 'NOK', workCountry: 'NO', supplierCountry: 'NO', lines: [{ kind: 'labour', description: 'x', netMinor: 210_000 }] });
    expect(q).toMatchObject({ currency: 'NOK', vatMinor: 52_500, grossMinor: 262_500 });
  });

  it('splits a refund without losing a cent (dinero.js allocate): 100.01 in halves → 50.01 + 50.00', () => {
    expect(splitMinor('EUR', 10_001, [1, 1])).toEqual([5_001, 5_000]);
  });
});

describe('computeQuote properties (fast-check)', () => {
  const line = fc.record({ kind: fc.constantFrom('labour' as const, 'parts' as const, 'travel' as const), description: fc.constant('x'), netMinor: fc.integer({ min: 0, max: 10_000_000 }) });
  const country = fc.constantFrom(...Object.keys(EC_RATES_2026), 'NO', 'CH');
  it('total = sum of lines, net + VAT = gross, nothing negative but a tiny job\'s share, commission + fee + partner share = net', () => {
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 6 }), country, fc.integer({ min: 0, max: 3000 }), fc.integer({ min: 1, max: 100 }), (lines, c, commissionBp, percent) => {
        const q = computeQuote({ ...conversion, lines, workCountry: c, supplierCountry: c, commissionBp, deposit: { kind: 'percent', percent } });
        const s = (f: (l: (typeof q.lines)[number]) => number) => q.lines.reduce((a, l) => a + f(l), 0);
        expect(q.netMinor).toBe(s((l) => l.netMinor));
        expect(q.vatMinor).toBe(s((l) => l.vatMinor));
        expect(q.grossMinor).toBe(s((l) => l.grossMinor));
        expect(q.netMinor + q.vatMinor).toBe(q.grossMinor);
        for (const l of q.lines) expect(l.netMinor + l.vatMinor).toBe(l.grossMinor);
        expect(q.partner.commissionMinor + q.partner.processingFeeEstimateMinor + q.partner.partnerShareMinor).toBe(q.netMinor);
        for (const v of [q.vatMinor, q.depositMinor, q.partner.commissionMinor, q.partner.processingFeeEstimateMinor]) expect(v).toBeGreaterThanOrEqual(0);
        expect(q.depositMinor).toBeLessThanOrEqual(q.grossMinor);
      }),
      { numRuns: 300 },
    );
  });
});
