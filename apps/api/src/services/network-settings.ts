// The network's settings: the platform commission and the processing-fee estimate the quote
// needs, and the job start window; kept as rows of network_setting (written by migrations).
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import { DEFAULT_JOB_START_WINDOW_MINUTES } from '@emberline/domain';
import { json } from '../lib/json-column';

const SettingsSchema = z.object({
  'platform-commission': z.object({ bp: z.number().int().min(0).max(10_000) }),
  /** An estimate shown to partners; the provider's statement is what counts. */
  'processing-fee-estimate': z.object({ percentBp: z.number().int().min(0).max(10_000), fixedMinor: z.number().int().min(0) }),
});

export interface QuoteSettings {
  commissionBp: number;
  processingFee: { percentBp: number; fixedMinor: number };
}

export async function quoteSettings(manager: EntityManager): Promise<QuoteSettings> {
  const rows: { setting_key: string; value: unknown }[] = await manager.query(
    "SELECT setting_key, value FROM network_setting WHERE setting_key IN ('platform-commission', 'processing-fee-estimate')",
  );
  const settings = SettingsSchema.parse(Object.fromEntries(rows.map((r) => [r.setting_key, json(r.value)])));
  return { commissionBp: settings['platform-commission'].bp, processingFee: settings['processing-fee-estimate'] };
}

const JobStartWindowSchema = z.object({ minutes: z.number().int().min(0).max(24 * 60) });

/** Minutes before its appointment a job may be started (the domain's default when the row is missing). */
export async function jobStartWindowMinutes(manager: EntityManager): Promise<number> {
  const [row]: { value: unknown }[] = await manager.query("SELECT value FROM network_setting WHERE setting_key = 'job-start-window'");
  return row ? JobStartWindowSchema.parse(json(row.value)).minutes : DEFAULT_JOB_START_WINDOW_MINUTES;
}
