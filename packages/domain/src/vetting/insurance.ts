// The insurance rules of vetting: when a partner is reminded before the liability certificate
// expires, and how many whole days are left.

/** Reminder thresholds in days before expiry, widest first (0 = on the day). */
export const INSURANCE_REMINDER_DAYS = [30, 7, 1, 0] as const;

const DAY_MS = 86_400_000;

/** Liability cover runs a year or a few; an expiry further ahead is a typing slip (31 Dec 9999). */
export const INSURANCE_MAX_YEARS_AHEAD = 10;

/** The latest expiry accepted on `today` (YYYY-MM-DD): the same day 10 years on, 28 Feb for a 29 Feb. */
export function latestInsuranceExpiry(today: string): string {
  const [y, m, d] = today.split('-').map(Number) as [number, number, number];
  const year = y + INSURANCE_MAX_YEARS_AHEAD;
  const lastDay = new Date(Date.UTC(year, m, 0)).getUTCDate();
  return `${String(year).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(Math.min(d, lastDay)).padStart(2, '0')}`;
}

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
