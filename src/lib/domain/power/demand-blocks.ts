import type { IntervalSeries } from '../series/interval-series';
import type { LocalCalendar } from '../series/local-calendar';

/** How demand over the tariff's window is formed from meter intervals. */
export type DemandMethod = 'block' | 'rolling';

/**
 * Demand readings on the tariff's demand window. Block demand: consecutive,
 * clock-aligned windows (local time), e.g. :00-:30 and :30-:00. Rolling demand: one
 * reading per meter interval over the window ending with it. Reading `b` covers
 * intervals `[first[b], end[b])`; `anchor[b]` is the interval whose period and
 * time-of-use window the reading counts in (first interval for block, last for rolling).
 */
export interface DemandBlocks {
  windowMinutes: number;
  method: DemandMethod;
  count: number;
  first: Int32Array;
  end: Int32Array;
  anchor: Int32Array;
  /** Import demand of the reading, kW (missing intervals count as zero). */
  kw: Float64Array;
  /** True when every interval is in exactly one reading, in order (block demand). */
  partition: boolean;
}

/** Checks that the demand window is a whole multiple of the meter interval. */
export function demandWindowProblem(windowMinutes: number, intervalMinutes: number): string | null {
  if (!Number.isInteger(windowMinutes) || windowMinutes < intervalMinutes || windowMinutes % intervalMinutes !== 0) {
    return `The ${windowMinutes}-min demand window must be a whole multiple of the ${intervalMinutes}-min meter interval.`;
  }
  if (1440 % windowMinutes !== 0) return `The ${windowMinutes}-min demand window must divide a day evenly.`;
  return null;
}

// Readings depend only on stamps, kWh and the local clock, which corrected scenarios share
// with their base series, so metrics, tariff and sizing on one series build them once.
const cache = new WeakMap<Float64Array, WeakMap<Float64Array, Map<string, DemandBlocks>>>();

/** Builds (or reuses) the demand readings of a series (kW uses import energy only). */
export function buildDemandBlocks(series: IntervalSeries, cal: LocalCalendar, windowMinutes: number, method: DemandMethod): DemandBlocks {
  const problem = demandWindowProblem(windowMinutes, series.intervalMinutes);
  if (problem) throw new RangeError(problem);
  let byKwh = cache.get(series.startMs);
  if (!byKwh) {
    byKwh = new WeakMap();
    cache.set(series.startMs, byKwh);
  }
  let byKey = byKwh.get(series.kwh);
  if (!byKey) {
    byKey = new Map();
    byKwh.set(series.kwh, byKey);
  }
  const key = `${cal.zone}|${series.intervalMinutes}|${windowMinutes}|${method}`;
  let blocks = byKey.get(key);
  if (!blocks) {
    blocks =
      method === 'rolling' || windowMinutes === series.intervalMinutes
        ? rollingBlocks(series, windowMinutes, method)
        : clockBlocks(series, cal, windowMinutes);
    byKey.set(key, blocks);
  }
  return blocks;
}

function clockBlocks(series: IntervalSeries, cal: LocalCalendar, windowMinutes: number): DemandBlocks {
  const n = series.length;
  const first = new Int32Array(n);
  const end = new Int32Array(n);
  const kw = new Float64Array(n);
  const toKw = 60 / windowMinutes;
  let count = 0;
  let key = Number.NaN;
  for (let i = 0; i < n; i++) {
    // Align on local wall-clock windows so 30-min demand reads :00-:30 and :30-:00.
    const k = Math.floor((cal.localDay[i] * 1440 + cal.minuteOfDay[i]) / windowMinutes);
    if (k !== key) {
      if (count > 0) end[count - 1] = i;
      first[count] = i;
      count++;
      key = k;
    }
    const e = series.kwh[i];
    if (e > 0) kw[count - 1] += e * toKw;
  }
  if (count > 0) end[count - 1] = n;
  return { windowMinutes, method: 'block', count, first: first.slice(0, count), end: end.slice(0, count), anchor: first.slice(0, count), kw: kw.slice(0, count), partition: true };
}

function rollingBlocks(series: IntervalSeries, windowMinutes: number, method: DemandMethod): DemandBlocks {
  const n = series.length;
  const span = windowMinutes * 60_000;
  const first = new Int32Array(n);
  const end = new Int32Array(n);
  const anchor = new Int32Array(n);
  const kw = new Float64Array(n);
  const toKw = 60 / windowMinutes;
  const step = series.intervalMinutes * 60_000;
  const { startMs, kwh } = series;
  let lo = 0;
  for (let i = 0; i < n; i++) {
    // Keep only intervals that start inside the window ending with interval i.
    const windowStart = startMs[i] + step - span;
    while (startMs[lo] < windowStart) lo++;
    // Summed afresh for each reading (at most window / interval terms): no running-sum drift.
    let sum = 0;
    for (let j = lo; j <= i; j++) {
      const e = kwh[j];
      if (e > 0) sum += e;
    }
    first[i] = lo;
    end[i] = i + 1;
    anchor[i] = i;
    kw[i] = sum * toKw;
  }
  return { windowMinutes, method, count: n, first, end, anchor, kw, partition: windowMinutes === series.intervalMinutes };
}
