// Zod issues as the field errors of a 422 problem detail: the route layer's request checks and the domain's completeness checks share them.
import type { z } from 'zod';
import type { FieldError } from './problem';

export function toFieldErrors(error: z.ZodError, prefix?: string): FieldError[] {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].filter(Boolean).join('.'),
    message: issue.message,
  }));
}
