// Intl helpers: outputs checked against hand-written strings for en-GB and de-DE.
import { describe, expect, it } from 'vitest';
import { formatDate, formatDuration, formatMoney, formatNumber, toIntlLocale } from '../../../packages/ui/src/format';

const NBSP = '\u00a0';

describe('toIntlLocale', () => {
  it('maps message locales to formatting locales and passes others through', () => {
    expect(toIntlLocale('en')).toBe('en-GB');
    expect(toIntlLocale('de')).toBe('de-DE');
    expect(toIntlLocale('fr-FR')).toBe('fr-FR');
  });
});

describe('formatNumber', () => {
  it('groups and separates decimals per locale', () => {
    expect(formatNumber(1234567.5, 'en-GB')).toBe('1,234,567.5');
    expect(formatNumber(1234567.5, 'de-DE')).toBe('1.234.567,5');
    expect(formatNumber(1234567.5, 'en')).toBe('1,234,567.5');
  });
});

describe('formatDuration', () => {
  it('writes hours and minutes in English', () => {
    expect(formatDuration(90, 'en-GB')).toBe('1 hr 30 mins');
    expect(formatDuration(60, 'en-GB')).toBe('1 hr');
    expect(formatDuration(120, 'en-GB')).toBe('2 hrs');
    expect(formatDuration(45, 'en-GB')).toBe('45 mins');
    expect(formatDuration(1, 'en-GB')).toBe('1 min');
    expect(formatDuration(0, 'en-GB')).toBe('0 mins');
  });

  it('writes hours and minutes in German', () => {
    expect(formatDuration(90, 'de-DE')).toBe('1 Std., 30 Min.');
    expect(formatDuration(120, 'de-DE')).toBe('2 Std.');
    expect(formatDuration(15, 'de')).toBe('15 Min.');
  });

  it('rounds to whole minutes and never goes negative', () => {
    expect(formatDuration(89.6, 'en-GB')).toBe('1 hr 30 mins');
    expect(formatDuration(-5, 'en-GB')).toBe('0 mins');
  });
});

describe('formatMoney', () => {
  it('formats euro minor units', () => {
    expect(formatMoney(123450, 'EUR', 'en-GB')).toBe('€1,234.50');
    expect(formatMoney(123450, 'EUR', 'de-DE')).toBe(`1.234,50${NBSP}€`);
    expect(formatMoney(7, 'EUR', 'en-GB')).toBe('€0.07');
    expect(formatMoney(7, 'EUR', 'de-DE')).toBe(`0,07${NBSP}€`);
    expect(formatMoney(-500, 'EUR', 'en-GB')).toBe('-€5.00');
    expect(formatMoney(-500, 'EUR', 'de-DE')).toBe(`-5,00${NBSP}€`);
  });

  it('honours the minor-unit count given with the amount', () => {
    expect(formatMoney(1500, 'JPY', 'en-GB', 0)).toBe('JP¥1,500');
    expect(formatMoney(1500, 'JPY', 'de-DE', 0)).toBe(`1.500${NBSP}¥`);
    expect(formatMoney(12345, 'KWD', 'de-DE', 3)).toBe(`12,345${NBSP}KWD`);
  });

  it('stays exact beyond the float-safe range', () => {
    expect(formatMoney(1234567890123456789n, 'EUR', 'en-GB')).toBe('€12,345,678,901,234,567.89');
  });
});

describe('formatDate', () => {
  const date = new Date('2025-03-09T10:00:00Z');
  it('uses medium dates by default', () => {
    expect(formatDate(date, 'en-GB', { dateStyle: 'medium', timeZone: 'UTC' })).toBe('9 Mar 2025');
    expect(formatDate(date, 'de-DE', { dateStyle: 'medium', timeZone: 'UTC' })).toBe('09.03.2025');
  });
  it('accepts ISO strings and other styles', () => {
    expect(formatDate('2025-03-09T10:00:00Z', 'en-GB', { dateStyle: 'long', timeZone: 'UTC' })).toBe('9 March 2025');
    expect(formatDate('2025-03-09T10:00:00Z', 'de-DE', { dateStyle: 'long', timeZone: 'UTC' })).toBe('9. März 2025');
  });
});
