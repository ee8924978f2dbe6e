// The booking lifecycle table and the owner's cancellation policy (worked examples, by hand).
import { describe, expect, it } from 'vitest';
import { BOOKING_STATUSES, BOOKING_TRANSITIONS, canTransition, OCCUPYING_STATUSES, ownerCancellation } from '../../../packages/domain/src';

describe('BOOKING_TRANSITIONS', () => {
  it('covers every status; the end states lead nowhere', () => {
    expect(Object.keys(BOOKING_TRANSITIONS).sort()).toEqual([...BOOKING_STATUSES].sort());
    for (const end of ['released', 'completed', 'declined', 'expired', 'cancelled_by_owner', 'cancelled_by_partner', 'no_show'] as const) expect(BOOKING_TRANSITIONS[end]).toEqual([]);
  });

  it('lets each party make only its own moves', () => {
    expect(canTransition('requested', 'confirmed', 'partner')).toBe(true);
    expect(canTransition('requested', 'confirmed', 'owner')).toBe(false);
    expect(canTransition('held', 'requested', 'owner')).toBe(false);
    expect(canTransition('held', 'requested', 'system')).toBe(true);
    expect(canTransition('confirmed', 'cancelled_by_partner', 'partner')).toBe(true);
    expect(canTransition('in_progress', 'cancelled_by_owner', 'owner')).toBe(false);
    expect(canTransition('completed', 'confirmed', 'partner')).toBe(false);
  });

  it('live and completed bookings take a technician\'s time', () => {
    expect([...OCCUPYING_STATUSES].sort()).toEqual(['completed', 'confirmed', 'held', 'in_progress', 'requested']);
  });
});

describe('ownerCancellation', () => {
  const policy = { freeUntilHours: 24, feeMinor: 5_000 };
  const start = '2026-12-10T09:00:00Z';
  it('free 24 h or more before: full refund of 348.72', () => {
    expect(ownerCancellation(policy, 34_872, start, new Date('2026-12-09T09:00:00Z'))).toEqual({ allowed: true, feeMinor: 0, refundMinor: 34_872 });
  });
  it('within 24 h: a 50.00 fee, 348.72 − 50.00 = 298.72 back', () => {
    expect(ownerCancellation(policy, 34_872, start, new Date('2026-12-09T09:00:01Z'))).toEqual({ allowed: true, feeMinor: 5_000, refundMinor: 29_872 });
  });
  it('the fee never exceeds what was paid; after the start nothing can be cancelled', () => {
    expect(ownerCancellation(policy, 3_000, start, new Date('2026-12-10T08:00:00Z'))).toEqual({ allowed: true, feeMinor: 3_000, refundMinor: 0 });
    expect(ownerCancellation(policy, 34_872, start, new Date('2026-12-10T09:00:00Z')).allowed).toBe(false);
  });
});
