import { Field, FIELD_COUNT } from './aggregate-fields';
import type { AggregationPlan } from './aggregation-plan';

/*
 * The cold parts of the aggregation kernel: the rolling-demand scan, and folding the
 * (period, window-pattern) records into (period, window) records. Run once per pass
 * over periods x patterns, not per interval, so they use the named fields.
 */

/** Rolling demand: highest kvar and kVA reading per (period, pattern) from prefix sums. */
export function scanRollingReadings(plan: AggregationPlan): void {
  const { patternAcc: acc, prefix, blocks, blockSlot, peakBlockFlag, blockKvar } = plan;
  const toKw = 60 / blocks.windowMinutes;
  const { first, end, kw } = blocks;
  let current = -1;
  let maxQ = -Infinity, maxQb = -1, maxSq = -1, maxSqb = -1;
  for (let b = 0; b < blocks.count; b++) {
    const slot = blockSlot[b];
    if (slot !== current) {
      if (current >= 0) mergeMaxima(acc, current * FIELD_COUNT, maxQ, maxQb, maxSq, maxSqb);
      current = slot;
      maxQ = -Infinity; maxQb = -1; maxSq = -1; maxSqb = -1;
    }
    if (slot < 0) continue;
    const q = (prefix[end[b]] - prefix[first[b]]) * toKw;
    if (peakBlockFlag[b] === 1) blockKvar[b] = q;
    const k = kw[b];
    const sq = k * k + q * q;
    if (q > maxQ) {
      maxQ = q;
      maxQb = b;
    }
    if (sq > maxSq) {
      maxSq = sq;
      maxSqb = b;
    }
  }
  if (current >= 0) mergeMaxima(acc, current * FIELD_COUNT, maxQ, maxQb, maxSq, maxSqb);
}

/** Folds a run's kvar and kVA maxima into a record (strictly greater keeps the earlier reading). */
export function mergeMaxima(acc: Float64Array, o: number, maxQ: number, maxQb: number, maxSq: number, maxSqb: number): void {
  // Strictly greater keeps the earlier reading on ties, as readings arrive in time order.
  if (maxQ > acc[o + Field.maxKvar]) {
    acc[o + Field.maxKvar] = maxQ;
    acc[o + Field.maxKvarBlock] = maxQb;
  }
  if (maxSq > acc[o + Field.maxKvaSq]) {
    acc[o + Field.maxKvaSq] = maxSq;
    acc[o + Field.maxKvaBlock] = maxSqb;
  }
}

const SUMMED = [Field.kwh, Field.kvarhLag, Field.kvarhLead, Field.kvarhLeadZeroKw, Field.importIntervals, Field.zeroKwIntervals, Field.exportIntervals, Field.kwhExport, Field.leadingIntervals, Field.reactiveMissing, Field.kvarhLagExport, Field.kvarhLeadExport];

/** Folds (period, pattern) records into (period, window) records and adds the coincident kvar. */
export function combinePatterns(plan: AggregationPlan): void {
  const { acc, patternAcc, patternBits, peakBlock, blockKvar, windowCount: W } = plan;
  const P = patternBits.length;
  resetAccumulator(acc);
  const periods = plan.periods.length;
  for (let p = 0; p < periods; p++) {
    for (let k = 0; k < P; k++) {
      const src = (p * P + k) * FIELD_COUNT;
      const bits = patternBits[k];
      for (let w = 0; w < W; w++) {
        if ((bits & (1 << w)) === 0) continue;
        const dst = (p * W + w) * FIELD_COUNT;
        for (const f of SUMMED) acc[dst + f] += patternAcc[src + f];
        if (patternAcc[src + Field.maxLeadRatio] > acc[dst + Field.maxLeadRatio]) acc[dst + Field.maxLeadRatio] = patternAcc[src + Field.maxLeadRatio];
        const qb = patternAcc[src + Field.maxKvarBlock];
        if (qb >= 0 && (patternAcc[src + Field.maxKvar] > acc[dst + Field.maxKvar] || (patternAcc[src + Field.maxKvar] === acc[dst + Field.maxKvar] && qb < acc[dst + Field.maxKvarBlock]))) {
          acc[dst + Field.maxKvar] = patternAcc[src + Field.maxKvar];
          acc[dst + Field.maxKvarBlock] = qb;
        }
        const sb = patternAcc[src + Field.maxKvaBlock];
        if (sb >= 0 && (patternAcc[src + Field.maxKvaSq] > acc[dst + Field.maxKvaSq] || (patternAcc[src + Field.maxKvaSq] === acc[dst + Field.maxKvaSq] && sb < acc[dst + Field.maxKvaBlock]))) {
          acc[dst + Field.maxKvaSq] = patternAcc[src + Field.maxKvaSq];
          acc[dst + Field.maxKvaBlock] = sb;
        }
      }
    }
  }
  for (let slot = 0; slot < peakBlock.length; slot++) {
    const b = peakBlock[slot];
    if (b >= 0) acc[slot * FIELD_COUNT + Field.coincidentKvar] = blockKvar[b];
  }
}

/** Clears an accumulator: sums to 0, maxima to their neutral values. */
export function resetAccumulator(acc: Float64Array): void {
  acc.fill(0);
  for (let o = 0; o < acc.length; o += FIELD_COUNT) {
    acc[o + Field.maxKvar] = Number.NEGATIVE_INFINITY;
    acc[o + Field.maxKvarBlock] = -1;
    acc[o + Field.maxKvaSq] = -1;
    acc[o + Field.maxKvaBlock] = -1;
  }
}
