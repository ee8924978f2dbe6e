// The owner's cancellation terms in words, from the domain's one reading of them: the offers
// table, the offer form and a booking's quote say the same thing.
import { cancellationTerms } from '@emberline/domain';
import type { useFormat } from '@emberline/ui';

type Translate = (key: string, values?: Record<string, unknown>) => string;

export function cancellationText(policy: { freeUntilHours: number; feeMinor: number }, currency: string, t: Translate, format: ReturnType<typeof useFormat>, minorUnits?: number): string {
  const terms = cancellationTerms(policy);
  if (terms.kind === 'free-until-start') return t('offers.cancellationFreeUntilStart');
  return t('offers.cancellationText', { hours: format.number(terms.freeUntilHours, { style: 'unit', unit: 'hour', unitDisplay: 'long' }), fee: format.money(terms.feeMinor, currency, minorUnits) });
}
