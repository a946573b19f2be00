import { DateTime } from 'luxon';
import { fail, ok, type Result } from '../result';
import { isKnownZone } from '../series/zone-offsets';
import type { Period } from './period';

/** Span of instants to cover; an `IntervalSeries` fits this shape via `spanOf`. */
export interface Span {
  fromMs: number;
  /** Exclusive end. */
  toMs: number;
}

/**
 * Calendar months in `zone` that overlap a span (or a series' span), each from local midnight on the 1st
 * to local midnight on the 1st of the next month. Month lengths come from luxon, so
 * a month with a clock change has 743 or 745 hours.
 */
export function monthlyPeriods(spanOrSeries: Span | SeriesSpanSource, zone: string): Result<Period[]> {
  const span = 'startMs' in spanOrSeries ? spanOf(spanOrSeries) : spanOrSeries;
  if (!isKnownZone(zone)) return fail([{ code: 'zone-unknown', message: `Unknown time zone "${zone}". Use an IANA name such as America/Chicago.` }]);
  if (!(span.toMs > span.fromMs)) return ok([]);
  const periods: Period[] = [];
  let cursor = DateTime.fromMillis(span.fromMs, { zone }).startOf('month');
  while (cursor.toMillis() < span.toMs) {
    const next = cursor.plus({ months: 1 });
    const startMs = cursor.toMillis();
    const endMs = next.toMillis();
    periods.push({
      id: cursor.toFormat('yyyy-MM'),
      label: cursor.setLocale('en').toFormat('LLLL yyyy'),
      kind: 'month',
      zone,
      startMs,
      endMs,
      hours: (endMs - startMs) / 3_600_000,
    });
    cursor = next;
  }
  return ok(periods);
}

/** The fields of an `IntervalSeries` that fix its span. */
export interface SeriesSpanSource {
  startMs: Float64Array;
  intervalMinutes: number;
  length: number;
}

/** The span of instants a series covers, from its first start to its last end. */
export function spanOf(series: SeriesSpanSource): Span {
  if (series.length === 0) return { fromMs: 0, toMs: 0 };
  return { fromMs: series.startMs[0], toMs: series.startMs[series.length - 1] + series.intervalMinutes * 60_000 };
}
