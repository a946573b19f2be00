import { SeriesFlag } from '../series/interval-series';
import { Field, FIELD_COUNT, ZERO_KWH } from './aggregate-fields';
import type { AggregationPlan } from './aggregation-plan';

/**
 * Leading kvarh a capacitor bank adds to each interval: none, the same in every
 * interval (fixed bank), or one value per interval (switched bank).
 */
export type ReactiveCorrection =
  | { kind: 'none' }
  | { kind: 'constant'; kvarh: number }
  | { kind: 'per-interval'; kvarh: Float64Array };

const NONE: ReactiveCorrection = { kind: 'none' };

/**
 * One pass over the intervals and one over the demand readings, filling `plan.acc`
 * with the energy totals, counts and reactive maxima of every (period, window) under
 * a correction. Allocates nothing: the sizing search calls it once per candidate.
 *
 * A bank's kvarh first cancels the interval's lagging kvarh and the rest is added
 * to its leading kvarh, so a zero correction reproduces the meter's registers.
 */
export function aggregate(plan: AggregationPlan, correction: ReactiveCorrection = NONE): Float64Array {
  const { series, acc, prefix, intervalPeriod, bits, windowCount: W } = plan;
  const { kwh, kvarhLag, kvarhLead, flags } = series;
  const n = series.length;
  resetAccumulator(acc);
  const perInterval = correction.kind === 'per-interval' ? correction.kvarh : null;
  const constant = correction.kind === 'constant' ? correction.kvarh : 0;
  let running = 0;
  prefix[0] = 0;
  for (let i = 0; i < n; i++) {
    let lag = kvarhLag[i];
    let lead = kvarhLead[i];
    const c = perInterval !== null ? perInterval[i] : constant;
    if (c !== 0) {
      if (c <= lag) lag -= c;
      else {
        lead += c - lag;
        lag = 0;
      }
    }
    const net = lag - lead;
    running += net;
    prefix[i + 1] = running;
    const p = intervalPeriod[i];
    if (p < 0) continue;
    const e = kwh[i];
    const b = bits !== null ? bits[i] : 1;
    const missing = (flags[i] & SeriesFlag.reactiveMissing) !== 0 ? 1 : 0;
    for (let w = 0; w < W; w++) {
      if ((b & (1 << w)) === 0) continue;
      const o = (p * W + w) * FIELD_COUNT;
      acc[o + Field.reactiveMissing] += missing;
      if (e > ZERO_KWH) {
        acc[o + Field.kwh] += e;
        acc[o + Field.kvarhLag] += lag;
        acc[o + Field.kvarhLead] += lead;
        acc[o + Field.importIntervals] += 1;
        if (net < 0) {
          acc[o + Field.leadingIntervals] += 1;
          const pf = e / Math.sqrt(e * e + net * net);
          if (pf < acc[o + Field.worstLeadPf]) acc[o + Field.worstLeadPf] = pf;
        }
      } else if (e < -ZERO_KWH) {
        acc[o + Field.exportIntervals] += 1;
        acc[o + Field.kwhExport] -= e;
        acc[o + Field.kvarhLagExport] += lag;
        acc[o + Field.kvarhLeadExport] += lead;
      } else {
        // The registers still advance at zero kW, so their kvarh counts in the totals.
        acc[o + Field.zeroKwIntervals] += 1;
        acc[o + Field.kvarhLag] += lag;
        acc[o + Field.kvarhLead] += lead;
        acc[o + Field.kvarhLeadZeroKw] += lead;
      }
    }
  }
  scanDemandReadings(plan);
  return acc;
}

function scanDemandReadings(plan: AggregationPlan): void {
  const { acc, prefix, blocks, blockPeriod, blockBits, peakBlock, windowCount: W } = plan;
  const toKw = 60 / blocks.windowMinutes;
  const { first, end, kw } = blocks;
  for (let b = 0; b < blocks.count; b++) {
    const p = blockPeriod[b];
    if (p < 0) continue;
    const q = (prefix[end[b]] - prefix[first[b]]) * toKw;
    const k = kw[b];
    const sq = k * k + q * q;
    const bb = blockBits !== null ? blockBits[b] : 1;
    for (let w = 0; w < W; w++) {
      if ((bb & (1 << w)) === 0) continue;
      const o = (p * W + w) * FIELD_COUNT;
      if (q > acc[o + Field.maxKvar]) {
        acc[o + Field.maxKvar] = q;
        acc[o + Field.maxKvarBlock] = b;
      }
      if (sq > acc[o + Field.maxKvaSq]) {
        acc[o + Field.maxKvaSq] = sq;
        acc[o + Field.maxKvaBlock] = b;
      }
    }
  }
  for (let slot = 0; slot < peakBlock.length; slot++) {
    const b = peakBlock[slot];
    if (b < 0) continue;
    acc[slot * FIELD_COUNT + Field.coincidentKvar] = (prefix[end[b]] - prefix[first[b]]) * toKw;
  }
}

function resetAccumulator(acc: Float64Array): void {
  acc.fill(0);
  for (let o = 0; o < acc.length; o += FIELD_COUNT) {
    acc[o + Field.worstLeadPf] = Number.POSITIVE_INFINITY;
    acc[o + Field.maxKvar] = Number.NEGATIVE_INFINITY;
    acc[o + Field.maxKvarBlock] = -1;
    acc[o + Field.maxKvaSq] = -1;
    acc[o + Field.maxKvaBlock] = -1;
  }
}
