// The usual week of several technicians as one (the partner profile's hours): worked examples by
// hand, with zone offsets from the IANA time-zone database through luxon.
import { describe, expect, it } from 'vitest';
import { weeklyUnion, WorkingHoursSchema } from '../../../packages/domain/src';

const hours = (timeZone: string, weekly: Record<string, { start: string; end: string }[]>) =>
  WorkingHoursSchema.parse({ timeZone, weekly, minimumNoticeMinutes: 0, bookingHorizonDays: 30, bufferMinutes: 0 });
const day = (union: ReturnType<typeof weeklyUnion>, weekday: number) => union.find((d) => d.weekday === weekday)!.intervals;
// 2 December 2026: winter time, Vienna UTC+1, London UTC+0
const WINTER = new Date('2026-12-02T12:00:00Z');

describe('weeklyUnion', () => {
  it('merges overlapping and touching hours of two technicians in one zone', () => {
    const u = weeklyUnion([hours('Europe/Vienna', { monday: [{ start: '08:00', end: '12:00' }] }), hours('Europe/Vienna', { monday: [{ start: '11:00', end: '13:00' }, { start: '13:00', end: '15:00' }] })], 'Europe/Vienna', WINTER);
    expect(day(u, 1)).toEqual([{ start: '08:00', end: '15:00' }]);
    expect(day(u, 2)).toEqual([]);
  });

  it('moves hours kept in London by one hour into Vienna time: 08:00–12:00 London is 09:00–13:00 Vienna', () => {
    const u = weeklyUnion([hours('Europe/Vienna', { tuesday: [{ start: '08:00', end: '10:00' }] }), hours('Europe/London', { tuesday: [{ start: '08:00', end: '12:00' }] })], 'Europe/Vienna', WINTER);
    expect(day(u, 2)).toEqual([{ start: '08:00', end: '13:00' }]);
  });

  it('splits a stretch moved past midnight, and Sunday night continues on Monday', () => {
    const u = weeklyUnion([hours('Europe/London', { sunday: [{ start: '22:00', end: '24:00' }] })], 'Europe/Vienna', WINTER);
    // 22:00–24:00 London = 23:00–01:00 Vienna
    expect(day(u, 7)).toEqual([{ start: '23:00', end: '24:00' }]);
    expect(day(u, 1)).toEqual([{ start: '00:00', end: '01:00' }]);
  });
});
