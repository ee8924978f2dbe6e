// Working hours as the editor holds them (keyed intervals, empty numbers as null) and back to the
// shape the API and the schema read; the 5-minute time choices; the list of time zones.
import { DURATION_STEP_MINUTES, WEEKDAYS, type HoursException, type WorkingHours, type WorkingHoursDraft, type Weekday } from '@emberline/domain';

export interface IntervalRow {
  key: number;
  start: string;
  end: string;
}

export interface HoursModel {
  timeZone: string;
  weekly: Record<Weekday, IntervalRow[]>;
  exceptions: HoursException[];
  minimumNoticeMinutes: number | null;
  bookingHorizonDays: number | null;
  bufferMinutes: number | null;
}

let nextKey = 0;
export const rowKey = () => nextKey++;

/** The zone this browser runs in, a sensible first guess for a new technician. */
export function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

/** A starting point for someone without saved hours: weekdays 08:00–17:00. */
export function starterHours(timeZone = browserTimeZone()): HoursModel {
  const day = (): IntervalRow[] => [{ key: rowKey(), start: '08:00', end: '17:00' }];
  return {
    timeZone,
    weekly: { monday: day(), tuesday: day(), wednesday: day(), thursday: day(), friday: day(), saturday: [], sunday: [] },
    exceptions: [],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 60,
    bufferMinutes: 15,
  };
}

export function toModel(hours: WorkingHours): HoursModel {
  const weekly = Object.fromEntries(WEEKDAYS.map((d) => [d, (hours.weekly[d] ?? []).map((i) => ({ key: rowKey(), start: i.start, end: i.end }))])) as Record<Weekday, IntervalRow[]>;
  return {
    timeZone: hours.timeZone,
    weekly,
    exceptions: hours.exceptions.map((e) => ({ ...e })),
    minimumNoticeMinutes: hours.minimumNoticeMinutes,
    bookingHorizonDays: hours.bookingHorizonDays,
    bufferMinutes: hours.bufferMinutes,
  };
}

/** The weekly pattern without the editor's keys. */
export function weeklyBody(model: HoursModel): WorkingHoursDraft['weekly'] {
  return Object.fromEntries(WEEKDAYS.map((d) => [d, model.weekly[d].map(({ start, end }) => ({ start, end }))])) as WorkingHoursDraft['weekly'];
}

/** The working hours as checked and sent; empty numbers stay undefined so the schema names the field. */
export type HoursBody = Omit<WorkingHoursDraft, 'minimumNoticeMinutes' | 'bookingHorizonDays' | 'bufferMinutes'> & {
  minimumNoticeMinutes?: number;
  bookingHorizonDays?: number;
  bufferMinutes?: number;
};

export function toBody(model: HoursModel): HoursBody {
  return {
    timeZone: model.timeZone,
    weekly: weeklyBody(model),
    exceptions: model.exceptions.map((e) => ({ ...e })),
    minimumNoticeMinutes: model.minimumNoticeMinutes ?? undefined,
    bookingHorizonDays: model.bookingHorizonDays ?? undefined,
    bufferMinutes: model.bufferMinutes ?? undefined,
  };
}

const pad = (n: number) => String(n).padStart(2, '0');
export const timeText = (minutes: number) => `${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}`;

/** 00:00, 00:05, … 24:00: every time of day the schema accepts. */
export const TIME_CHOICES: readonly string[] = Array.from({ length: (24 * 60) / DURATION_STEP_MINUTES + 1 }, (_, i) => timeText(i * DURATION_STEP_MINUTES));

/** The IANA zones this browser knows (plus the current one, e.g. "UTC", which some lists leave out). */
export function timeZoneChoices(current: string): string[] {
  let zones: string[] = [];
  try {
    zones = Intl.supportedValuesOf('timeZone');
  } catch {
    zones = [];
  }
  return zones.includes(current) || !current ? zones : [current, ...zones];
}
