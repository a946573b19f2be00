/**
 * Local wall-clock readings -> UTC instants in an IANA zone (luxon's zone data).
 * The zone's offset changes over a year-long window are found once (about 1,500 luxon
 * look-ups, the engine's `offsetSegments`); each row is then resolved from those
 * segments without calling luxon.
 */
import { IANAZone } from 'luxon';
import { offsetSegments } from '../domain/series/zone-offsets';

const DAY_MS = 86_400_000;

export type Resolution =
  /** The reading exists once. */
  | { kind: 'unique'; ms: number }
  /** The reading exists twice (clocks went back): earlier and later instants. */
  | { kind: 'repeated'; earlier: number; later: number }
  /** The reading does not exist (clocks went forward). */
  | { kind: 'skipped' };

export class ZoneResolver {
  private readonly zone: IANAZone;
  /** Offset segments over a window of instants: `segStart[k]` is where `segOffset[k]` begins. */
  private segStart: number[] = [];
  private segOffset: number[] = [];
  private winFrom = Number.POSITIVE_INFINITY;
  private winTo = Number.NEGATIVE_INFINITY;
  private cursor = 0;
  private readonly standardByYear = new Map<number, number>();

  /** Throws RangeError on an unknown zone; check with `isKnownZone` first. */
  constructor(readonly zoneName: string) {
    this.zone = IANAZone.create(zoneName);
    if (!this.zone.isValid) throw new RangeError(`Unknown time zone "${zoneName}".`);
  }

  /** Offset in minutes at an instant. */
  offsetAt(ms: number): number {
    this.cover(ms);
    return this.segOffset[this.segmentOf(ms)];
  }

  /** Loads the offset segments of a window of about a year around `ms` when `ms` is outside the current one. */
  private cover(ms: number): void {
    if (ms >= this.winFrom && ms <= this.winTo) return;
    const from = ms - 3 * DAY_MS;
    const to = ms + 370 * DAY_MS;
    const seg = offsetSegments(this.zoneName, from, to);
    this.segStart = seg.startMs;
    this.segOffset = seg.offsetMin;
    this.winFrom = from + DAY_MS;
    this.winTo = to - DAY_MS;
    this.cursor = 0;
  }

  /** Index of the segment holding instant `ms` (the cursor makes ordered look-ups O(1)). */
  private segmentOf(ms: number): number {
    const st = this.segStart;
    let k = this.cursor;
    while (k + 1 < st.length && st[k + 1] <= ms) k++;
    while (k > 0 && st[k] > ms) k--;
    this.cursor = k;
    return k;
  }

  /**
   * Resolves a wall reading: each neighbouring segment's offset is tried and kept when the
   * instant it gives lies inside that segment.
   */
  resolve(wall: number): Resolution {
    const ms = this.resolveUnique(wall);
    if (ms === ms) return { kind: 'unique', ms };
    return this.resolveNearChange(wall);
  }

  /**
   * The instant of a wall reading that exists exactly once, or NaN (repeated or skipped:
   * ask `resolve`). Allocation-free for the per-row path.
   */
  resolveUnique(wall: number): number {
    this.cover(wall);
    const k = this.segmentOf(wall - this.segOffset[this.cursor] * 60_000);
    const st = this.segStart;
    const off = this.segOffset;
    const t = wall - off[k] * 60_000;
    // Unique when the instant lies in segment k farther from its edges than any two offsets
    // differ (27 h covers every offset jump on record): no other segment's offset can fit.
    const lo = st[k];
    const hi = k + 1 < st.length ? st[k + 1] : Number.POSITIVE_INFINITY;
    const margin = 27 * 3_600_000;
    if (t >= lo + margin && t < hi - margin) return t;
    return Number.NaN;
  }

  private resolveNearChange(wall: number): Resolution {
    this.cover(wall);
    const k = this.segmentOf(wall - this.segOffset[this.cursor] * 60_000);
    const st = this.segStart;
    const off = this.segOffset;
    let first = Number.NaN;
    let second = Number.NaN;
    for (let j = Math.max(0, k - 1); j <= Math.min(st.length - 1, k + 1); j++) {
      const t = wall - off[j] * 60_000;
      const end = j + 1 < st.length ? st[j + 1] : Number.POSITIVE_INFINITY;
      if (t >= st[j] && t < end) {
        if (first !== first) first = t;
        else if (t !== first) second = t;
      }
    }
    if (first !== first) return { kind: 'skipped' };
    if (second !== second) return { kind: 'unique', ms: first };
    return first < second ? { kind: 'repeated', earlier: first, later: second } : { kind: 'repeated', earlier: second, later: first };
  }

  /** Standard-time offset (the smaller of January's and July's) for the year of a wall reading. */
  standardOffset(wall: number): number {
    const year = new Date(wall).getUTCFullYear();
    let o = this.standardByYear.get(year);
    if (o === undefined) {
      o = Math.min(this.zone.offset(Date.UTC(year, 0, 15)), this.zone.offset(Date.UTC(year, 6, 15)));
      this.standardByYear.set(year, o);
    }
    return o;
  }
}

/** True when luxon (and the platform's tz data) knows the zone. */
export function isKnownZone(name: string): boolean {
  return IANAZone.isValidZone(name);
}
