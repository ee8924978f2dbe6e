// The partner's share line by line: gross − VAT = net, net − commission − fee = share, the issue's
// worked example (owner pays 318.00, commission 21.60, fee 5.02), and the quote using the same rule.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { computeQuote, partnerShareLines, type QuoteInput } from '../../../packages/domain/src';

/** Adds the lines as the screen shows them: totals stand, deducted lines are taken away. */
function runningTotals(lines: ReturnType<typeof partnerShareLines>['lines']) {
  const totals: number[] = [];
  let running = 0;
  for (const l of lines) {
    if (l.deducted) running -= l.amountMinor;
    else {
      // every total on screen is the sum of what stands above it
      if (totals.length) expect(l.amountMinor, l.kind).toBe(running);
      running = l.amountMinor;
      totals.push(running);
    }
  }
  return totals;
}

// A conversion at the workshop in Innsbruck: labour 180.00, parts kit 85.00, no travel; AT 20 %,
// commission 12 % of labour and travel, fee estimate 1.5 % of the gross + 0.25 (the network's settings).
const workshopConversion: QuoteInput = {
  currency: 'EUR',
  lines: [
    { kind: 'labour', description: 'Conversion', netMinor: 18_000 },
    { kind: 'parts', description: 'Parts kit', netMinor: 8_500 },
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

describe('partnerShareLines', () => {
  it('the issue\'s figures: 318.00 is 265.00 net + 53.00 VAT at AT 20 %; 243.40 was net − commission with the 5.02 fee left in', () => {
    const q = computeQuote(workshopConversion);
    // 20 % of 180.00 = 36.00 and of 85.00 = 17.00: VAT 53.00, gross 318.00
    expect([q.netMinor, q.vatMinor, q.grossMinor]).toEqual([26_500, 5_300, 31_800]);
    // commission 12 % of labour 180.00 (parts carry none) = 21.60; fee 1.5 % of 318.00 = 4.77, + 0.25 = 5.02
    expect([q.partner.commissionMinor, q.partner.processingFeeEstimateMinor]).toEqual([2_160, 502]);
    // the old screen: 318.00 − 21.60 − 5.02 "= 243.40", which is 265.00 − 21.60: VAT missing, fee not taken
    expect(q.netMinor - q.partner.commissionMinor).toBe(24_340);

    const { lines, shareMinor } = partnerShareLines({ grossMinor: q.grossMinor, vatMinor: q.vatMinor, ...q.partner });
    expect(lines.map((l) => [l.kind, l.deducted ? -l.amountMinor : l.amountMinor])).toEqual([
      ['gross', 31_800],
      ['vat', -5_300],
      ['net', 26_500],
      ['commission', -2_160],
      ['processing-fee', -502],
      ['share', 23_838],
    ]);
    expect(shareMinor).toBe(23_838);
    expect(runningTotals(lines)).toEqual([31_800, 26_500, 23_838]);
  });

  it('the quote stores the same share as the lines give', () => {
    const q = computeQuote(workshopConversion);
    expect(q.partner.partnerShareMinor).toBe(partnerShareLines({ grossMinor: q.grossMinor, vatMinor: q.vatMinor, ...q.partner }).shareMinor);
  });

  it('a reverse-charge booking has no VAT line amount: the net is the gross', () => {
    const q = computeQuote({ ...workshopConversion, customer: { kind: 'business', vatId: 'DE136695976' } });
    const { lines } = partnerShareLines({ grossMinor: q.grossMinor, vatMinor: q.vatMinor, ...q.partner });
    expect(lines.find((l) => l.kind === 'vat')!.amountMinor).toBe(0);
    expect(lines.find((l) => l.kind === 'net')!.amountMinor).toBe(26_500);
  });

  it('refuses figures that cannot be a booking: negative, fractional, VAT above the gross', () => {
    const ok = { grossMinor: 1_000, vatMinor: 200, commissionMinor: 50, processingFeeEstimateMinor: 40 };
    expect(() => partnerShareLines({ ...ok, commissionMinor: -1 })).toThrow(RangeError);
    expect(() => partnerShareLines({ ...ok, processingFeeEstimateMinor: 1.5 })).toThrow(RangeError);
    expect(() => partnerShareLines({ ...ok, vatMinor: 1_001 })).toThrow(RangeError);
  });

  it('the lines add up for any quote (fast-check)', () => {
    const line = fc.record({ kind: fc.constantFrom('labour' as const, 'parts' as const, 'travel' as const), description: fc.constant('x'), netMinor: fc.integer({ min: 0, max: 10_000_000 }) });
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 5 }), fc.constantFrom('AT', 'DE', 'FI', 'NO', 'CH'), fc.integer({ min: 0, max: 3000 }), (lines, country, commissionBp) => {
        const q = computeQuote({ ...workshopConversion, lines, workCountry: country, supplierCountry: country, commissionBp });
        const result = partnerShareLines({ grossMinor: q.grossMinor, vatMinor: q.vatMinor, ...q.partner });
        const totals = runningTotals(result.lines);
        expect(totals).toEqual([q.grossMinor, q.netMinor, q.partner.partnerShareMinor]);
        expect(result.shareMinor).toBe(q.netMinor - q.partner.commissionMinor - q.partner.processingFeeEstimateMinor);
      }),
      { numRuns: 200 },
    );
  });
});
