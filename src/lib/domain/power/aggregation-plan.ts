import type { Period } from '../periods/period';
import { periodRanges } from '../periods/period-ranges';
import type { IntervalSeries } from '../series/interval-series';
import { localCalendarFor } from '../series/local-calendar';
import type { TouWindow } from '../tariff/tou-window';
import { buildWindowBits } from '../tariff/window-mask';
import { FIELD_COUNT } from './aggregate-fields';
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
  /** Period index of each interval, -1 outside every period. */
  readonly intervalPeriod: Int32Array;
  /** Window membership bits per interval; null when only window 0 exists. */
  readonly bits: Uint32Array | null;
  readonly blocks: DemandBlocks;
  readonly blockPeriod: Int32Array;
  readonly blockBits: Uint32Array | null;
  /** Peak-kW demand reading per (period, window), -1 when the window is empty. */
  readonly peakBlock: Int32Array;
  /** Scratch: prefix sums of corrected net kvarh, length n + 1. */
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
  const intervalPeriod = new Int32Array(n).fill(-1);
  const ranges = periodRanges(series, periods);
  for (let p = 0; p < periods.length; p++) intervalPeriod.fill(p, ranges.first[p], ranges.end[p]);

  const blocks = buildDemandBlocks(series, cal, opts.demandWindowMinutes ?? series.intervalMinutes, opts.demandMethod ?? 'block');
  const blockPeriod = new Int32Array(blocks.count);
  const blockBits = bits ? new Uint32Array(blocks.count) : null;
  const peakBlock = new Int32Array(periods.length * windowCount).fill(-1);
  for (let b = 0; b < blocks.count; b++) {
    const a = blocks.anchor[b];
    const p = intervalPeriod[a];
    blockPeriod[b] = p;
    const bb = bits ? bits[a] : 1;
    if (blockBits) blockBits[b] = bb;
    if (p < 0) continue;
    for (let w = 0; w < windowCount; w++) {
      if ((bb & (1 << w)) === 0) continue;
      const slot = p * windowCount + w;
      const current = peakBlock[slot];
      // Ties keep the earliest reading, which is what a meter's maximum register shows.
      if (current < 0 || blocks.kw[b] > blocks.kw[current]) peakBlock[slot] = b;
    }
  }
  return {
    series,
    periods,
    windowCount,
    windows,
    intervalPeriod,
    bits,
    blocks,
    blockPeriod,
    blockBits,
    peakBlock,
    prefix: new Float64Array(n + 1),
    acc: new Float64Array(periods.length * windowCount * FIELD_COUNT),
  };
}
