// The insurance rules of vetting: when a partner is reminded before the liability certificate
// expires, and how many whole days are left.

/** Reminder thresholds in days before expiry, widest first (0 = on the day). */
export const INSURANCE_REMINDER_DAYS = [30, 7, 1, 0] as const;

const DAY_MS = 86_400_000;

/** Whole calendar days from one YYYY-MM-DD date to another (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

/** The tightest threshold a certificate expiring in `daysLeft` days has reached; null when none or already expired. */
export function reminderThreshold(daysLeft: number): number | null {
  if (daysLeft < 0) return null;
  let reached: number | null = null;
  for (const days of INSURANCE_REMINDER_DAYS) if (daysLeft <= days) reached = days;
  return reached;
}
