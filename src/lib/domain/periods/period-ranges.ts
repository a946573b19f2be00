import type { IntervalSeries } from '../series/interval-series';
import type { Period } from './period';

/** Interval index range `[first[p], end[p])` of each period, by interval start. */
export interface PeriodRanges {
  first: Int32Array;
  end: Int32Array;
}

/**
 * Finds each period's interval index range by binary search on the sorted stamps.
 * An interval belongs to the period containing its start instant.
 */
export function periodRanges(series: IntervalSeries, periods: readonly Period[]): PeriodRanges {
  const first = new Int32Array(periods.length);
  const end = new Int32Array(periods.length);
  periods.forEach((p, k) => {
    first[k] = lowerBound(series.startMs, series.length, p.startMs);
    end[k] = lowerBound(series.startMs, series.length, p.endMs);
  });
  return { first, end };
}

/** First index whose value is >= `target` (n when none). */
export function lowerBound(values: Float64Array, n: number, target: number): number {
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid] < target) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
