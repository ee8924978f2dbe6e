// The network's settings the quote needs: the platform commission and the processing-fee
// estimate, kept as rows of network_setting (written by the bookings migration).
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
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
