// The console's form money helpers: typed major units to stored minor units through the domain.
import { describe, expect, it } from 'vitest';
import { majorToMinor, minorDigits, minorToMajor } from '../../../apps/console/src/components/money';

describe('console form money', () => {
  it('stores what was typed, to the cent', () => {
    expect(majorToMinor(180.5, 'EUR')).toBe(18_050);
    expect(majorToMinor(19.99, 'EUR')).toBe(1_999);
    expect(majorToMinor(null, 'EUR')).toBeNull();
  });

  it('leaves an amount the currency cannot hold empty for the form to name, instead of rounding it', () => {
    // Math.round(1.005 * 100) is 100 and Math.round(0.305 * 100) is 31: half-cents went either way
    expect(majorToMinor(1.005, 'EUR')).toBeNull();
    expect(majorToMinor(0.1 + 0.2, 'EUR')).toBeNull();
    expect(majorToMinor(-5, 'EUR')).toBeNull();
  });

  it('fills a form from a stored amount with the ISO 4217 minor unit', () => {
    expect(minorToMajor(18_050, 'EUR')).toBe(180.5);
    expect(minorToMajor(undefined, 'EUR')).toBeNull();
    // ISO 4217 gives HUF 2 decimals; Intl's display data gives none
    expect(minorDigits('HUF')).toBe(2);
    expect(minorToMajor(150_000, 'HUF')).toBe(1_500);
  });
});
