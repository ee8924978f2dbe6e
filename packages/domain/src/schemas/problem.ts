// RFC 9457 problem details as Emberline's API sends them, shared by server, client and tests.
import { z } from 'zod';

export const FieldErrorSchema = z.object({
  path: z.string().describe('Dotted path of the offending field, e.g. "address.city"'),
  message: z.string(),
});
export type FieldError = z.infer<typeof FieldErrorSchema>;

export const ProblemDetailsSchema = z.object({
  type: z.string().describe('A URI reference naming the problem type'),
  title: z.string(),
  status: z.number().int().min(400).max(599),
  detail: z.string().optional(),
  instance: z.string().optional(),
  code: z.string().describe('Stable machine-readable code, e.g. VALIDATION_FAILED'),
  errors: z.array(FieldErrorSchema).optional(),
  requestId: z.string().optional(),
  earliestStart: z.string().optional().describe('START_TOO_EARLY: the first instant the job may be started'),
});
export type ProblemDetails = z.infer<typeof ProblemDetailsSchema>;

export const PROBLEM_CONTENT_TYPE = 'application/problem+json';
