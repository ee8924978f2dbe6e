// The partner landing page's sums: jobs by day in the partner's zone, and owners' payments for
// completed jobs per currency. Day boundaries are checked across a zone's midnight and a clock
// change (Europe/Berlin leaves summer time on 2026-10-25, IANA tz database as read by Intl).
import { describe, expect, it } from 'vitest';
import { paidForCompleted, upcomingJobs, type BookingStatus } from '@emberline/domain';

const job = (id: string, start: string, status: BookingStatus = 'confirmed', grossMinor = 10_000, currency = 'EUR') => ({ id, start, status, quote: { currency, grossMinor } });

describe('upcomingJobs', () => {
  const now = new Date('2026-10-24T21:30:00Z'); // 23:30 on Saturday 24 October in Berlin

  it('splits by the calendar day in the given zone, not UTC, and keeps time order', () => {
    const list = [
      job('late-today', '2026-10-24T21:45:00Z'), // 23:45 Berlin, still today
      job('early-today', '2026-10-24T06:00:00Z'),
      job('tomorrow', '2026-10-24T22:30:00Z'), // 00:30 Berlin on the 25th (UTC still says the 24th)
      job('in-six-days', '2026-10-30T10:00:00Z'),
      job('in-seven-days', '2026-10-31T10:00:00Z'),
    ];
    const { today, later } = upcomingJobs(list, now, 'Europe/Berlin');
    expect(today.map((j) => j.id)).toEqual(['early-today', 'late-today']);
    expect(later.map((j) => j.id)).toEqual(['tomorrow', 'in-six-days']);
  });

  it('leaves out requests, holds and cancelled or declined bookings', () => {
    const statuses: BookingStatus[] = ['held', 'requested', 'released', 'declined', 'expired', 'cancelled_by_owner', 'cancelled_by_partner', 'no_show', 'confirmed', 'in_progress', 'completed'];
    const list = statuses.map((s, i) => job(s, `2026-10-24T0${i % 10}:00:00Z`, s));
    expect(upcomingJobs(list, now, 'Europe/Berlin').today.map((j) => j.status).sort()).toEqual(['completed', 'confirmed', 'in_progress']);
  });
});

describe('paidForCompleted', () => {
  it('sums gross amounts of completed jobs per currency, in integer minor units', () => {
    const sums = paidForCompleted([
      job('a', '2026-10-01T08:00:00Z', 'completed', 31_800),
      job('b', '2026-10-02T08:00:00Z', 'completed', 12_345),
      job('c', '2026-10-03T08:00:00Z', 'confirmed', 99_999),
      job('d', '2026-10-04T08:00:00Z', 'completed', 50_000, 'CHF'),
    ]);
    expect(sums).toEqual([
      { currency: 'CHF', grossMinor: 50_000, jobs: 1 },
      { currency: 'EUR', grossMinor: 44_145, jobs: 2 },
    ]);
  });
});
