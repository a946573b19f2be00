/**
 * Timestamp text -> milliseconds. A reader returns either a UTC instant (the stamp
 * carried Z or an offset) or a "wall" value: the local reading counted as if it were UTC,
 * to be resolved in a time zone by `ZoneResolver`. Written with char codes because it
 * runs once per row (ISO 8601 layouts; `24:00` accepted as the end of a day).
 */
import type { TimestampMapping } from './mapping-schema';

export interface StampOut {
  /** Milliseconds: an instant when `offsetMin` is finite, otherwise a wall reading. */
  ms: number;
  /** Offset from UTC in minutes written in the stamp, or NaN when none was written. */
  offsetMin: number;
}

/** Reads `date` (and `time` when the mapping has a time column) into `out`; false when unreadable. */
export type StampReader = (date: string, time: string | undefined, out: StampOut) => boolean;

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function isLeap(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

/** Wall milliseconds or NaN when the fields do not form a real date and time. */
export function wallMs(y: number, mo: number, d: number, h: number, mi: number, s: number, ms = 0): number {
  if (mo < 1 || mo > 12 || d < 1 || y < 1900 || y > 2200) return Number.NaN;
  const dim = mo === 2 && isLeap(y) ? 29 : DAYS_IN_MONTH[mo - 1];
  if (d > dim || mi > 59 || s > 59 || h > 24) return Number.NaN;
  if (h === 24 && (mi !== 0 || s !== 0 || ms !== 0)) return Number.NaN;
  return Date.UTC(y, mo - 1, d, h, mi, s, ms);
}

let cachedDayKey = -1;
let cachedDayMs = 0;

/** `wallMs` with the date part cached: consecutive rows nearly always share the date. */
function fastWall(y: number, mo: number, d: number, h: number, mi: number, s: number, ms: number): number {
  const key = y * 10_000 + mo * 100 + d;
  if (key !== cachedDayKey || h > 23 || mi > 59 || s > 59) {
    const full = wallMs(y, mo, d, h, mi, s, ms);
    if (full !== full || h > 23) return full;
    cachedDayKey = key;
    cachedDayMs = Date.UTC(y, mo - 1, d);
  }
  return cachedDayMs + h * 3_600_000 + mi * 60_000 + s * 1000 + ms;
}

function digits(t: string, at: number, n: number): number {
  let v = 0;
  for (let i = at; i < at + n; i++) {
    const c = t.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return -1;
    v = v * 10 + c;
  }
  return v;
}

/**
 * ISO 8601 extended format: `YYYY-MM-DDTHH:MM[:SS[.fff]][Z|+HH:MM|+HHMM|+HH]`, with a space
 * allowed instead of `T` (RFC 3339 section 5.6 note). With a time column the date column
 * holds `YYYY-MM-DD` and the time column `HH:MM[:SS]`.
 */
export function readIso(date: string, time: string | undefined, out: StampOut): boolean {
  let t = date;
  if (t.charCodeAt(0) <= 32 || t.charCodeAt(t.length - 1) <= 32) t = t.trim();
  if (time !== undefined) t = `${t}T${time.trim()}`;
  if (t.length < 16) return false;
  const y = digits(t, 0, 4);
  const mo = digits(t, 5, 2);
  const d = digits(t, 8, 2);
  const sep = t.charCodeAt(10);
  if (y < 0 || mo < 0 || d < 0 || t[4] !== '-' || t[7] !== '-' || (sep !== 84 && sep !== 32 && sep !== 116)) return false;
  const h = digits(t, 11, 2);
  const mi = digits(t, 14, 2);
  if (h < 0 || mi < 0 || t[13] !== ':') return false;
  let i = 16;
  let s = 0;
  let frac = 0;
  if (t[i] === ':') {
    s = digits(t, i + 1, 2);
    if (s < 0) return false;
    i += 3;
    if (t[i] === '.' || t[i] === ',') {
      let j = i + 1;
      let scale = 100;
      while (j < t.length && t.charCodeAt(j) >= 48 && t.charCodeAt(j) <= 57) {
        frac += (t.charCodeAt(j) - 48) * scale;
        scale /= 10;
        j++;
      }
      if (j === i + 1) return false;
      i = j;
      frac = Math.round(frac);
    }
  }
  const ms = fastWall(y, mo, d, h, mi, s, frac);
  if (ms !== ms) return false;
  if (i === t.length) {
    out.ms = ms;
    out.offsetMin = Number.NaN;
    return true;
  }
  const c = t[i];
  if ((c === 'Z' || c === 'z') && i + 1 === t.length) {
    out.ms = ms;
    out.offsetMin = 0;
    return true;
  }
  if (c !== '+' && c !== '-') return false;
  const oh = digits(t, i + 1, 2);
  let om = 0;
  let end = i + 3;
  if (t[end] === ':') {
    om = digits(t, end + 1, 2);
    end += 3;
  } else if (end < t.length) {
    om = digits(t, end, 2);
    end += 2;
  }
  if (oh < 0 || om < 0 || oh > 18 || om > 59 || end !== t.length) return false;
  const offset = (c === '-' ? -1 : 1) * (oh * 60 + om);
  out.offsetMin = offset;
  out.ms = ms - offset * 60_000;
  return true;
}

const DATE_RE = /^(\d{1,4})([/.-])(\d{1,2})\2(\d{1,4})$/;
const TIME_RE = /^(\d{1,2}):(\d{2})(?::(\d{2}))?\s*([AaPp][Mm])?$/;

/** A date in a stated order (`01/02/2025`, `2025.02.01`, `1-2-25` is refused: four-digit years only) plus a time. */
export function dateTimeReader(order: 'ymd' | 'dmy' | 'mdy'): StampReader {
  const slow = dateTimeReaderSlow(order);
  const yearFirst = order === 'ymd';
  return (date, time, out) => {
    // Fast path for the fixed-width layouts most exports use: 31/01/2025 (or 2025/01/31) + 00:15[:00].
    if (time !== undefined && date.length === 10 && (time.length === 5 || time.length === 8)) {
      const s1 = yearFirst ? 4 : 2;
      const s2 = yearFirst ? 7 : 5;
      const c1 = date.charCodeAt(s1);
      if ((c1 === 47 || c1 === 45 || c1 === 46) && date.charCodeAt(s2) === c1 && time.charCodeAt(2) === 58) {
        const a = digits(date, 0, yearFirst ? 4 : 2);
        const b = digits(date, s1 + 1, 2);
        const c = digits(date, s2 + 1, yearFirst ? 2 : 4);
        const h = digits(time, 0, 2);
        const mi = digits(time, 3, 2);
        const sec = time.length === 8 && time.charCodeAt(5) === 58 ? digits(time, 6, 2) : time.length === 5 ? 0 : -1;
        if (a >= 0 && b >= 0 && c >= 0 && h >= 0 && mi >= 0 && sec >= 0) {
          const ms = yearFirst ? fastWall(a, b, c, h, mi, sec, 0) : order === 'dmy' ? fastWall(c, b, a, h, mi, sec, 0) : fastWall(c, a, b, h, mi, sec, 0);
          if (ms !== ms) return false;
          out.ms = ms;
          out.offsetMin = Number.NaN;
          return true;
        }
      }
    }
    return slow(date, time, out);
  };
}

function dateTimeReaderSlow(order: 'ymd' | 'dmy' | 'mdy'): StampReader {
  return (date, time, out) => {
    let d = date.trim();
    let tm = time?.trim();
    if (tm === undefined) {
      const space = d.search(/[ T]/);
      if (space === -1) return false;
      tm = d.slice(space + 1).trim();
      d = d.slice(0, space);
    }
    const dm = DATE_RE.exec(d);
    const tmm = TIME_RE.exec(tm);
    if (!dm || !tmm) return false;
    const a = Number(dm[1]);
    const b = Number(dm[3]);
    const c = Number(dm[4]);
    let y: number;
    let mo: number;
    let day: number;
    if (order === 'ymd') {
      if (dm[1].length !== 4) return false;
      [y, mo, day] = [a, b, c];
    } else {
      if (dm[4].length !== 4) return false;
      [y, mo, day] = order === 'dmy' ? [c, b, a] : [c, a, b];
    }
    let h = Number(tmm[1]);
    const ampm = tmm[4]?.toLowerCase();
    if (ampm) {
      if (h < 1 || h > 12) return false;
      h = (h % 12) + (ampm === 'pm' ? 12 : 0);
    }
    const ms = wallMs(y, mo, day, h, Number(tmm[2]), Number(tmm[3] ?? 0));
    if (ms !== ms) return false;
    out.ms = ms;
    out.offsetMin = Number.NaN;
    return true;
  };
}

const EXCEL_EPOCH_DAYS = 25_569; // serial of 1970-01-01 in the 1900 date system (1899-12-30 = 0)

/**
 * Spreadsheet serial day numbers (1900 date system, as written by common spreadsheet
 * programs): whole part = days since 1899-12-30, fraction = time of day. Rounded to the
 * second to undo binary fractions.
 */
export function excelSerialReader(decimalSeparator: '.' | ','): StampReader {
  return (date, _time, out) => {
    let t = date.trim();
    if (decimalSeparator === ',') t = t.replace(',', '.');
    if (!/^\d+(\.\d+)?$/.test(t)) return false;
    const serial = Number(t);
    // 1900-03-01 (61) to 2200: earlier serials are distorted by the 1900 leap-year bug.
    if (serial < 61 || serial > 109_575) return false;
    out.ms = Math.round((serial - EXCEL_EPOCH_DAYS) * 86_400) * 1000;
    out.offsetMin = Number.NaN;
    return true;
  };
}

/** The reader a timestamp mapping calls for. */
export function stampReader(ts: TimestampMapping, decimalSeparator: '.' | ','): StampReader {
  if (ts.format === 'iso') return readIso;
  if (ts.format === 'excel-serial') return excelSerialReader(decimalSeparator);
  return dateTimeReader(ts.dateOrder ?? 'ymd');
}

/** ISO 8601 UTC text of an instant, minutes precision when whole: 2025-03-30T01:00:00Z. */
export function isoUtc(ms: number): string {
  return new Date(ms).toISOString().replace('.000Z', 'Z');
}
