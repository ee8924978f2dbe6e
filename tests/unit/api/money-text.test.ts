// Money in the API's own text (e-mails, the fake payment page): exact decimals, ISO 4217 digits.
import { describe, expect, it } from 'vitest';
import { renderMail } from '../../../apps/api/src/mail/render';
import { formatMinor } from '../../../apps/api/src/fakes/payments/payment-page';

const when = { at: '2027-01-12T08:00:00.000Z', timeZone: 'Europe/Vienna' };
const cancelled = (fee: { minor: number; currency: string }) =>
  renderMail('booking-cancelled', 'en', { name: 'Anna', reference: 'EMB-K7Q2MX', serviceName: 'Parking heater conversion', start: when, fee, refund: { minor: 0, currency: fee.currency }, link: 'https://emberline.test/b' }).text;

describe('money in e-mails', () => {
  it('writes the exact amount where dividing by 100 in floats gives a cent more', () => {
    // 7 100 000 000 000 001 cents: the total guard of the quote allows up to 2^53 minor units
    expect(cancelled({ minor: 7_100_000_000_000_001, currency: 'EUR' })).toContain('€71,000,000,000,000.01');
  });

  it('writes the ISO 4217 minor unit even where Intl (CLDR) shows none', () => {
    // 150 000 fillér is 1 500.00 HUF (ISO 4217: 2 decimals), not 150 000 HUF
    expect(cancelled({ minor: 150_000, currency: 'HUF' })).toContain('HUF\u00a01,500.00');
    expect(cancelled({ minor: 33_432, currency: 'EUR' })).toContain('€334.32');
  });
});

describe('money on the fake payment page', () => {
  it('writes minor units in the currency the provider sends in lower case', () => {
    expect(formatMinor(33_432, 'eur')).toBe('€334.32');
    expect(formatMinor(7_100_000_000_000_001, 'eur')).toBe('€71,000,000,000,000.01');
    expect(formatMinor(150_000, 'huf')).toBe('HUF\u00a01,500.00');
  });
});
