/**
 * Packing interval data into per-meter, per-UTC-day blocks of typed arrays and back.
 * Pure functions over IntervalSeries-shaped arrays; the database module stores the blobs.
 * Blobs are the platform's native little-endian bytes (every supported target is LE).
 */
import type { IntervalSeries } from '../domain/series/interval-series';

export const DAY_MS = 86_400_000;

export type DayBlock = {
  day: number;
  count: number;
  startMs: Float64Array;
  kwh: Float64Array;
  kvarhLag: Float64Array;
  kvarhLead: Float64Array;
  flags: Uint8Array;
};

export type PackedBlock = { day: number; count: number; startMs: Buffer; kwh: Buffer; kvarhLag: Buffer; kvarhLead: Buffer; flags: Buffer };

const bytes = (a: Float64Array | Uint8Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

/** Splits a series into UTC-day blocks (views, not copies). */
export function splitByDay(s: Pick<IntervalSeries, 'length' | 'startMs' | 'kwh' | 'kvarhLag' | 'kvarhLead' | 'flags'>): DayBlock[] {
  const out: DayBlock[] = [];
  let i = 0;
  while (i < s.length) {
    const day = Math.floor(s.startMs[i]! / DAY_MS);
    const end = (day + 1) * DAY_MS;
    let j = i;
    while (j < s.length && s.startMs[j]! < end) j++;
    out.push({ day, count: j - i, startMs: s.startMs.subarray(i, j), kwh: s.kwh.subarray(i, j), kvarhLag: s.kvarhLag.subarray(i, j), kvarhLead: s.kvarhLead.subarray(i, j), flags: s.flags.subarray(i, j) });
    i = j;
  }
  return out;
}

export function pack(b: DayBlock): PackedBlock {
  return { day: b.day, count: b.count, startMs: bytes(b.startMs), kwh: bytes(b.kwh), kvarhLag: bytes(b.kvarhLag), kvarhLead: bytes(b.kvarhLead), flags: bytes(b.flags) };
}

/** Copies a blob into a fresh, aligned typed array (blobs from the driver may be unaligned). */
function f64(buf: ArrayBuffer | Uint8Array, count: number): Float64Array {
  const u8 = buf instanceof Uint8Array ? buf : new Uint8Array(buf);
  if (u8.byteLength !== count * 8) throw new Error(`interval block is corrupt: ${u8.byteLength} bytes for ${count} values`);
  const out = new Float64Array(count);
  new Uint8Array(out.buffer).set(u8);
  return out;
}

export function unpack(row: { day: number; count: number; startMs: ArrayBuffer | Uint8Array; kwh: ArrayBuffer | Uint8Array; kvarhLag: ArrayBuffer | Uint8Array; kvarhLead: ArrayBuffer | Uint8Array; flags: ArrayBuffer | Uint8Array }): DayBlock {
  const flags = new Uint8Array(row.count);
  flags.set(row.flags instanceof Uint8Array ? row.flags : new Uint8Array(row.flags));
  return { day: row.day, count: row.count, startMs: f64(row.startMs, row.count), kwh: f64(row.kwh, row.count), kvarhLag: f64(row.kvarhLag, row.count), kvarhLead: f64(row.kvarhLead, row.count), flags };
}

/**
 * Replaces the intervals of `existing` whose start lies in [fromMs, toMs] with `incoming`
 * (both sorted), returning one merged, sorted block for the same day.
 */
export function mergeDay(existing: DayBlock, incoming: DayBlock, fromMs: number, toMs: number): DayBlock {
  const keep: number[] = [];
  for (let i = 0; i < existing.count; i++) {
    const t = existing.startMs[i]!;
    if (t < fromMs || t > toMs) keep.push(i);
  }
  const n = keep.length + incoming.count;
  const m: DayBlock = { day: existing.day, count: n, startMs: new Float64Array(n), kwh: new Float64Array(n), kvarhLag: new Float64Array(n), kvarhLead: new Float64Array(n), flags: new Uint8Array(n) };
  let a = 0;
  let b = 0;
  for (let k = 0; k < n; k++) {
    const takeA = b >= incoming.count || (a < keep.length && existing.startMs[keep[a]!]! < incoming.startMs[b]!);
    const [src, idx] = takeA ? [existing, keep[a++]!] : [incoming, b++];
    m.startMs[k] = src.startMs[idx]!;
    m.kwh[k] = src.kwh[idx]!;
    m.kvarhLag[k] = src.kvarhLag[idx]!;
    m.kvarhLead[k] = src.kvarhLead[idx]!;
    m.flags[k] = src.flags[idx]!;
  }
  return m;
}

/** Concatenates day blocks into one series' arrays, keeping only starts in [fromMs, toMs). */
export function concatBlocks(blocks: DayBlock[], fromMs = -Infinity, toMs = Infinity) {
  let n = 0;
  for (const b of blocks) for (let i = 0; i < b.count; i++) if (b.startMs[i]! >= fromMs && b.startMs[i]! < toMs) n++;
  const out = { length: n, startMs: new Float64Array(n), kwh: new Float64Array(n), kvarhLag: new Float64Array(n), kvarhLead: new Float64Array(n), flags: new Uint8Array(n) };
  let k = 0;
  for (const b of blocks) {
    const whole = b.count > 0 && b.startMs[0]! >= fromMs && b.startMs[b.count - 1]! < toMs;
    if (whole) {
      out.startMs.set(b.startMs, k);
      out.kwh.set(b.kwh, k);
      out.kvarhLag.set(b.kvarhLag, k);
      out.kvarhLead.set(b.kvarhLead, k);
      out.flags.set(b.flags, k);
      k += b.count;
      continue;
    }
    for (let i = 0; i < b.count; i++) {
      const t = b.startMs[i]!;
      if (t < fromMs || t >= toMs) continue;
      out.startMs[k] = t;
      out.kwh[k] = b.kwh[i]!;
      out.kvarhLag[k] = b.kvarhLag[i]!;
      out.kvarhLead[k] = b.kvarhLead[i]!;
      out.flags[k] = b.flags[i]!;
      k++;
    }
  }
  return out;
}
