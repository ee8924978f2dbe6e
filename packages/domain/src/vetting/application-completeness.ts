// What still stops a partner's application from being submitted for review.
import { DomainInputError } from '../errors';
import { toFieldErrors } from '../schemas/field-errors';
import { AreaStepSchema, BusinessStepSchema, REQUIRED_DOCUMENTS, type Application } from '../schemas/onboarding';
import type { FieldError } from '../schemas/problem';

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/**
 * The missing or invalid parts of an application, as field errors: business details and service
 * area checked against their step schemas (the rules may have tightened since they were saved),
 * at least one capability still in the catalogue (`retiredClaims` are the claimed codes that are
 * not), and every required document; the insurance certificate must still be valid after
 * `today` (YYYY-MM-DD, compared as text, so it must be written in full).
 */
export function applicationMissing(app: Pick<Application, 'business' | 'area' | 'capabilities' | 'documents'>, retiredClaims: readonly string[], today: string): FieldError[] {
  if (!ISO_DATE.test(today)) throw new DomainInputError(`today must be a date written YYYY-MM-DD, got ${today}`);
  const missing: FieldError[] = [];
  if (!app.business) missing.push({ path: 'business', message: 'Enter your business details' });
  else {
    const check = BusinessStepSchema.safeParse({ ...app.business, vatId: app.business.vatId ?? '' });
    if (!check.success) missing.push(...toFieldErrors(check.error, 'business'));
  }
  if (!app.area) missing.push({ path: 'area', message: 'Set your base and service area' });
  else {
    const check = AreaStepSchema.safeParse(app.area);
    if (!check.success) missing.push(...toFieldErrors(check.error, 'area'));
  }
  if (app.capabilities.length === retiredClaims.length) missing.push({ path: 'capabilities', message: 'Pick at least one piece of equipment or skill' });
  for (const code of retiredClaims) missing.push({ path: 'capabilities', message: `"${code}" is no longer in the catalogue: remove it` });
  for (const kind of REQUIRED_DOCUMENTS) {
    const docs = app.documents.filter((d) => d.kind === kind);
    if (kind === 'insurance') {
      if (!docs.length) missing.push({ path: 'documents.insurance', message: 'Upload your liability insurance certificate' });
      else if (!docs.some((d) => d.expiresOn !== null && d.expiresOn > today)) {
        missing.push({ path: 'documents.insurance', message: 'Your insurance certificate has expired: upload the renewed one' });
      }
    } else if (!docs.length) {
      missing.push({ path: `documents.${kind}`, message: 'Upload your business registration extract' });
    }
  }
  return missing;
}
