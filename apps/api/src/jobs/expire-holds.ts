// Scheduled job: releases lapsed holds and expires unanswered bookings.
import { runExpireHolds } from '../services/booking-jobs.service';
import type { JobContext } from './scheduler';

export async function expireHolds({ dataSource, config, logger, payments }: JobContext): Promise<void> {
  const result = await runExpireHolds({ dataSource, payments: payments(), publicUrl: config.publicUrl, logger });
  if (result.released || result.paid || result.expired || result.failed) logger.info(result, 'lapsed holds and unanswered bookings handled');
}
