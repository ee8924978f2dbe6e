// Field paths of an application ("business.vatId", "documents.insurance", "capabilities.<code>"):
// which step each belongs to, and server field errors scoped to one step's form.
import type { Application } from '@emberline/domain';

export const STEPS = ['business', 'area', 'capabilities', 'documents', 'review'] as const;
export type StepKey = (typeof STEPS)[number];

/** Paths an admin can attach a note to, fixed part first; claimed capabilities follow. */
export const FIXED_FIELD_PATHS = [
  'business.legalName',
  'business.tradingName',
  'business.country',
  'business.street',
  'business.postalCode',
  'business.city',
  'business.vatId',
  'business.phone',
  'area.baseLabel',
  'area.baseLat',
  'area.mode',
  'area.workshopAddress',
  'area.radiusKm',
  'capabilities',
  'documents.insurance',
  'documents.registration',
  'documents.qualification',
] as const;

export function fieldPathsOf(application: Application): string[] {
  return [...FIXED_FIELD_PATHS, ...application.capabilities.map((c) => `capabilities.${c.code}`)];
}

/** The step a path belongs to ("business.vatId" -> business; "documents" -> documents). */
export function stepOf(path: string): StepKey {
  const head = path.split('.')[0] ?? '';
  return (STEPS as readonly string[]).includes(head) ? (head as StepKey) : 'review';
}

/** A copy of an API error whose field paths lose the step prefix, so a step's form can place them. */
export function scopeError(error: unknown, step: StepKey): unknown {
  if (!error || typeof error !== 'object' || !('problem' in error)) return error;
  const problem = (error as { problem: { errors?: { path: string; message: string }[] } }).problem;
  if (!problem.errors) return error;
  const prefix = `${step}.`;
  return Object.assign(Object.create(Object.getPrototypeOf(error) as object) as object, error, {
    problem: { ...problem, errors: problem.errors.map((e) => ({ ...e, path: e.path.startsWith(prefix) ? e.path.slice(prefix.length) : e.path })) },
  });
}

/** Change-request notes for one step, keyed by the path without the step prefix. */
export function notesFor(application: Application | null, step: StepKey): Record<string, string> {
  const out: Record<string, string> = {};
  const fields = application?.status === 'changes_requested' ? (application.changeRequest?.fields ?? {}) : {};
  for (const [path, note] of Object.entries(fields)) {
    if (path === step) out[''] = note;
    else if (path.startsWith(`${step}.`)) out[path.slice(step.length + 1)] = note;
  }
  return out;
}

/** Words for a field path: "business.vatId" -> "VAT ID", "capabilities.<code>" -> "Equipment: <name>". */
export function fieldLabel(path: string, application: Application | null, t: (key: string, named?: Record<string, unknown>) => string, te: (key: string) => boolean): string {
  if (path.startsWith('capabilities.')) {
    const code = path.slice('capabilities.'.length);
    const name = application?.capabilities.find((c) => c.code === code)?.name ?? code;
    return t('application.capabilityField', { name });
  }
  const key = `application.fields.${path}`;
  return te(key) ? t(key) : path;
}
