// The shared reader of numbers sent as text: decimal notation only, blank is not 0, hex is not a number.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { LocalDateSchema, SearchQuerySchema, queryNumber } from '../../../packages/domain/src';

const limit = queryNumber(z.number().int().min(1).max(50)).default(20);

describe('queryNumber', () => {
  it.each(['16', '+16', '16.0', '1.6e1', '0.16E2'])('reads %s as 16', (text) => {
    expect(limit.parse(text)).toBe(16);
  });

  it.each(['', ' ', ' 16', '16 ', '0x10', '0b10000', '0o20', '1_6', 'Infinity', '1e999', 'NaN', '16px', '--16'])('refuses %j', (text) => {
    expect(limit.safeParse(text).success).toBe(false);
  });

  it('keeps the default for a missing value and takes JSON numbers as they are', () => {
    expect(limit.parse(undefined)).toBe(20);
    expect(limit.parse(7)).toBe(7);
  });

  it('says what to enter, and the limits still speak with their own messages', () => {
    const lat = queryNumber(z.number().min(-90, 'Latitude is −90 to 90'), 'Enter a latitude');
    expect(lat.safeParse('').error?.issues[0]?.message).toBe('Enter a latitude');
    expect(lat.safeParse('-91').error?.issues[0]?.message).toBe('Latitude is −90 to 90');
  });

  it('is what the search query uses: a blank latitude is refused, not read as 0', () => {
    const r = SearchQuerySchema.safeParse({ serviceType: 'handset-pairing', lat: '', lng: '11.4' });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.'))).toEqual(['lat']);
  });
});

describe('LocalDateSchema', () => {
  it('refuses dates the calendar does not have, with one message each', () => {
    expect(LocalDateSchema.safeParse('2031-02-31').error?.issues.map((i) => i.message)).toEqual(['This date does not exist']);
    expect(LocalDateSchema.safeParse('31.12.2030').error?.issues).toHaveLength(1);
    expect(LocalDateSchema.parse('2028-02-29')).toBe('2028-02-29');
  });
});
