import { z } from 'zod';

const clockTime = z
  .string()
  .regex(/^([01]\d|2[0-3]):[0-5]\d$|^24:00$/, 'Use a 24-hour time such as 07:00 or 24:00.')
  .describe('Local wall-clock time, HH:MM, 00:00 to 24:00.');

/** One daily time range; `from` later than `to` wraps past midnight (22:00 to 06:00). */
export const timeRangeSchema = z
  .strictObject({
    from: clockTime.describe('Start of the range, local time, inclusive.'),
    to: clockTime.describe('End of the range, local time, exclusive. Earlier than `from` means the range runs past midnight.'),
  })
  .describe('A daily local-time range.');

/**
 * A time-of-use window. Each condition that is present must hold; an absent condition
 * does not restrict. An interval is judged by the local date and time of its start.
 */
export const touWindowSchema = z
  .strictObject({
    name: z.string().max(80).optional().describe('Name shown in explanations, e.g. "Winter peak".'),
    weekdays: z.array(z.number().int().min(1).max(7)).min(1).optional().describe('ISO weekdays, 1 = Monday ... 7 = Sunday, of the interval\'s own local date.'),
    months: z.array(z.number().int().min(1).max(12)).min(1).optional().describe('Calendar months 1..12.'),
    timeRanges: z.array(timeRangeSchema).min(1).optional().describe('Daily local-time ranges; the interval start must fall in one of them.'),
    holidays: z
      .enum(['ignore', 'exclude', 'whole-day'])
      .default('ignore')
      .describe('How the tariff\'s listed holidays are treated: ignored, excluded from the window, or in the window all day (e.g. off-peak windows).'),
  })
  .describe('Time-of-use window limiting a rule to certain months, days and hours.');

export type TouWindow = z.infer<typeof touWindowSchema>;
export type TouWindowInput = z.input<typeof touWindowSchema>;

/** Minutes since midnight of an `HH:MM` string (`24:00` -> 1440). */
export function clockMinutes(hhmm: string): number {
  return Number(hhmm.slice(0, 2)) * 60 + Number(hhmm.slice(3, 5));
}

/** Whether a minute of the day lies in a range; wraps past midnight when from > to. */
export function inTimeRange(minute: number, fromMin: number, toMin: number): boolean {
  if (fromMin === toMin) return true;
  return fromMin < toMin ? minute >= fromMin && minute < toMin : minute >= fromMin || minute < toMin;
}

/** Short human description of a window for explanations. */
export function describeWindow(w: TouWindow): string {
  if (w.name) return w.name;
  const parts: string[] = [];
  if (w.months) parts.push(`months ${w.months.join(',')}`);
  if (w.weekdays) parts.push(`weekdays ${w.weekdays.join(',')}`);
  if (w.timeRanges) parts.push(w.timeRanges.map((r) => `${r.from}-${r.to}`).join(' & '));
  return parts.join(', ') || 'all hours';
}
