/**
 * Local wall-clock readings -> UTC instants in an IANA zone (luxon's zone data).
 * luxon is asked once per wall hour and the answer cached, so a year of 1-minute rows
 * costs about 9,000 zone look-ups, not 525,600.
 */
import { IANAZone } from 'luxon';

const HOUR_MS = 3_600_000;
const NEAR_MS = 14 * HOUR_MS;

export type Resolution =
  /** The reading exists once. */
  | { kind: 'unique'; ms: number }
  /** The reading exists twice (clocks went back): earlier and later instants. */
  | { kind: 'repeated'; earlier: number; later: number }
  /** The reading does not exist (clocks went forward). */
  | { kind: 'skipped' };

export class ZoneResolver {
  private readonly zone: IANAZone;
  private readonly cache = new Map<number, number>();
  private lastHour = Number.NaN;
  private lastOffset = Number.NaN;
  private readonly standardByYear = new Map<number, number>();

  /** Throws RangeError on an unknown zone; check with `isKnownZone` first. */
  constructor(readonly zoneName: string) {
    this.zone = IANAZone.create(zoneName);
    if (!this.zone.isValid) throw new RangeError(`Unknown time zone "${zoneName}".`);
  }

  /** Offset in minutes at an instant. */
  offsetAt(ms: number): number {
    return this.zone.offset(ms);
  }

  /**
   * Resolves a wall reading. Fast path: when the zone keeps one offset for 14 hours either
   * side of the hour, the reading is unique. Otherwise each candidate offset is tried.
   */
  resolve(wall: number): Resolution {
    const hour = Math.floor(wall / HOUR_MS);
    let o: number;
    if (hour === this.lastHour) o = this.lastOffset;
    else {
      const cached = this.cache.get(hour);
      if (cached !== undefined) o = cached;
      else {
        const h = hour * HOUR_MS;
        const a = this.zone.offset(h - NEAR_MS);
        const b = this.zone.offset(h + NEAR_MS);
        o = a === b && this.zone.offset(h) === a ? a : Number.NaN;
        this.cache.set(hour, o);
      }
      this.lastHour = hour;
      this.lastOffset = o;
    }
    if (o === o) return { kind: 'unique', ms: wall - o * 60_000 };
    return this.resolveNearChange(wall);
  }

  private resolveNearChange(wall: number): Resolution {
    const offsets = new Set([this.zone.offset(wall - NEAR_MS), this.zone.offset(wall + NEAR_MS)]);
    const found: number[] = [];
    for (const off of offsets) {
      const t = wall - off * 60_000;
      if (this.zone.offset(t) === off && !found.includes(t)) found.push(t);
    }
    found.sort((x, y) => x - y);
    if (found.length === 0) return { kind: 'skipped' };
    if (found.length === 1) return { kind: 'unique', ms: found[0] };
    return { kind: 'repeated', earlier: found[0], later: found[found.length - 1] };
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
