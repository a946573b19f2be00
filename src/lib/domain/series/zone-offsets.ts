import { IANAZone } from 'luxon';

/**
 * UTC-offset segments of an IANA zone over a time span, found with luxon once per
 * span so per-interval loops never call luxon (DEVELOPERS.md, engine decision E2).
 * `startMs[k]` is the first instant at which `offsetMin[k]` applies.
 */
export interface OffsetSegments {
  startMs: number[];
  offsetMin: number[];
}

const PROBE_STEP_MS = 6 * 3_600_000;

/** True when `zone` names a zone luxon (and the platform's tz data) knows. */
export function isKnownZone(zone: string): boolean {
  return IANAZone.isValidZone(zone);
}

/**
 * Lists the offset changes of `zone` between `fromMs` and `toMs`. Probes every 6 hours
 * (no zone changes offset twice within 6 hours) and bisects each change to the millisecond.
 */
export function offsetSegments(zone: string, fromMs: number, toMs: number): OffsetSegments {
  const z = IANAZone.create(zone);
  if (!z.isValid) throw new RangeError(`Unknown time zone "${zone}".`);
  const offsetAt = (t: number) => z.offset(t);
  const startMs = [Number.NEGATIVE_INFINITY];
  const offsetMin = [offsetAt(fromMs)];
  let t = fromMs;
  let current = offsetMin[0];
  while (t < toMs) {
    const next = Math.min(t + PROBE_STEP_MS, toMs);
    const o = offsetAt(next);
    if (o !== current) {
      let lo = t;
      let hi = next;
      // Bisect to the millisecond: about 25 probes per change, twice a year.
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (offsetAt(mid) === current) lo = mid;
        else hi = mid;
      }
      startMs.push(hi);
      offsetMin.push(o);
      current = o;
    }
    t = next;
  }
  return { startMs, offsetMin };
}
