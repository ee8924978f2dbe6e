// The latest insurance expiry a partner may enter: 10 years ahead, with 29 February falling back.
import { describe, expect, it } from 'vitest';
import { documentFieldsSchema, latestInsuranceExpiry } from '../../../packages/domain/src';

describe('latestInsuranceExpiry', () => {
  it('is the same day 10 years on, 28 February for a 29 February', () => {
    expect(latestInsuranceExpiry('2026-12-05')).toBe('2036-12-05');
    expect(latestInsuranceExpiry('2028-02-29')).toBe('2038-02-28');
  });

  it('the upload fields accept the last day and refuse the day after and 9999-12-31', () => {
    const schema = documentFieldsSchema('2026-12-05');
    expect(schema.safeParse({ kind: 'insurance', expiresOn: '2036-12-05' }).success).toBe(true);
    for (const expiresOn of ['2036-12-06', '9999-12-31']) {
      const r = schema.safeParse({ kind: 'insurance', expiresOn });
      expect(r.success).toBe(false);
      expect(r.error!.issues[0]!.path).toEqual(['expiresOn']);
    }
  });
});
