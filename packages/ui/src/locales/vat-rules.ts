// Words for each rule of the domain's VAT case table (VAT_CASES), in English and German; both apps' quotes render them.
import type { VatRuleCode } from '@emberline/domain';

type VatRuleMessages = Record<VatRuleCode, string>;

// {country} is the place of supply, {article} the article of Council Directive 2006/112/EC
export const vatRulesEn: VatRuleMessages = {
  'b2c-work-place': 'VAT of {country}, where the work is done (EU VAT Directive, {article}).',
  'b2c-domestic-outside-eu': 'VAT of {country} under its own law: the work is done there by a partner established there.',
  'b2c-outside-eu': 'No EU VAT: the work is done in {country}, outside the EU ({article}). Any VAT due there is not part of this price.',
  'b2b-domestic': 'VAT of {country}, where the business customer is established (EU VAT Directive, {article}).',
  'b2b-reverse-charge': 'Reverse charge: the business customer in {country} accounts for the VAT (EU VAT Directive, {article}).',
  'b2b-domestic-outside-eu': 'VAT of {country} under its own law: the business customer and the partner are both established there.',
  'b2b-outside-eu': 'No EU VAT: the business customer is established in {country}, outside the EU ({article}). Any VAT due there is not part of this price.',
};

export const vatRulesDe: VatRuleMessages = {
  'b2c-work-place': 'Umsatzsteuer von {country}, wo die Arbeit ausgeführt wird (EU-Mehrwertsteuerrichtlinie, {article}).',
  'b2c-domestic-outside-eu': 'Mehrwertsteuer von {country} nach dortigem Recht: Ein dort ansässiger Partner führt die Arbeit dort aus.',
  'b2c-outside-eu': 'Keine EU-Umsatzsteuer: Die Arbeit wird in {country} ausgeführt, außerhalb der EU ({article}). Dort etwa fällige Steuer ist in diesem Preis nicht enthalten.',
  'b2b-domestic': 'Umsatzsteuer von {country}, wo das Kundenunternehmen ansässig ist (EU-Mehrwertsteuerrichtlinie, {article}).',
  'b2b-reverse-charge': 'Steuerschuldnerschaft des Leistungsempfängers: Das Kundenunternehmen in {country} führt die Umsatzsteuer ab (EU-Mehrwertsteuerrichtlinie, {article}).',
  'b2b-domestic-outside-eu': 'Mehrwertsteuer von {country} nach dortigem Recht: Kundenunternehmen und Partner sind beide dort ansässig.',
  'b2b-outside-eu': 'Keine EU-Umsatzsteuer: Das Kundenunternehmen ist in {country} ansässig, außerhalb der EU ({article}). Dort etwa fällige Steuer ist in diesem Preis nicht enthalten.',
};
