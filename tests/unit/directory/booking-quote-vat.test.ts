// The Directory's quote says which VAT rule applied, in the reader's language, from the rule's code
// and parameters (the domain's VAT case table); quotes stored before the rule was recorded keep their old text.
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import type { OwnerQuote } from '@emberline/api-client';
import BookingQuote from '@/components/booking-quote.vue';
import { i18n, loadBookingMessages } from '@/locales';

const base: OwnerQuote = {
  currency: 'EUR',
  minorUnits: 2,
  lines: [{ kind: 'labour', description: 'Service', netMinor: 12_000, vatRateBp: 2000, vatMinor: 2_400, grossMinor: 14_400 }],
  netMinor: 12_000,
  vatMinor: 2_400,
  grossMinor: 14_400,
  vat: {
    treatment: 'standard',
    country: 'AT',
    rateBp: 2000,
    validFrom: '2016-01-01',
    note: null,
    rule: { code: 'b2b-domestic', article: 'Art. 44', params: { customer: 'business', supplierCountry: 'AT', workCountry: 'DE', customerCountry: 'AT', placeOfSupply: 'AT' } },
  },
  depositMinor: 0,
  cancellation: { freeUntilHours: 24, feeMinor: 0 },
};

const note = (quote: OwnerQuote) => mount(BookingQuote, { props: { quote }, global: { plugins: [i18n] } }).find('[data-testid="reverse-charge"]');

beforeAll(async () => {
  await loadBookingMessages();
});
afterEach(() => {
  i18n.global.locale.value = 'en';
});

describe('the quote\'s VAT rule in words', () => {
  it('names the rule and its article: an Austrian business, work in Bavaria → Austrian VAT (Art. 44)', () => {
    expect(note(base).text()).toContain('VAT of Austria, where the business customer is established (EU VAT Directive, Art. 44).');
  });

  it('says when no EU VAT is charged (work in Switzerland for a consumer, Art. 54(2)(b))', () => {
    const outside: OwnerQuote = {
      ...base,
      vatMinor: 0,
      grossMinor: 12_000,
      vat: { treatment: 'outside-scope', country: 'CH', rateBp: 0, validFrom: null, note: null, rule: { code: 'b2c-outside-eu', article: 'Art. 54(2)(b)', params: { customer: 'consumer', supplierCountry: 'AT', workCountry: 'CH', customerCountry: null, placeOfSupply: 'CH' } } },
    };
    const w = mount(BookingQuote, { props: { quote: outside }, global: { plugins: [i18n] } });
    expect(w.find('[data-testid="quote-vat"]').text()).toContain('No EU VAT (Switzerland)');
    expect(w.find('[data-testid="reverse-charge"]').text()).toContain('No EU VAT: the work is done in Switzerland, outside the EU (Art. 54(2)(b)).');
  });

  it('speaks German where the reader reads German', () => {
    i18n.global.locale.value = 'de';
    expect(note(base).text()).toContain('Umsatzsteuer von Österreich, wo das Kundenunternehmen ansässig ist (EU-Mehrwertsteuerrichtlinie, Art. 44).');
  });

  it('a quote stored without a rule shows no rule text for standard VAT', () => {
    expect(note({ ...base, vat: { ...base.vat, rule: undefined } }).exists()).toBe(false);
  });
});
