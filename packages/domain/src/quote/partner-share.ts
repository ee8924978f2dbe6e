// The partner's share of one booking, line by line: what the owner pays, less the VAT collected for
// the partner's own VAT return, is the net; less the network's commission and the processing-fee
// estimate, it is the partner's share. The quote and the Console both take the share from here.

export type PartnerShareLineKind = 'gross' | 'vat' | 'net' | 'commission' | 'processing-fee' | 'share';

export interface PartnerShareLine {
  kind: PartnerShareLineKind;
  /** Always ≥ 0 except a share a fee outweighs; `deducted` lines are taken away from the line above. */
  amountMinor: number;
  /** True for what is taken away (VAT, commission, fee); false for the totals. */
  deducted: boolean;
}

export interface PartnerShareFigures {
  grossMinor: number;
  vatMinor: number;
  commissionMinor: number;
  processingFeeEstimateMinor: number;
}

function assertWhole(label: string, v: number): void {
  if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`${label} must be a whole number of minor units ≥ 0, got ${v}`);
}

/**
 * gross − VAT = net; net − commission − processing-fee estimate = share. The VAT is the partner's
 * to declare, so it is never part of the share; the fee is the partner's cost, estimated until the
 * provider's statement gives the real one. The share can be negative when the fee outweighs a tiny job.
 */
export function partnerShareLines(f: PartnerShareFigures): { lines: PartnerShareLine[]; shareMinor: number } {
  assertWhole('gross', f.grossMinor);
  assertWhole('VAT', f.vatMinor);
  assertWhole('commission', f.commissionMinor);
  assertWhole('processing fee', f.processingFeeEstimateMinor);
  if (f.vatMinor > f.grossMinor) throw new RangeError(`VAT ${f.vatMinor} is more than the gross ${f.grossMinor}`);
  const netMinor = f.grossMinor - f.vatMinor;
  const shareMinor = netMinor - f.commissionMinor - f.processingFeeEstimateMinor;
  return {
    shareMinor,
    lines: [
      { kind: 'gross', amountMinor: f.grossMinor, deducted: false },
      { kind: 'vat', amountMinor: f.vatMinor, deducted: true },
      { kind: 'net', amountMinor: netMinor, deducted: false },
      { kind: 'commission', amountMinor: f.commissionMinor, deducted: true },
      { kind: 'processing-fee', amountMinor: f.processingFeeEstimateMinor, deducted: true },
      { kind: 'share', amountMinor: shareMinor, deducted: false },
    ],
  };
}
