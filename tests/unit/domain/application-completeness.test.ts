// What still stops a partner's application from being submitted: each step, retired claims, and the insurance date.
import { describe, expect, it } from 'vitest';
import { applicationMissing, DomainInputError, toFieldErrors, type PartnerDocument } from '../../../packages/domain/src';
import { z } from 'zod';

const business = { legalName: 'Funkenflug Technik GmbH', tradingName: 'Funkenflug', country: 'AT' as const, street: 'Hauptplatz 1', postalCode: '8010', city: 'Graz', vatId: null, phone: '+43 316 123456' };
const area = { baseLabel: 'Graz', baseLat: 47.07, baseLng: 15.44, mode: 'mobile' as const, radiusKm: 60, workshopAddress: null };
const capability = { code: 'vci-pass-thru', name: 'Pass-thru interface', category: 'diagnostics' as const, notes: null, serial: null };
const doc = (kind: PartnerDocument['kind'], expiresOn: string | null = null): PartnerDocument => ({ id: `doc-${kind}-${expiresOn}`, kind, fileName: `${kind}.pdf`, contentType: 'application/pdf', sizeBytes: 1000, expiresOn, capabilityCode: null, uploadedAt: '2026-01-01T00:00:00Z' });
const TODAY = '2026-12-05';
const complete = { business, area, capabilities: [capability], documents: [doc('insurance', '2027-06-30'), doc('registration')] };
const paths = (missing: { path: string }[]) => missing.map((m) => m.path);

describe('applicationMissing', () => {
  it('nothing is missing from a complete application', () => {
    expect(applicationMissing(complete, [], TODAY)).toEqual([]);
  });

  it('an empty application misses every step and both required documents', () => {
    expect(paths(applicationMissing({ business: null, area: null, capabilities: [], documents: [] }, [], TODAY))).toEqual(['business', 'area', 'capabilities', 'documents.insurance', 'documents.registration']);
  });

  it('checks saved steps against today\'s step rules, with field paths under the step', () => {
    const missing = applicationMissing({ ...complete, business: { ...business, phone: 'call me' }, area: { ...area, radiusKm: null } }, [], TODAY);
    expect(paths(missing)).toEqual(['business.phone', 'area.radiusKm']);
  });

  it('a claim retired from the catalogue must be removed, and does not count as the one capability', () => {
    const missing = applicationMissing(complete, ['vci-pass-thru'], TODAY);
    expect(missing).toEqual([
      { path: 'capabilities', message: 'Pick at least one piece of equipment or skill' },
      { path: 'capabilities', message: '"vci-pass-thru" is no longer in the catalogue: remove it' },
    ]);
  });

  it('insurance must run beyond today: expiring today is expired, one valid certificate among old ones is enough', () => {
    const withInsurance = (...expiries: (string | null)[]) => applicationMissing({ ...complete, documents: [...expiries.map((e) => doc('insurance', e)), doc('registration')] }, [], TODAY);
    expect(withInsurance(TODAY)).toEqual([{ path: 'documents.insurance', message: 'Your insurance certificate has expired: upload the renewed one' }]);
    expect(withInsurance(null)).toHaveLength(1);
    expect(withInsurance('2026-12-06')).toEqual([]);
    expect(withInsurance('2025-01-01', '2027-01-01')).toEqual([]);
  });

  it('refuses a today that would compare wrongly as text', () => {
    expect(() => applicationMissing(complete, [], '2026-12-5')).toThrow(DomainInputError);
  });
});

describe('toFieldErrors', () => {
  it('joins the prefix and the issue path with dots', () => {
    const r = z.object({ a: z.object({ b: z.string() }) }).safeParse({ a: { b: 1 } });
    expect(r.success).toBe(false);
    expect(paths(toFieldErrors(r.error!, 'body'))).toEqual(['body.a.b']);
    expect(paths(toFieldErrors(r.error!))).toEqual(['a.b']);
  });
});
