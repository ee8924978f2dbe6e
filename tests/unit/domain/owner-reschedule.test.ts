// The owner's reschedule window: which statuses may move, and the same boundary as free cancellation (worked examples, by hand).
import { describe, expect, it } from 'vitest';
import { DomainInputError, MOVABLE_STATUSES, ownerCancellation, ownerReschedule, type BookingStatus } from '../../../packages/domain/src';

const START = new Date('2027-03-10T09:00:00Z');
const hoursBefore = (h: number) => new Date(START.getTime() - h * 3_600_000);

describe('ownerReschedule', () => {
  it('moves a requested or confirmed booking until exactly freeUntilHours before the start', () => {
    expect(ownerReschedule('confirmed', START, 24, hoursBefore(30))).toEqual({ allowed: true });
    expect(ownerReschedule('requested', START.toISOString(), 24, hoursBefore(24))).toEqual({ allowed: true });
    // one millisecond later the free window has closed: 23.99… hours left
    const late = ownerReschedule('confirmed', START, 24, new Date(hoursBefore(24).getTime() + 1));
    expect(late).toMatchObject({ allowed: false, reason: 'too-late' });
    expect(late.allowed === false && Math.floor(late.hoursLeft)).toBe(23);
  });

  it('no other status moves, however early', () => {
    const others = (['held', 'released', 'in_progress', 'completed', 'declined', 'expired', 'cancelled_by_owner', 'cancelled_by_partner', 'no_show'] as BookingStatus[]).filter((s) => !MOVABLE_STATUSES.includes(s));
    expect(others).toHaveLength(9);
    for (const status of others) expect(ownerReschedule(status, START, 24, hoursBefore(100)), status).toMatchObject({ allowed: false, reason: 'status' });
  });

  it('agrees with free cancellation at every boundary, including free until the start (0 hours): never once the appointment has begun', () => {
    for (const freeUntilHours of [0, 1, 24, 48]) {
      for (const offsetMs of [-3_600_000, -1, 0, 1, 3_600_000]) {
        const now = new Date(START.getTime() - freeUntilHours * 3_600_000 + offsetMs);
        const cancel = ownerCancellation({ freeUntilHours, feeMinor: 500 }, 5000, START, now);
        const freeCancel = cancel.allowed && cancel.feeMinor === 0;
        expect(ownerReschedule('confirmed', START, freeUntilHours, now).allowed, `${freeUntilHours} h, ${offsetMs} ms`).toBe(freeCancel);
      }
    }
    expect(ownerReschedule('confirmed', START, 0, START)).toMatchObject({ allowed: false, reason: 'too-late', hoursLeft: 0 });
  });

  it('refuses a start it cannot read and a window that is not whole hours ≥ 0', () => {
    expect(() => ownerReschedule('confirmed', 'next tuesday', 24, START)).toThrow(DomainInputError);
    for (const h of [-1, 1.5, Number.NaN]) expect(() => ownerReschedule('confirmed', START, h, START), String(h)).toThrow(DomainInputError);
  });
});
