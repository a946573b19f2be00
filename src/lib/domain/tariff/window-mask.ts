import type { LocalCalendar } from '../series/local-calendar';
import { dateOfLocalDay, weekdayOfLocalDay } from '../series/local-calendar';
import { clockMinutes, inTimeRange, type TouWindow } from './tou-window';

/**
 * Per-interval membership of up to 31 windows as bits: bit 0 is "all intervals", bit
 * w (w >= 1) is `windows[w - 1]`. One pass; day-level facts are computed once per
 * local day, so the cost is a few comparisons per interval.
 */
export function buildWindowBits(cal: LocalCalendar, windows: readonly TouWindow[], holidays: readonly string[]): Uint32Array {
  // Memoised per calendar: metrics, tariff and sizing on one series ask for the same bits.
  const key = JSON.stringify([windows, holidays]);
  let byKey = cache.get(cal);
  if (!byKey) {
    byKey = new Map();
    cache.set(cal, byKey);
  }
  let bits = byKey.get(key);
  if (!bits) {
    bits = computeWindowBits(cal, windows, holidays);
    byKey.set(key, bits);
  }
  return bits;
}

const cache = new WeakMap<LocalCalendar, Map<string, Uint32Array>>();

function computeWindowBits(cal: LocalCalendar, windows: readonly TouWindow[], holidays: readonly string[]): Uint32Array {
  if (windows.length > 31) throw new RangeError('At most 31 distinct time-of-use windows per tariff.');
  const n = cal.localDay.length;
  const bits = new Uint32Array(n);
  const holidaySet = new Set(holidays);
  const compiled = windows.map((w) => ({
    weekdays: w.weekdays ? new Set(w.weekdays) : null,
    months: w.months ? new Set(w.months) : null,
    ranges: w.timeRanges?.map((r) => [clockMinutes(r.from), clockMinutes(r.to)] as const) ?? null,
    holidays: w.holidays,
  }));
  let day = Number.NaN;
  // Per-window day verdicts: 0 = out all day, 1 = check time ranges, 2 = in all day.
  const dayVerdict = new Uint8Array(windows.length);
  for (let i = 0; i < n; i++) {
    if (cal.localDay[i] !== day) {
      day = cal.localDay[i];
      const weekday = weekdayOfLocalDay(day);
      const { month, iso } = dateOfLocalDay(day);
      const isHoliday = holidaySet.has(iso);
      compiled.forEach((c, k) => {
        let v = 1;
        if (c.months && !c.months.has(month)) v = 0;
        else if (isHoliday && c.holidays === 'exclude') v = 0;
        else if (isHoliday && c.holidays === 'whole-day') v = 2;
        else if (c.weekdays && !c.weekdays.has(weekday)) v = 0;
        dayVerdict[k] = v;
      });
    }
    let b = 1;
    const minute = cal.minuteOfDay[i];
    for (let k = 0; k < compiled.length; k++) {
      const v = dayVerdict[k];
      if (v === 0) continue;
      if (v === 2 || inAnyRange(compiled[k].ranges, minute)) b |= 1 << (k + 1);
    }
    bits[i] = b >>> 0;
  }
  return bits;
}

function inAnyRange(ranges: readonly (readonly [number, number])[] | null, minute: number): boolean {
  if (ranges === null) return true;
  for (let r = 0; r < ranges.length; r++) {
    if (inTimeRange(minute, ranges[r][0], ranges[r][1])) return true;
  }
  return false;
}
