// Zod issues as the field errors of a 422 problem detail: used by the route layer and by services
// that check stored data against a schema (so services need not import the HTTP layer).
import type { z } from 'zod';
import type { FieldError } from '@emberline/domain';

export function toFieldErrors(error: z.ZodError, prefix?: string): FieldError[] {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].filter(Boolean).join('.'),
    message: issue.message,
  }));
}
