// Scheduled job: the daily insurance check (reminders, suspensions).
import { runInsuranceExpiry } from '../services/insurance-expiry.service';
import { todayUtc } from '../services/onboarding.service';
import type { JobContext } from './scheduler';

export async function insuranceExpiry({ dataSource, config, logger }: JobContext): Promise<void> {
  const result = await runInsuranceExpiry({ dataSource, today: todayUtc(), publicUrl: config.publicUrl, logger });
  if (result.reminders || result.suspended) logger.info(result, 'insurance check done');
}
