import type { IntervalSeries } from './interval-series';
import { offsetSegments } from './zone-offsets';

const DAY_MS = 86_400_000;

/**
 * Local wall-clock position of every interval start in one time zone, computed once
 * per series and zone. Time-of-use masks and clock-aligned demand blocks read these
 * arrays instead of calling luxon per interval.
 */
export interface LocalCalendar {
  readonly zone: string;
  /** UTC offset in minutes at each interval start. */
  readonly offsetMin: Int16Array;
  /** Local civil day number (days since 1970-01-01 in local time). */
  readonly localDay: Int32Array;
  /** Minutes since local midnight, 0..1439. */
  readonly minuteOfDay: Uint16Array;
}

/** Builds the local calendar of `series` in `zone` (one luxon probe per 6 h of span). */
export function buildLocalCalendar(series: IntervalSeries, zone: string): LocalCalendar {
  const n = series.length;
  const offsetMin = new Int16Array(n);
  const localDay = new Int32Array(n);
  const minuteOfDay = new Uint16Array(n);
  if (n > 0) {
    const seg = offsetSegments(zone, series.startMs[0], series.startMs[n - 1]);
    let k = 0;
    for (let i = 0; i < n; i++) {
      const t = series.startMs[i];
      while (k + 1 < seg.startMs.length && t >= seg.startMs[k + 1]) k++;
      const off = seg.offsetMin[k];
      const local = t + off * 60_000;
      const day = Math.floor(local / DAY_MS);
      offsetMin[i] = off;
      localDay[i] = day;
      minuteOfDay[i] = Math.floor((local - day * DAY_MS) / 60_000);
    }
  }
  return { zone, offsetMin, localDay, minuteOfDay };
}

// Keyed by the stamp array, which corrected scenarios share with their base series.
const cache = new WeakMap<Float64Array, Map<string, LocalCalendar>>();

/** Memoised `buildLocalCalendar`: corrected scenarios share the base series' stamps. */
export function localCalendarFor(series: IntervalSeries, zone: string): LocalCalendar {
  let byZone = cache.get(series.startMs);
  if (!byZone) {
    byZone = new Map();
    cache.set(series.startMs, byZone);
  }
  let cal = byZone.get(zone);
  if (!cal) {
    cal = buildLocalCalendar(series, zone);
    byZone.set(zone, cal);
  }
  return cal;
}

/** ISO weekday (1 = Monday .. 7 = Sunday) of a local day number; 1970-01-01 was a Thursday. */
export function weekdayOfLocalDay(day: number): number {
  return (((day + 3) % 7) + 7) % 7 + 1;
}

/** Calendar month (1..12) and ISO date `YYYY-MM-DD` of a local day number. */
export function dateOfLocalDay(day: number): { month: number; iso: string } {
  const d = new Date(day * DAY_MS);
  return { month: d.getUTCMonth() + 1, iso: d.toISOString().slice(0, 10) };
}
