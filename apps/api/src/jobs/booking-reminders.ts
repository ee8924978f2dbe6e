// Scheduled job: queues the reminders of bookings starting within a day.
import { runBookingReminders } from '../services/booking-jobs.service';
import type { JobContext } from './scheduler';

export async function bookingReminders({ dataSource, config, logger }: JobContext): Promise<void> {
  const result = await runBookingReminders({ dataSource, publicUrl: config.publicUrl, logger });
  if (result.sent) logger.info(result, 'booking reminders queued');
}
