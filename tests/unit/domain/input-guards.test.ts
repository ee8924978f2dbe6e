// The domain refuses input its rules cannot work with, whoever calls it: travel fees, quotes and the
// dated VAT rate look-up throw a DomainInputError (a RangeError) instead of computing nonsense.
import { describe, expect, it } from 'vitest';
import { computeQuote, DomainInputError, standardVatRate, travelFee, type QuoteInput } from '../../../packages/domain/src';

const policy = { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150 };
const innsbruck = { lat: 47.2692, lng: 11.4041 };
const hall = { lat: 47.2833, lng: 11.5 };

describe('travelFee refuses input outside its rule', () => {
  it('accepts a sound policy and places (Innsbruck → Hall, within the free km → 0)', () => {
    expect(travelFee(policy, innsbruck, hall).feeMinor).toBe(0);
  });

  it('refuses a latitude beyond ±90 or a longitude beyond ±180, and NaN coordinates', () => {
    expect(() => travelFee(policy, innsbruck, { lat: 95, lng: 11 })).toThrow(DomainInputError);
    expect(() => travelFee(policy, { lat: 47, lng: 181 }, hall)).toThrow(DomainInputError);
    expect(() => travelFee(policy, { lat: Number.NaN, lng: 11 }, hall)).toThrow(DomainInputError);
  });

  it('refuses a fractional, negative or NaN free distance', () => {
    for (const freeWithinKm of [2.5, -1, Number.NaN]) expect(() => travelFee({ ...policy, freeWithinKm }, innsbruck, hall), String(freeWithinKm)).toThrow(DomainInputError);
  });

  it('refuses a longest distance that is NaN or negative', () => {
    for (const maxDistanceKm of [Number.NaN, -5]) expect(() => travelFee({ ...policy, maxDistanceKm }, innsbruck, hall), String(maxDistanceKm)).toThrow(DomainInputError);
  });

  it('refuses a road factor below 1 (a road shorter than the straight line) or NaN', () => {
    expect(() => travelFee(policy, innsbruck, hall, { roadFactor: 0.5, averageSpeedKmh: 60 })).toThrow(DomainInputError);
    expect(() => travelFee(policy, innsbruck, hall, { roadFactor: Number.NaN, averageSpeedKmh: 60 })).toThrow(DomainInputError);
  });
});

const base: QuoteInput = {
  currency: 'EUR',
  lines: [
    { kind: 'labour', description: 'Service', netMinor: 12_000 },
    { kind: 'travel', description: 'Travel', netMinor: 800 },
  ],
  workCountry: 'AT',
  supplierCountry: 'AT',
  customer: { kind: 'consumer' },
  supplyDate: '2026-12-10',
  deposit: { kind: 'none' },
  cancellation: { freeUntilHours: 24, feeMinor: 0 },
  commissionBp: 1200,
  processingFee: { percentBp: 150, fixedMinor: 25 },
};

describe('computeQuote refuses input outside its rule', () => {
  it('accepts the sound example: 128.00 net, AT 20 % → 153.60 gross', () => {
    expect(computeQuote(base).grossMinor).toBe(15_360);
  });

  it('refuses a negative, fractional or over-100 % commission', () => {
    for (const commissionBp of [-100, 12.5, 10_001, Number.NaN]) expect(() => computeQuote({ ...base, commissionBp }), String(commissionBp)).toThrow(DomainInputError);
  });

  it('refuses a deposit above the total (150 %) and a fractional deposit percentage', () => {
    expect(() => computeQuote({ ...base, deposit: { kind: 'percent', percent: 150 } })).toThrow(DomainInputError);
    // a fixed deposit of 200.00 on a total of 153.60 (the offer form keeps it within the price)
    expect(() => computeQuote({ ...base, deposit: { kind: 'fixed', amountMinor: 20_000 } })).toThrow(DomainInputError);
    expect(computeQuote({ ...base, deposit: { kind: 'fixed', amountMinor: 15_360 } }).depositMinor).toBe(15_360);
    expect(() => computeQuote({ ...base, deposit: { kind: 'percent', percent: 12.5 } })).toThrow(DomainInputError);
    expect(() => computeQuote({ ...base, deposit: { kind: 'fixed', amountMinor: 10.5 } })).toThrow(DomainInputError);
  });

  it('refuses fractional or negative fees (minor units are whole numbers)', () => {
    expect(() => computeQuote({ ...base, processingFee: { percentBp: 150, fixedMinor: 25.5 } })).toThrow(DomainInputError);
    expect(() => computeQuote({ ...base, processingFee: { percentBp: -1, fixedMinor: 25 } })).toThrow(DomainInputError);
    expect(() => computeQuote({ ...base, processingFee: { percentBp: 1.5, fixedMinor: 25 } })).toThrow(DomainInputError);
    expect(() => computeQuote({ ...base, cancellation: { freeUntilHours: 24, feeMinor: 99.9 } })).toThrow(DomainInputError);
  });

  it('refuses totals above Number.MAX_SAFE_INTEGER (2^53 − 1), where integers stop being exact', () => {
    const half = 2 ** 52;
    // two lines of 2^52 at 0 % would add up to 2^53 exactly; with VAT the gross is beyond it
    expect(() => computeQuote({ ...base, lines: [{ kind: 'parts', description: 'x', netMinor: half }, { kind: 'parts', description: 'x', netMinor: half }] })).toThrow(DomainInputError);
    // one safe line whose VAT product (net × 2 000 bp) no longer is
    expect(() => computeQuote({ ...base, lines: [{ kind: 'parts', description: 'x', netMinor: 10 ** 13 }] })).toThrow(DomainInputError);
  });
});

describe('the VAT rate look-up compares dates as dates', () => {
  it('refuses a date that is not YYYY-MM-DD: "2024-8-31" read as text sorts after "2024-09-01" and gave FI 25.5 %', () => {
    expect(standardVatRate('FI', '2024-08-31').standardBp).toBe(2400);
    expect(() => standardVatRate('FI', '2024-8-31')).toThrow(DomainInputError);
    expect(() => computeQuote({ ...base, workCountry: 'FI', supplierCountry: 'FI', supplyDate: '2024-8-31' })).toThrow(DomainInputError);
  });

  it('refuses a date that does not exist (2024-02-30) and a table row with a malformed valid-from date', () => {
    expect(() => standardVatRate('AT', '2024-02-30')).toThrow(DomainInputError);
    const table = [
      { country: 'FI', standardBp: 2400, validFrom: '2016-01-01' },
      { country: 'FI', standardBp: 2550, validFrom: '2024-9-1' },
    ];
    expect(() => standardVatRate('FI', '2024-08-31', table)).toThrow(DomainInputError);
  });
});
