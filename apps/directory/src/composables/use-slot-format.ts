// Distances and slot times as the search and profile pages show them. A slot is shown in the
// partner's time zone (where the job happens); the zone is named when it is not the browser's.
import { useI18n } from 'vue-i18n';
import { useFormat } from '@emberline/ui';

export function browserZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

export function useSlotFormat() {
  const { t } = useI18n();
  const format = useFormat();

  /** "3.2 km" below 10 km, "48 km" above. */
  const km = (value: number) => format.number(value, { style: 'unit', unit: 'kilometer', maximumFractionDigits: value < 10 ? 1 : 0 });

  const zoneName = (timeZone: string) => timeZone.replace(/_/g, ' ');
  /** "Times in Europe/Vienna time" when the zone is not the browser's, else ''. */
  const zoneNote = (timeZone: string) => (timeZone === browserZone() ? '' : t('slots.zoneNote', { zone: zoneName(timeZone) }));

  /** "Tue 3 Dec, 08:00" in the partner's zone, with "(Europe/Vienna time)" when that is not the browser's. */
  function when(instant: string, timeZone: string): string {
    const text = format.date(instant, { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone });
    return timeZone === browserZone() ? text : t('slots.whenInZone', { when: text, zone: zoneName(timeZone) });
  }

  /** The local day of an instant in a zone, as a heading: "Tuesday 3 December". */
  const day = (instant: string, timeZone: string) => format.date(instant, { weekday: 'long', day: 'numeric', month: 'long', timeZone });
  /** "08:00" in the zone. */
  const time = (instant: string, timeZone: string) => format.date(instant, { hour: '2-digit', minute: '2-digit', timeZone });
  /** A key grouping instants by their local day in the zone. */
  const dayKey = (instant: string, timeZone: string) => new Intl.DateTimeFormat('en-CA', { year: 'numeric', month: '2-digit', day: '2-digit', timeZone }).format(new Date(instant));

  return { km, when, day, time, dayKey, zoneNote };
}
