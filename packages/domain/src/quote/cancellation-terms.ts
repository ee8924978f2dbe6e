// What an owner's cancellation terms come to, in one place for every screen that words them: with
// no fee (or no free period) cancelling is free until the job starts, never "at any time".

export type CancellationTerms = { kind: 'free-until-start' } | { kind: 'fee-after'; freeUntilHours: number; feeMinor: number };

/** Matches `ownerCancellation`: no fee means free until the start; after the start nothing is cancelled. */
export function cancellationTerms(policy: { freeUntilHours: number; feeMinor: number }): CancellationTerms {
  if (policy.feeMinor <= 0 || policy.freeUntilHours <= 0) return { kind: 'free-until-start' };
  return { kind: 'fee-after', freeUntilHours: policy.freeUntilHours, feeMinor: policy.feeMinor };
}
