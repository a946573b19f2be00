/**
 * After the file is read: order one meter's rows, drop identical duplicates, find the
 * interval length, check for mixed lengths, shift interval-ending stamps and convert
 * demand to energy. Produces the engine's `SeriesInput` arrays.
 */
import type { ReactiveInput, SeriesInput } from '../domain/series/build-series';
import type { ChannelSet, MeterMapping } from './mapping-schema';
import type { MeterRows } from './meter-accumulator';
import { ProblemList, rowLabel } from './problems';
import { isoUtc } from './stamps';
import { unitInfo } from './units';

/** Consecutive equal spacings longer than one interval that count as a different interval length, not as gaps. */
export const MIXED_RUN = 4;

export interface FinishedMeter {
  meterId: string;
  intervalMinutes: number;
  intervalSource: 'detected' | 'mapping';
  /** Share of spacings equal to the interval (0..1). */
  modalShare: number;
  /** Interval start instants, UTC ms, strictly increasing. */
  startMs: Float64Array;
  /** 1-based file line of each interval. */
  lines: Int32Array;
  kwh: Float64Array;
  /** Lagging register, net signed kvarh, or Q1 + Q2, per interval. */
  kvarhA: Float64Array;
  /** Leading register or Q3 + Q4 (zeros for lagging-only; unused for net and none). */
  kvarhB: Float64Array;
  /** kVAh per interval when a kVA column was mapped. */
  kvah: Float64Array | null;
  pfPrinted: Float64Array | null;
  rowsOutOfOrder: number;
  duplicatesIdentical: { row: number; firstRow: number }[];
  duplicatesIdenticalCount: number;
  exportQuadrantRows: number;
  series: SeriesInput;
}

function same(a: number, b: number): boolean {
  return a === b || (a !== a && b !== b);
}

/** Finishes one meter; returns null after adding problems (the import is blocked). */
export function finishMeter(rows: MeterRows, set: ChannelSet, m: MeterMapping, problems: ProblemList): FinishedMeter | null {
  const n0 = rows.length;
  let stamps = rows.stamps.view();
  let lines = rows.lines.view();
  let active = rows.active.view();
  let ra = rows.reactiveA.view();
  let rb = rows.reactiveB.view();
  let apparent = rows.apparent?.view() ?? null;
  let pf = rows.pf?.view() ?? null;

  // Order by instant (stable on line) when the file is not ascending, e.g. newest first.
  let outOfOrder = 0;
  for (let i = 1; i < n0; i++) if (stamps[i] < stamps[i - 1]) outOfOrder++;
  if (outOfOrder) {
    const order = Array.from({ length: n0 }, (_, i) => i).sort((x, y) => stamps[x] - stamps[y] || lines[x] - lines[y]);
    const pick = <T extends Float64Array | Int32Array>(src: T): T => {
      const out = new (src.constructor as new (n: number) => T)(n0);
      for (let i = 0; i < n0; i++) out[i] = src[order[i]];
      return out;
    };
    stamps = pick(stamps);
    lines = pick(lines);
    active = pick(active);
    ra = pick(ra);
    rb = pick(rb);
    apparent = apparent && pick(apparent);
    pf = pf && pick(pf);
  }

  // Duplicated stamps: identical rows are dropped (warning); different values block the import.
  const keep = new Uint8Array(n0).fill(1);
  const dupes: { row: number; firstRow: number }[] = [];
  let dupeCount = 0;
  let conflicts = 0;
  for (let i = 1; i < n0; i++) {
    if (stamps[i] !== stamps[i - 1]) continue;
    let j = i - 1;
    while (!keep[j]) j--;
    const identical = same(active[i], active[j]) && same(ra[i], ra[j]) && same(rb[i], rb[j]);
    keep[i] = 0;
    if (identical) {
      dupeCount++;
      if (dupes.length < 20) dupes.push({ row: lines[i], firstRow: lines[j] });
    } else {
      conflicts++;
      problems.add('duplicate-conflict', lines[i], null, null, `${rowLabel(lines[i])}: meter ${rows.meterId} has a second reading for the interval at ${isoUtc(stamps[i])} (first on row ${lines[j].toLocaleString('en-US')}) with different values. Remove the wrong row; if the stamps are local time, check the clock-change setting.`);
    }
  }
  if (conflicts) return null;
  const n = n0 - dupeCount;
  if (dupeCount) {
    const compact = <T extends Float64Array | Int32Array>(src: T): T => {
      const out = new (src.constructor as new (n: number) => T)(n);
      let k = 0;
      for (let i = 0; i < n0; i++) if (keep[i]) out[k++] = src[i];
      return out;
    };
    stamps = compact(stamps);
    lines = compact(lines);
    active = compact(active);
    ra = compact(ra);
    rb = compact(rb);
    apparent = apparent && compact(apparent);
    pf = pf && compact(pf);
  }

  // Interval length: the most common spacing (ties go to the shorter one).
  const counts = new Map<number, number>();
  let runD = Number.NaN;
  let runCount = 0;
  for (let i = 1; i < n; i++) {
    const d = stamps[i] - stamps[i - 1];
    if (d === runD) runCount++;
    else {
      if (runCount) counts.set(runD, (counts.get(runD) ?? 0) + runCount);
      runD = d;
      runCount = 1;
    }
  }
  if (runCount) counts.set(runD, (counts.get(runD) ?? 0) + runCount);
  let modal = 0;
  let modalCount = 0;
  for (const [d, c] of counts) if (c > modalCount || (c === modalCount && d < modal)) [modal, modalCount] = [d, c];
  let stepMs: number;
  let source: 'detected' | 'mapping' = 'detected';
  if (m.intervalMinutes !== undefined) {
    stepMs = m.intervalMinutes * 60_000;
    source = 'mapping';
    if (n > 1 && modal !== stepMs && !(counts.get(stepMs) ?? 0)) {
      problems.add('interval-mismatch', lines[0], null, null, `Meter ${rows.meterId}: the mapping says ${m.intervalMinutes}-minute intervals but the stamps are mostly ${fmtMinutes(modal)} apart. Correct the interval length in the mapping.`);
      return null;
    }
  } else {
    if (n < 2) {
      problems.add('interval-undetectable', n ? lines[0] : null, null, null, `Meter ${rows.meterId} has only one interval, so its length cannot be detected. State the interval length in the mapping or upload more data.`);
      return null;
    }
    if (modal % 60_000 !== 0 || modal < 60_000 || modal > 86_400_000) {
      problems.add('interval-undetectable', lines[1], null, null, `Meter ${rows.meterId}: the stamps are mostly ${fmtMinutes(modal)} apart, which is not a whole number of minutes up to one day. Check the timestamp column and format.`);
      return null;
    }
    stepMs = modal;
  }

  // Mixed interval lengths: a spacing that is not a whole number of intervals, or a run of equal longer spacings.
  let mixed = 0;
  let run = 0;
  for (let i = 1; i < n; i++) {
    const d = stamps[i] - stamps[i - 1];
    if (d % stepMs !== 0) {
      mixed++;
      problems.add('interval-mixed', lines[i], null, null, `${rowLabel(lines[i])}: this stamp is ${fmtMinutes(d)} after the one before, which does not fit the ${fmtMinutes(stepMs)} interval of meter ${rows.meterId}. Fix the stamp, or if the meter's interval changed here, split the file and upload one interval length per file.`);
      run = 0;
      continue;
    }
    const prev = i > 1 ? stamps[i - 1] - stamps[i - 2] : stepMs;
    run = d !== stepMs && d === prev ? run + 1 : d !== stepMs ? 1 : 0;
    if (run === MIXED_RUN) {
      mixed++;
      const at = i - MIXED_RUN + 1;
      problems.add('interval-mixed', lines[at], null, null, `${rowLabel(lines[at])}: from here meter ${rows.meterId} has stamps ${fmtMinutes(d)} apart, but most of the file is ${fmtMinutes(stepMs)} apart. Upload one interval length per file (split the file where the meter's interval changed).`);
    }
  }
  if (mixed) return null;

  const intervalMinutes = stepMs / 60_000;
  if (m.timestamp.stampAt === 'end') for (let i = 0; i < n; i++) stamps[i] -= stepMs;
  const hours = intervalMinutes / 60;
  if (unitInfo(set.active.unit).kind === 'demand') for (let i = 0; i < n; i++) active[i] *= hours;
  if (set.reactive.kind !== 'none' && unitInfo(set.reactive.unit).kind === 'demand') {
    for (let i = 0; i < n; i++) {
      ra[i] *= hours;
      rb[i] *= hours;
    }
  }
  if (apparent && set.apparent && unitInfo(set.apparent.unit).kind === 'demand') for (let i = 0; i < n; i++) apparent[i] *= hours;

  // Own the memory: the growable columns over-allocate up to 2x; hand out exact-size arrays.
  const tight = <T extends Float64Array | Int32Array>(a: T): T => (a.byteLength === a.buffer.byteLength ? a : (a.slice() as T));
  stamps = tight(stamps);
  lines = tight(lines);
  active = tight(active);
  ra = tight(ra);
  rb = tight(rb);
  apparent = apparent && tight(apparent);
  pf = pf && tight(pf);

  const kind = set.reactive.kind;
  const reactive: ReactiveInput = kind === 'none' ? { kind: 'none' } : kind === 'net' ? { kind: 'net', net: ra } : { kind: 'registers', lag: ra, lead: rb };
  return {
    meterId: rows.meterId,
    intervalMinutes,
    intervalSource: source,
    modalShare: n > 1 ? (counts.get(stepMs) ?? 0) / (n - 1) : 1,
    startMs: stamps,
    lines,
    kwh: active,
    kvarhA: ra,
    kvarhB: rb,
    kvah: apparent,
    pfPrinted: pf,
    rowsOutOfOrder: outOfOrder,
    duplicatesIdentical: dupes,
    duplicatesIdenticalCount: dupeCount,
    exportQuadrantRows: rows.exportQuadrantRows,
    series: { intervalMinutes, stamps, stampAt: 'start', active, activeUnit: 'kWh', reactive, reactiveUnit: 'kvarh' },
  };
}

/** `15 min`, `1 h 30 min`, `2 days`. */
export function fmtMinutes(ms: number): string {
  const min = ms / 60_000;
  if (min >= 1440 && min % 1440 === 0) return `${min / 1440} day${min === 1440 ? '' : 's'}`;
  if (min >= 60 && min % 60 === 0) return `${min / 60} h`;
  if (min >= 60 && Number.isInteger(min)) return `${Math.floor(min / 60)} h ${min % 60} min`;
  if (Number.isInteger(min)) return `${min} min`;
  return `${Math.round(ms / 1000)} s`;
}
