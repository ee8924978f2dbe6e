// A technician's working hours: weekly pattern in an IANA time zone, exceptions and booking rules.
import { DateTime, IANAZone } from 'luxon';
import { z } from 'zod';

/** Days of the weekly pattern; position + 1 is the ISO weekday (Monday = 1), as luxon numbers them. */
export const WEEKDAYS = ['monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday'] as const;
export type Weekday = (typeof WEEKDAYS)[number];

/** Every duration and time of day in the booking rules is a whole number of these. */
export const DURATION_STEP_MINUTES = 5;

/** Allowed ranges of the booking rules and of a job's length, shared by schema, messages and forms. */
export const HOURS_LIMITS = {
  bufferMinutes: { min: 0, max: 240, label: 'Buffer between jobs' },
  minimumNoticeMinutes: { min: 0, max: 14 * 24 * 60, label: 'Minimum notice' },
  jobDurationMinutes: { min: 5, max: 12 * 60, label: 'Job duration' },
  bookingHorizonDays: { min: 1, max: 365, label: 'Booking horizon' },
  intervalsPerDay: 6,
  exceptions: 500,
} as const;

const TIME_OF_DAY = /^(?:([01]\d|2[0-3]):([0-5]\d)|(24):(00))$/;
const LOCAL_DATE = /^\d{4}-\d{2}-\d{2}$/;
const DAY_LABEL: Record<Weekday, string> = {
  monday: 'Monday',
  tuesday: 'Tuesday',
  wednesday: 'Wednesday',
  thursday: 'Thursday',
  friday: 'Friday',
  saturday: 'Saturday',
  sunday: 'Sunday',
};

/** Minutes after local midnight of a "HH:MM" time (24:00 is 1440, the end of the day); NaN if malformed. */
export function minutesOfDay(time: string): number {
  const m = TIME_OF_DAY.exec(time);
  if (!m) return Number.NaN;
  return m[3] ? 1440 : Number(m[1]) * 60 + Number(m[2]);
}

/** True for a name the IANA time-zone database knows (checked by luxon through Intl). */
export function isKnownTimeZone(zone: string): boolean {
  return IANAZone.isValidZone(zone);
}

export const TimeZoneSchema = z.string({ error: 'Choose a time zone' }).superRefine((v, ctx) => {
  if (!isKnownTimeZone(v)) ctx.addIssue({ code: 'custom', message: `Unknown time zone "${v}"; use a name from the time-zone database such as Europe/Vienna` });
});

export const LocalTimeSchema = z
  .string({ error: 'Enter a time such as 09:00' })
  .regex(TIME_OF_DAY, 'Enter a 24-hour time such as 09:00 (24:00 for the end of the day)')
  // a malformed time already has its message from the pattern
  .refine((v) => !TIME_OF_DAY.test(v) || minutesOfDay(v) % DURATION_STEP_MINUTES === 0, `Times go in steps of ${DURATION_STEP_MINUTES} minutes, e.g. 09:05`);

export const LocalDateSchema = z
  .string({ error: 'Enter a date as YYYY-MM-DD' })
  .regex(LOCAL_DATE, 'Enter a date as YYYY-MM-DD')
  // a malformed date already has its message from the pattern; this one is for 2031-02-31
  .refine((v) => !LOCAL_DATE.test(v) || DateTime.fromISO(v, { zone: 'utc' }).isValid, 'This date does not exist');

export const InstantSchema = z.iso.datetime({ offset: true, error: 'Enter a date and time with a UTC offset, e.g. 2026-03-29T09:00:00+02:00' });
const isInstant = (v: unknown): v is string => InstantSchema.safeParse(v).success;

/** A stretch of local wall-clock time on one day, start inclusive, end exclusive. */
export const LocalIntervalSchema = z
  .object({ start: LocalTimeSchema, end: LocalTimeSchema })
  .superRefine((v, ctx) => {
    if (minutesOfDay(v.end) <= minutesOfDay(v.start)) ctx.addIssue({ code: 'custom', path: ['end'], message: `The end (${v.end}) must be after the start (${v.start})` });
  });
export type LocalInterval = z.infer<typeof LocalIntervalSchema>;

/** Reports every interval that overlaps an earlier one (touching is fine: 09:00–12:00 and 12:00–17:00). */
function checkOverlaps(intervals: ReadonlyArray<{ start: string; end: string }>, where: string, addIssue: (index: number, message: string) => void): void {
  const spans = intervals
    .map((v, index) => ({ index, start: minutesOfDay(v.start), end: minutesOfDay(v.end), text: `${v.start}–${v.end}` }))
    .filter((s) => s.end > s.start)
    .sort((a, b) => a.start - b.start || a.index - b.index);
  for (let i = 1; i < spans.length; i++) {
    const current = spans[i]!;
    for (let j = i - 1; j >= 0; j--) {
      const earlier = spans[j]!;
      if (earlier.end > current.start) {
        addIssue(current.index, `${current.text} overlaps ${earlier.text}${where}`);
        break;
      }
    }
  }
}

function dayIntervals(day: Weekday) {
  return z
    .array(LocalIntervalSchema)
    .max(HOURS_LIMITS.intervalsPerDay, `Use at most ${HOURS_LIMITS.intervalsPerDay} intervals a day`)
    .superRefine((intervals, ctx) => {
      checkOverlaps(intervals, ` on ${DAY_LABEL[day]}`, (index, message) => ctx.addIssue({ code: 'custom', path: [index, 'start'], message }));
    })
    .default([]);
}

/** Working intervals per weekday in local time; a missing day is a day off. */
export const WeeklyPatternSchema = z.object({
  monday: dayIntervals('monday'),
  tuesday: dayIntervals('tuesday'),
  wednesday: dayIntervals('wednesday'),
  thursday: dayIntervals('thursday'),
  friday: dayIntervals('friday'),
  saturday: dayIntervals('saturday'),
  sunday: dayIntervals('sunday'),
});
export type WeeklyPattern = z.infer<typeof WeeklyPatternSchema>;

/** Away between two instants, [start, end): an appointment, a half day off. */
export const TimeOffSchema = z
  .object({ kind: z.literal('time-off'), start: InstantSchema, end: InstantSchema, note: z.string().trim().max(200, 'Use at most 200 characters').optional() })
  .superRefine((v, ctx) => {
    // only compare two valid instants: Date.parse would read a string without offset in the machine's zone
    if (isInstant(v.start) && isInstant(v.end) && Date.parse(v.end) <= Date.parse(v.start)) ctx.addIssue({ code: 'custom', path: ['end'], message: 'The time off must end after it starts' });
  });

/** Whole local days off, `from` to `to` inclusive: holidays, training. */
export const DaysOffSchema = z
  .object({ kind: z.literal('days-off'), from: LocalDateSchema, to: LocalDateSchema, note: z.string().trim().max(200, 'Use at most 200 characters').optional() })
  .superRefine((v, ctx) => {
    if (v.to < v.from) ctx.addIssue({ code: 'custom', path: ['to'], message: `The last day off (${v.to}) must not be before the first (${v.from})` });
  });

/** Working hours on one local date on top of the weekly pattern (a Saturday morning, a late evening). */
export const ExtraHoursSchema = z
  .object({ kind: z.literal('extra-hours'), date: LocalDateSchema, start: LocalTimeSchema, end: LocalTimeSchema })
  .superRefine((v, ctx) => {
    if (minutesOfDay(v.end) <= minutesOfDay(v.start)) ctx.addIssue({ code: 'custom', path: ['end'], message: `The end (${v.end}) must be after the start (${v.start})` });
  });

export const HoursExceptionSchema = z.discriminatedUnion('kind', [TimeOffSchema, DaysOffSchema, ExtraHoursSchema], {
  error: 'Choose time off, days off or extra hours',
});
export type HoursException = z.infer<typeof HoursExceptionSchema>;

/** A whole number of minutes in steps of 5 within a range, with messages naming the field. */
export function stepMinutesSchema(limits: { min: number; max: number; label: string }) {
  const range = `${limits.label} must be between ${limits.min} and ${limits.max} minutes`;
  return z
    .number({ error: `Enter the ${limits.label.toLowerCase()} in minutes` })
    .int(`${limits.label} must be a whole number of minutes`)
    .min(limits.min, range)
    .max(limits.max, range)
    .refine((v) => v % DURATION_STEP_MINUTES === 0, `${limits.label} must be a multiple of ${DURATION_STEP_MINUTES} minutes`);
}

/** Length of a bookable job (an offer's duration). */
export const JobDurationMinutesSchema = stepMinutesSchema(HOURS_LIMITS.jobDurationMinutes);

const horizonRange = `${HOURS_LIMITS.bookingHorizonDays.label} must be between ${HOURS_LIMITS.bookingHorizonDays.min} and ${HOURS_LIMITS.bookingHorizonDays.max} days`;

export const WorkingHoursSchema = z
  .object({
    timeZone: TimeZoneSchema,
    weekly: WeeklyPatternSchema,
    exceptions: z.array(HoursExceptionSchema).max(HOURS_LIMITS.exceptions, `Use at most ${HOURS_LIMITS.exceptions} exceptions`).default([]),
    minimumNoticeMinutes: stepMinutesSchema(HOURS_LIMITS.minimumNoticeMinutes).describe('Earliest start after now'),
    bookingHorizonDays: z
      .number({ error: 'Enter the booking horizon in days' })
      .int('The booking horizon must be a whole number of days')
      .min(HOURS_LIMITS.bookingHorizonDays.min, horizonRange)
      .max(HOURS_LIMITS.bookingHorizonDays.max, horizonRange)
      .describe('Latest local date that can be booked, counted in days after today'),
    bufferMinutes: stepMinutesSchema(HOURS_LIMITS.bufferMinutes).describe('Pause between two jobs, on top of the driving time'),
  })
  .superRefine((v, ctx) => {
    // extra hours on the same date follow the same rule as the weekly pattern
    const byDate = new Map<string, Array<{ index: number; start: string; end: string }>>();
    v.exceptions.forEach((e, index) => {
      if (e.kind !== 'extra-hours') return;
      const list = byDate.get(e.date) ?? [];
      list.push({ index, start: e.start, end: e.end });
      byDate.set(e.date, list);
    });
    for (const [date, list] of byDate) {
      checkOverlaps(list, ` on ${date}`, (i, message) => ctx.addIssue({ code: 'custom', path: ['exceptions', list[i]!.index, 'start'], message }));
    }
  });
/** Validated working hours, as the slot engine reads them. */
export type WorkingHours = z.output<typeof WorkingHoursSchema>;
/** Working hours as a form or request sends them (days and exceptions may be left out). */
export type WorkingHoursDraft = z.input<typeof WorkingHoursSchema>;
