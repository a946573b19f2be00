import { IANAZone } from 'luxon';
import { fail, ok, type Issue, type Result } from '../result';

const STAMP = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{1,2}):(\d{2})(?::(\d{2}))?$/;
const HOUR_MS = 3_600_000;

export interface LocalStampOptions {
  /** IANA zone the wall-clock stamps were written in. */
  zone: string;
  /** Whether a stamp marks the start or the end of its interval. */
  stampAt: 'start' | 'end';
  intervalMinutes: number;
}

/**
 * Turns local wall-clock stamps (`YYYY-MM-DD HH:MM`, `24:00` allowed) into UTC start
 * instants. The fall-back hour appears twice in local time; each repeated stamp is
 * given the earliest reading that keeps the sequence increasing, so the first pass
 * through the hour takes summer time and the second standard time. A stamp inside the
 * spring-forward gap does not exist and is reported. Offsets come from luxon's zone data.
 */
export function localStampsToUtc(stamps: readonly string[], opts: LocalStampOptions): Result<Float64Array> {
  const zone = IANAZone.create(opts.zone);
  if (!zone.isValid) return fail([{ code: 'zone-unknown', message: `Unknown time zone "${opts.zone}". Use an IANA name such as Europe/Madrid.` }]);
  const stepMs = opts.intervalMinutes * 60_000;
  const shift = opts.stampAt === 'end' ? -stepMs : 0;
  const out = new Float64Array(stamps.length);
  const errors: Issue[] = [];
  let previous = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < stamps.length && errors.length < 20; i++) {
    const wall = parseWall(stamps[i]);
    if (wall === null) {
      errors.push({ code: 'stamp-unreadable', message: `Row ${i + 1}: "${stamps[i]}" is not a date and time like 2025-03-01 00:15.`, index: i });
      continue;
    }
    const candidates = instantsFor(zone, wall);
    if (candidates.length === 0) {
      errors.push({ code: 'stamp-in-gap', message: `Row ${i + 1}: ${stamps[i]} does not exist in ${opts.zone} (clocks went forward). Check whether the file is in standard time all year.`, index: i });
      continue;
    }
    const pick = candidates.find((t) => t > previous) ?? candidates[candidates.length - 1];
    previous = pick;
    out[i] = pick + shift;
  }
  return errors.length ? fail(errors) : ok(out);
}

/** Wall-clock milliseconds as if the local time were UTC, or null when unreadable. */
function parseWall(text: string): number | null {
  const m = STAMP.exec(text.trim());
  if (!m) return null;
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6] ?? '0'].map(Number);
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || mi > 59 || s > 59) return null;
  if (h > 24 || (h === 24 && (mi !== 0 || s !== 0))) return null;
  const ms = Date.UTC(y, mo - 1, d, h, mi, s);
  // Date.UTC rolls 31 February over silently; reject it.
  if (new Date(Date.UTC(y, mo - 1, d)).getUTCDate() !== d) return null;
  return ms;
}

/** Every UTC instant whose local reading in `zone` equals `wallMs`, earliest first. */
function instantsFor(zone: IANAZone, wallMs: number): number[] {
  const offsets = new Set([zone.offset(wallMs - 12 * HOUR_MS), zone.offset(wallMs), zone.offset(wallMs + 12 * HOUR_MS)]);
  const found: number[] = [];
  for (const o of offsets) {
    const t = wallMs - o * 60_000;
    if (zone.offset(t) === o && !found.includes(t)) found.push(t);
  }
  return found.sort((a, b) => a - b);
}
