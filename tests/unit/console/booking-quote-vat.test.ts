// The Console's quote says which VAT rule applied, in the reader's language, from the rule's code
// and parameters (the domain's VAT case table); quotes stored before the rule was recorded keep their old text.
import { afterEach, describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import type { Booking } from '@emberline/domain';
import BookingQuote from '@/views/bookings/booking-quote.vue';
import { i18n } from '@/locales';

const quote: Booking['quote'] = {
  currency: 'EUR',
  minorUnits: 2,
  lines: [{ kind: 'labour', description: 'Service', netMinor: 12_000, vatRateBp: 0, vatMinor: 0, grossMinor: 12_000 }],
  netMinor: 12_000,
  vatMinor: 0,
  grossMinor: 12_000,
  vat: {
    treatment: 'reverse-charge',
    country: 'DE',
    rateBp: 0,
    validFrom: null,
    note: 'Reverse charge: VAT to be accounted for by the recipient (Council Directive 2006/112/EC, Art. 196).',
    rule: { code: 'b2b-reverse-charge', article: 'Art. 44, Art. 196', params: { customer: 'business', supplierCountry: 'AT', workCountry: 'AT', customerCountry: 'DE', placeOfSupply: 'DE' } },
  },
  depositMinor: 0,
  cancellation: { freeUntilHours: 24, feeMinor: 0 },
};

const note = (q: Booking['quote']) => mount(BookingQuote, { props: { quote: q }, global: { plugins: [i18n] } }).find('[data-testid="quote-vat-rule"]').text();

afterEach(() => {
  i18n.global.locale.value = 'en';
});

describe('the quote\'s VAT rule in words (Console)', () => {
  it('names the rule, the country and the articles: reverse charge for a German business (Art. 44, Art. 196)', () => {
    expect(note(quote)).toBe('Reverse charge: the business customer in Germany accounts for the VAT (EU VAT Directive, Art. 44, Art. 196).');
  });

  it('in German', () => {
    i18n.global.locale.value = 'de';
    expect(note(quote)).toBe('Steuerschuldnerschaft des Leistungsempfängers: Das Kundenunternehmen in Deutschland führt die Umsatzsteuer ab (EU-Mehrwertsteuerrichtlinie, Art. 44, Art. 196).');
  });

  it('a quote stored before the rule was recorded keeps the old wording', () => {
    expect(note({ ...quote, vat: { ...quote.vat, rule: undefined } })).toContain('Reverse charge: the business customer accounts for the VAT.');
  });
});
