// Minor ↔ major units: worked examples per ISO 4217 minor unit, float traps, and refusals.
// Source of the minor units: ISO 4217 "List one: currency and funds code list" as published by
// SIX (the maintenance agency), through the `currency-codes` package that carries that list.
import currencyCodes from 'currency-codes';
import * as dineroCurrencies from 'dinero.js/currencies';
import { describe, expect, it } from 'vitest';
import { CURRENCIES, CURRENCY_MINOR_UNITS, currencyExponent, fromMajor, MoneyInputError, toMajorString, type MoneyInputReason } from '../../../packages/domain/src';

const isoDigits = (code: string) => currencyCodes.code(code)!.digits;

const refusal = (f: () => unknown): MoneyInputReason | 'accepted' => {
  try {
    f();
    return 'accepted';
  } catch (e) {
    expect(e).toBeInstanceOf(MoneyInputError);
    return (e as MoneyInputError).reason;
  }
};

describe('currencyExponent', () => {
  it('gives the ISO 4217 minor unit of every decimal currency in the table (currency-codes)', () => {
    const decimal = Object.values(dineroCurrencies).filter((c) => c.base === 10 && currencyCodes.code(c.code));
    expect(decimal.length).toBeGreaterThan(150);
    for (const c of decimal) expect(currencyExponent(c.code), c.code).toBe(isoDigits(c.code));
  });

  it('is ISO 4217, not the display digits Intl (CLDR) uses', () => {
    // CLDR shows HUF and IQD without decimals; ISO 4217 gives them 2 and 3
    expect(new Intl.NumberFormat('en', { style: 'currency', currency: 'HUF' }).resolvedOptions().maximumFractionDigits).toBe(0);
    expect([currencyExponent('HUF'), isoDigits('HUF')]).toEqual([2, 2]);
    expect([currencyExponent('IQD'), isoDigits('IQD')]).toEqual([3, 3]);
  });

  it('is the table the quote prices with', () => {
    for (const code of CURRENCIES) expect(CURRENCY_MINOR_UNITS[code]).toBe(currencyExponent(code));
  });

  it('refuses a code that is not an ISO 4217 currency, or whose minor unit is not decimal', () => {
    expect(refusal(() => currencyExponent('XYZ'))).toBe('unknown-currency');
    expect(refusal(() => currencyExponent('eur'))).toBe('unknown-currency');
    expect(refusal(() => currencyExponent('toString'))).toBe('unknown-currency');
    // the ariary is divided into 5 iraimbilanja
    expect(refusal(() => currencyExponent('MGA'))).toBe('unknown-currency');
  });
});

describe('toMajorString', () => {
  it.each([
    [18_050, 'EUR', '180.50'],
    [5, 'EUR', '0.05'],
    [-5, 'EUR', '-0.05'],
    [0, 'SEK', '0.00'],
    [33_432, 'CHF', '334.32'],
    [500, 'JPY', '500'],
    [1_999, 'ISK', '1999'],
    [1_234, 'BHD', '1.234'],
    [5, 'KWD', '0.005'],
    [12_345, 'CLF', '1.2345'],
  ] as const)('%i minor %s is %s', (minor, code, major) => {
    expect(major.split('.')[1]?.length ?? 0).toBe(isoDigits(code));
    expect(toMajorString(minor, code)).toBe(major);
  });

  it('stays exact up to 2^53 minor units, where dividing by 100 in floats is a cent off', () => {
    // 7 100 000 000 000 001 / 100 is 71 000 000 000 000.015625 as a double: toFixed(2) gives .02
    expect((7_100_000_000_000_001 / 100).toFixed(2)).toBe('71000000000000.02');
    expect(toMajorString(7_100_000_000_000_001, 'EUR')).toBe('71000000000000.01');
    expect(toMajorString(Number.MAX_SAFE_INTEGER, 'EUR')).toBe('90071992547409.91');
    expect(toMajorString(1_234_567_890_123_456_789n, 'EUR')).toBe('12345678901234567.89');
    expect(toMajorString(-5n, 'BHD')).toBe('-0.005');
  });

  it('takes the exponent a stored amount carries', () => {
    expect(toMajorString(18_050, 'EUR', 2)).toBe('180.50');
  });

  it('refuses fractional, unsafe or non-numeric minor units rather than print them', () => {
    expect(refusal(() => toMajorString(1.5, 'EUR'))).toBe('not-a-number');
    expect(refusal(() => toMajorString(Number.NaN, 'EUR'))).toBe('not-a-number');
    expect(refusal(() => toMajorString(2 ** 53, 'EUR'))).toBe('too-large');
  });
});

describe('fromMajor', () => {
  it.each([
    ['180.50', 'EUR', 18_050],
    ['180.5', 'EUR', 18_050],
    ['180', 'EUR', 18_000],
    [' 0.05 ', 'EUR', 5],
    ['12.500', 'EUR', 1_250],
    ['500', 'JPY', 500],
    ['500.00', 'JPY', 500],
    ['1999', 'ISK', 1_999],
    ['1.005', 'BHD', 1_005],
    ['0.001', 'KWD', 1],
    [180.5, 'EUR', 18_050],
  ] as const)('%s %s is %i minor', (major, code, minor) => {
    expect(fromMajor(major, code)).toBe(minor);
    expect(fromMajor(toMajorString(minor, code), code)).toBe(minor);
  });

  it('reads typed amounts exactly where multiplying floats by 100 does not', () => {
    expect(19.99 * 100).toBe(1998.9999999999998);
    expect(fromMajor(19.99, 'EUR')).toBe(1999);
    expect(fromMajor('19.99', 'EUR')).toBe(1999);
    expect(1.15 * 100).toBe(114.99999999999999);
    expect(fromMajor('1.15', 'EUR')).toBe(115);
    expect(fromMajor('90071992547409.91', 'EUR')).toBe(Number.MAX_SAFE_INTEGER);
  });

  it('refuses an amount with more decimals than the currency has instead of rounding it', () => {
    // Math.round(1.005 * 100) is 100: half a cent silently lost
    expect(Math.round(1.005 * 100)).toBe(100);
    expect(refusal(() => fromMajor(1.005, 'EUR'))).toBe('too-many-decimals');
    expect(refusal(() => fromMajor('1.005', 'EUR'))).toBe('too-many-decimals');
    // 0.1 + 0.2 is 0.30000000000000004, not an amount in cents
    expect(refusal(() => fromMajor(0.1 + 0.2, 'EUR'))).toBe('too-many-decimals');
    expect(refusal(() => fromMajor('1.5', 'JPY'))).toBe('too-many-decimals');
    expect(refusal(() => fromMajor('0.0001', 'BHD'))).toBe('too-many-decimals');
    expect(refusal(() => fromMajor(1e-7, 'EUR'))).toBe('too-many-decimals');
  });

  it('refuses what is not a plain amount', () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, '', 'abc', '1,5', '1.2.3', '.5', '5.', '1e3', '0x10', '+5']) {
      expect(refusal(() => fromMajor(bad, 'EUR')), String(bad)).toBe('not-a-number');
    }
  });

  it('refuses negatives unless asked for, and amounts past 2^53 minor units', () => {
    expect(refusal(() => fromMajor('-1.00', 'EUR'))).toBe('negative');
    expect(refusal(() => fromMajor(-0.01, 'EUR'))).toBe('negative');
    expect(fromMajor('-1.25', 'EUR', { allowNegative: true })).toBe(-125);
    expect(fromMajor('-0', 'EUR')).toBe(0);
    expect(refusal(() => fromMajor('90071992547409.92', 'EUR'))).toBe('too-large');
    expect(refusal(() => fromMajor(1e21, 'EUR'))).toBe('too-large');
    expect(refusal(() => fromMajor('1', 'XYZ'))).toBe('unknown-currency');
  });
});
