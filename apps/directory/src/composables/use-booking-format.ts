// Bookings as words: a start in the technician's time zone and in the owner's, money of a quote,
// VAT rates, addresses and the cancellation policy, all through the shared format helpers.
import { useI18n } from 'vue-i18n';
import type { BookingAddress } from '@emberline/domain';
import { useFormat } from '@emberline/ui';

/** The owner's time zone, as the browser knows it. */
export function ownerZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

const zoneName = (timeZone: string) => timeZone.replace(/_/g, ' ');

interface Money {
  currency: string;
  minorUnits: number;
}

export function useBookingFormat() {
  const { t } = useI18n();
  const format = useFormat();

  const day = (instant: string, timeZone: string) => format.date(instant, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone });
  const dayShort = (instant: string, timeZone: string) => format.date(instant, { weekday: 'short', day: 'numeric', month: 'short', timeZone });
  const time = (instant: string, timeZone: string) => format.date(instant, { hour: '2-digit', minute: '2-digit', timeZone });

  /**
   * A start (and end) in the technician's zone, and the same moment in the owner's when the two
   * differ: { local: "Tuesday 9 December 2026, 09:00–10:30", zone: "Europe/Vienna", own: "08:00 … (Europe/London)" | null }.
   */
  function when(start: string, timeZone: string, end?: string | null) {
    const local = end ? t('bookings.format.range', { day: day(start, timeZone), start: time(start, timeZone), end: time(end, timeZone) }) : t('bookings.format.at', { day: day(start, timeZone), time: time(start, timeZone) });
    const mine = ownerZone();
    const sameClock = time(start, timeZone) === time(start, mine) && day(start, timeZone) === day(start, mine);
    const own = mine === timeZone || sameClock ? null : t('bookings.format.ownTime', { day: dayShort(start, mine), time: time(start, mine), zone: zoneName(mine) });
    return { local, zone: zoneName(timeZone), own };
  }

  /** "Tue 9 Dec, 09:00", for lists. */
  const short = (start: string, timeZone: string) => t('bookings.format.short', { day: dayShort(start, timeZone), time: time(start, timeZone) });

  const money = (minor: number, of: Money) => format.money(minor, of.currency, of.minorUnits);
  /** Basis points as a percentage: 2000 → "20%". */
  const rate = (bp: number) => format.number(bp / 10_000, { style: 'percent', maximumFractionDigits: 2 });
  const address = (a: BookingAddress) => t('bookings.format.address', { line: a.line, postalCode: a.postalCode, city: a.city, country: format.region(a.country) });
  const hours = (n: number) => format.number(n, { style: 'unit', unit: 'hour', unitDisplay: 'long' });

  return { when, short, day, time, money, rate, address, hours, region: format.region, duration: format.duration };
}
