/**
 * Interval counts on the local days with a clock change. A 15-minute meter should show
 * 92 intervals on the 23-hour spring-forward day and 100 on the 25-hour fall-back day.
 */
import { offsetSegments } from '../domain/series/zone-offsets';
import type { ZoneResolver } from './zone-resolver';

export interface DstDay {
  /** Local calendar date, YYYY-MM-DD. */
  localDate: string;
  kind: 'clocks-forward' | 'clocks-back';
  hours: number;
  expectedIntervals: number;
  presentIntervals: number;
}

const DAY_MS = 86_400_000;

/** Instant at which the local day starting at wall reading `wallDay` (ms as if UTC) begins. */
function localMidnight(zone: ZoneResolver, wallDay: number): number {
  for (let h = 0; h < 4; h++) {
    const r = zone.resolve(wallDay + h * 3_600_000);
    // When midnight itself is skipped, the day starts at the first reading that exists.
    if (r.kind === 'unique') return r.ms;
    if (r.kind === 'repeated') return r.earlier;
  }
  return Number.NaN;
}

function countIn(sorted: Float64Array, from: number, to: number): number {
  const lower = (x: number) => {
    let lo = 0;
    let hi = sorted.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (sorted[mid] < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  return lower(to) - lower(from);
}

/** The clock-change days inside the span of `startMs` (sorted interval starts). */
export function dstDays(zone: ZoneResolver, startMs: Float64Array, intervalMinutes: number): DstDay[] {
  if (startMs.length === 0) return [];
  const first = startMs[0];
  const last = startMs[startMs.length - 1];
  const seg = offsetSegments(zone.zoneName, first - DAY_MS, last + DAY_MS);
  const out: DstDay[] = [];
  for (let k = 1; k < seg.startMs.length; k++) {
    const change = seg.startMs[k];
    const wall = change + seg.offsetMin[k] * 60_000;
    const wallDay = Math.floor(wall / DAY_MS) * DAY_MS;
    const from = localMidnight(zone, wallDay);
    const to = localMidnight(zone, wallDay + DAY_MS);
    if (!(from === from && to === to)) continue;
    // Only days the data covers completely: a file starting mid-day is not short of intervals.
    if (from < first || to > last + intervalMinutes * 60_000) continue;
    const hours = (to - from) / 3_600_000;
    out.push({
      localDate: new Date(wallDay).toISOString().slice(0, 10),
      kind: seg.offsetMin[k] > seg.offsetMin[k - 1] ? 'clocks-forward' : 'clocks-back',
      hours,
      expectedIntervals: Math.round((hours * 60) / intervalMinutes),
      presentIntervals: countIn(startMs, from, to),
    });
  }
  return out;
}
