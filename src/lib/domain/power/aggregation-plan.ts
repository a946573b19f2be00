import type { Period } from '../periods/period';
import { periodRanges } from '../periods/period-ranges';
import { SeriesFlag, type IntervalSeries } from '../series/interval-series';
import { localCalendarFor } from '../series/local-calendar';
import type { TouWindow } from '../tariff/tou-window';
import { buildWindowBits } from '../tariff/window-mask';
import { Field, FIELD_COUNT, ZERO_KWH } from './aggregate-fields';
import { resetAccumulator } from './aggregate-combine';
import { buildDemandBlocks, type DemandBlocks, type DemandMethod } from './demand-blocks';

export interface AggregationOptions {
  /** Time-of-use windows to aggregate besides "all intervals" (window 0). */
  windows?: readonly TouWindow[];
  /** Tariff holidays, `YYYY-MM-DD`, used by windows' holiday rule. */
  holidays?: readonly string[];
  /** Demand window in minutes; defaults to the meter interval. */
  demandWindowMinutes?: number;
  demandMethod?: DemandMethod;
}

/**
 * Everything about a (series, periods, windows, demand window) combination that does
 * not change when reactive power is corrected: period of each interval, window bits,
 * demand readings and the peak-kW reading of each (period, window). Built once, then
 * `aggregate()` runs per scenario reusing its scratch buffers.
 */
export interface AggregationPlan {
  readonly series: IntervalSeries;
  readonly periods: readonly Period[];
  /** Window count including window 0 (all intervals). */
  readonly windowCount: number;
  readonly windows: readonly TouWindow[];
  /**
   * Window-membership patterns: intervals with the same bits feed the same windows,
   * so the kernel sums per (period, pattern) and combines patterns into windows after.
   */
  readonly patternBits: Uint32Array;
  /** (period x patterns + pattern) of each interval, -1 outside every period. */
  readonly intervalSlot: Int32Array;
  readonly blocks: DemandBlocks;
  /** (period x patterns + pattern) of each demand reading's anchor interval, or -1. */
  readonly blockSlot: Int32Array;
  /** Peak-kW demand reading per (period, window), -1 when the window is empty. */
  readonly peakBlock: Int32Array;
  /** Scratch: per (period, pattern) sums, FIELD_COUNT numbers each. */
  readonly patternAcc: Float64Array;
  /**
   * The part of `patternAcc` no correction changes (kWh, interval counts, missing kvarh)
   * with every other field at its reset value; each pass starts from a copy of it.
   */
  readonly baseAcc: Float64Array;
  /** 1 for demand readings that are the kW peak of some (period, window). */
  readonly peakBlockFlag: Uint8Array;
  /** Scratch: net kvar of each peak reading under the current correction. */
  readonly blockKvar: Float64Array;
  /** Scratch for rolling demand: prefix sums of corrected net kvarh, length n + 1 (empty otherwise). */
  readonly prefix: Float64Array;
  /** Scratch accumulator, FIELD_COUNT numbers per (period, window). */
  readonly acc: Float64Array;
}

/** Builds the scenario-independent part of an aggregation (see `AggregationPlan`). */
export function createAggregationPlan(series: IntervalSeries, periods: readonly Period[], opts: AggregationOptions = {}): AggregationPlan {
  const zones = new Set(periods.map((p) => p.zone));
  if (zones.size > 1) throw new RangeError('All periods of one evaluation must use the same time zone.');
  const zone = periods[0]?.zone ?? 'UTC';
  const cal = localCalendarFor(series, zone);
  const windows = opts.windows ?? [];
  const windowCount = windows.length + 1;
  const bits = windows.length ? buildWindowBits(cal, windows, opts.holidays ?? []) : null;

  const n = series.length;
  const ranges = periodRanges(series, periods);
  // Distinct membership patterns, in order of first appearance (window 0 always in).
  const patternOf = new Map<number, number>();
  const patternList: number[] = [];
  const patternIndex = (b: number) => {
    let k = patternOf.get(b);
    if (k === undefined) {
      k = patternList.push(b) - 1;
      patternOf.set(b, k);
    }
    return k;
  };
  const localPattern = new Int32Array(n);
  let lastBits = -1;
  let lastPattern = 0;
  for (let i = 0; i < n && bits; i++) {
    // Membership comes in long runs; look the pattern up only when it changes.
    if (bits[i] !== lastBits) {
      lastBits = bits[i];
      lastPattern = patternIndex(lastBits);
    }
    localPattern[i] = lastPattern;
  }
  if (patternList.length === 0) patternList.push(1);
  const P = patternList.length;
  const intervalSlot = new Int32Array(n).fill(-1);
  for (let p = 0; p < periods.length; p++) {
    for (let i = ranges.first[p]; i < ranges.end[p]; i++) intervalSlot[i] = p * P + localPattern[i];
  }

  const blocks = buildDemandBlocks(series, cal, opts.demandWindowMinutes ?? series.intervalMinutes, opts.demandMethod ?? 'block');
  const blockSlot = new Int32Array(blocks.count);
  const peakBlock = new Int32Array(periods.length * windowCount).fill(-1);
  for (let b = 0; b < blocks.count; b++) {
    const a = blocks.anchor[b];
    const slot = intervalSlot[a];
    blockSlot[b] = slot;
    if (slot < 0) continue;
    const p = Math.floor(slot / P);
    const bb = bits ? bits[a] : 1;
    for (let w = 0; w < windowCount; w++) {
      if ((bb & (1 << w)) === 0) continue;
      const s = p * windowCount + w;
      const current = peakBlock[s];
      // Ties keep the earliest reading, which is what a meter's maximum register shows.
      if (current < 0 || blocks.kw[b] > blocks.kw[current]) peakBlock[s] = b;
    }
  }
  return {
    series,
    periods,
    windowCount,
    windows,
    patternBits: Uint32Array.from(patternList),
    intervalSlot,
    blocks,
    blockSlot,
    peakBlock,
    patternAcc: new Float64Array(periods.length * P * FIELD_COUNT),
    baseAcc: constantSums(series, intervalSlot, periods.length * P),
    peakBlockFlag: flagPeaks(peakBlock, blocks.count),
    blockKvar: new Float64Array(blocks.count),
    prefix: new Float64Array(blocks.partition ? 0 : n + 1),
    acc: new Float64Array(periods.length * windowCount * FIELD_COUNT),
  };
}

function flagPeaks(peakBlock: Int32Array, count: number): Uint8Array {
  const flags = new Uint8Array(count);
  for (const b of peakBlock) if (b >= 0) flags[b] = 1;
  return flags;
}

/** Per-slot sums that do not depend on reactive correction, computed once per plan. */
function constantSums(series: IntervalSeries, intervalSlot: Int32Array, slots: number): Float64Array {
  const acc = new Float64Array(slots * FIELD_COUNT);
  resetAccumulator(acc);
  for (let i = 0; i < series.length; i++) {
    const slot = intervalSlot[i];
    if (slot < 0) continue;
    const o = slot * FIELD_COUNT;
    const e = series.kwh[i];
    if ((series.flags[i] & SeriesFlag.reactiveMissing) !== 0) acc[o + Field.reactiveMissing] += 1;
    if (e > ZERO_KWH) {
      acc[o + Field.kwh] += e;
      acc[o + Field.importIntervals] += 1;
    } else if (e < -ZERO_KWH) {
      acc[o + Field.exportIntervals] += 1;
      acc[o + Field.kwhExport] -= e;
    } else {
      acc[o + Field.zeroKwIntervals] += 1;
    }
  }
  return acc;
}
