// When a job may be started: a window before its start, on its local day in the partner's zone.
import { describe, expect, it } from 'vitest';
import { checkJobStart, DEFAULT_JOB_START_WINDOW_MINUTES, jobStartWindow } from '../../../packages/domain/src';

const VIENNA = 'Europe/Vienna';
const at = (iso: string) => new Date(iso);

describe('jobStartWindow', () => {
  it('opens two hours before a 10:00 job (09:00Z in winter) and closes at local midnight', () => {
    const w = jobStartWindow('2026-12-10T09:00:00Z', VIENNA, DEFAULT_JOB_START_WINDOW_MINUTES);
    expect(w.from.toISOString()).toBe('2026-12-10T07:00:00.000Z');
    expect(w.until.toISOString()).toBe('2026-12-10T23:00:00.000Z');
  });

  it('never opens before the local day: a 00:30 job may start from 00:00 Vienna, not 22:30 the day before', () => {
    const w = jobStartWindow('2026-12-09T23:30:00Z', VIENNA, 120);
    expect(w.from.toISOString()).toBe('2026-12-09T23:00:00.000Z');
    expect(w.until.toISOString()).toBe('2026-12-10T23:00:00.000Z');
  });

  it('counts real hours across the spring change: 04:00 CEST on 29 March 2026 opens at 01:00 CET', () => {
    // 02:00Z is 04:00 summer time; two real hours before is 00:00Z, 01:00 winter time
    const w = jobStartWindow('2026-03-29T02:00:00Z', VIENNA, 120);
    expect(w.from.toISOString()).toBe('2026-03-29T00:00:00.000Z');
    // the day has 23 hours: it began at 23:00Z and ends at 22:00Z
    expect(w.until.toISOString()).toBe('2026-03-29T22:00:00.000Z');
  });

  it('ends the 25-hour autumn day at the next local midnight', () => {
    const w = jobStartWindow('2026-10-25T08:00:00Z', VIENNA, 120);
    expect(w.from.toISOString()).toBe('2026-10-25T06:00:00.000Z');
    expect(w.until.toISOString()).toBe('2026-10-25T23:00:00.000Z');
  });

  it('refuses a negative or fractional window', () => {
    expect(() => jobStartWindow('2026-12-10T09:00:00Z', VIENNA, -1)).toThrow(RangeError);
    expect(() => jobStartWindow('2026-12-10T09:00:00Z', VIENNA, 1.5)).toThrow(RangeError);
  });
});

describe('checkJobStart', () => {
  const start = '2026-12-10T09:00:00Z';
  it('refuses days ahead and one minute before the window, naming the earliest time', () => {
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-07T09:00:00Z'))).toMatchObject({ allowed: false, reason: 'too-early', from: at('2026-12-10T07:00:00Z') });
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-10T06:59:00Z'))).toMatchObject({ allowed: false, reason: 'too-early' });
  });

  it('allows from the window, after the start and until the local day ends', () => {
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-10T07:00:00Z'))).toEqual({ allowed: true });
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-10T12:00:00Z'))).toEqual({ allowed: true });
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-10T22:59:59Z'))).toEqual({ allowed: true });
  });

  it('judges the day in the partner\'s zone, not UTC: 23:30Z on the 10th is already the 11th in Vienna', () => {
    expect(checkJobStart(start, VIENNA, 120, at('2026-12-10T23:30:00Z'))).toMatchObject({ allowed: false, reason: 'day-over' });
    // the same instant is still the 10th in New York, where a job at 09:00Z is at 04:00 local
    expect(checkJobStart(start, 'America/New_York', 120, at('2026-12-10T23:30:00Z'))).toEqual({ allowed: true });
  });

  it('a window of 0 allows starting only from the start itself', () => {
    expect(checkJobStart(start, VIENNA, 0, at('2026-12-10T08:59:59Z'))).toMatchObject({ allowed: false, reason: 'too-early' });
    expect(checkJobStart(start, VIENNA, 0, at('2026-12-10T09:00:00Z'))).toEqual({ allowed: true });
  });
});
