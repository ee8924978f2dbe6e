// What GET /api/health reports.
import { z } from 'zod';

export const HealthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  uptimeSeconds: z.number().int().nonnegative(),
  database: z.object({
    ok: z.boolean(),
    latencyMs: z.number().nonnegative().nullable(),
    pendingMigrations: z.number().int().nonnegative().nullable(),
    error: z.string().optional(),
  }),
});
export type Health = z.infer<typeof HealthSchema>;
export const HealthResponseSchema = z.object({ data: HealthSchema });
