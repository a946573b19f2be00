import { FIELD_COUNT, ZERO_KWH } from './aggregate-fields';
import type { AggregationPlan } from './aggregation-plan';
import { combinePatterns, mergeMaxima, scanRollingReadings } from './aggregate-combine';

/**
 * Leading kvarh a capacitor bank adds to each interval: none, the same in every
 * interval (fixed bank), or one value per interval (switched bank).
 */
export type ReactiveCorrection =
  | { kind: 'none' }
  | { kind: 'constant'; kvarh: number }
  | { kind: 'per-interval'; kvarh: Float64Array }
  | EqualStepController;

/**
 * A switched bank of `steps` equal steps, decided inside the kernel's pass (one pass
 * per candidate, no per-interval array). Built by `switchedBankCorrection`, which also
 * holds the reference implementation (`switchedBankKvarhInto`) it must agree with.
 */
export interface EqualStepController {
  kind: 'equal-steps';
  steps: number;
  /** kvarh one step supplies per interval. */
  stepKvarh: number;
  /** 1 / step kvar, per kW-based quantities. */
  invStepKvar: number;
  tanTarget: number;
  tanLimit: number;
  /** 60 / interval minutes. */
  toPower: number;
}

/** Tolerance of the step controller, kvar. */
export const CONTROLLER_EPS = 1e-9;

const NONE: ReactiveCorrection = { kind: 'none' };

// Field offsets, repeated here as literals because this is the hottest loop of the
// engine: V8 folds literals, while reading them off an imported object costs time.
// They must match aggregate-fields.ts (a unit test checks it).
const KWH = 0;
const LAG = 1;
const LEAD = 2;
const LEAD_ZERO = 3;
const IMPORT_N = 4;
const ZERO_N = 5;
const EXPORT_N = 6;
const KWH_EXPORT = 7;
const LEADING_N = 8;
const MISSING_N = 9;
const MAX_LEAD_RATIO = 10;
const MAX_KVAR = 11;
const MAX_KVAR_BLOCK = 12;
const MAX_KVA_SQ = 13;
const MAX_KVA_BLOCK = 14;
const COINCIDENT_KVAR = 15;
const LAG_EXPORT = 16;
const LEAD_EXPORT = 17;

/** Kernel field offsets, exported so a test can check them against `Field`. */
export const KERNEL_FIELDS = { kwh: KWH, kvarhLag: LAG, kvarhLead: LEAD, kvarhLeadZeroKw: LEAD_ZERO, importIntervals: IMPORT_N, zeroKwIntervals: ZERO_N, exportIntervals: EXPORT_N, kwhExport: KWH_EXPORT, leadingIntervals: LEADING_N, reactiveMissing: MISSING_N, maxLeadRatio: MAX_LEAD_RATIO, maxKvar: MAX_KVAR, maxKvarBlock: MAX_KVAR_BLOCK, maxKvaSq: MAX_KVA_SQ, maxKvaBlock: MAX_KVA_BLOCK, coincidentKvar: COINCIDENT_KVAR, kvarhLagExport: LAG_EXPORT, kvarhLeadExport: LEAD_EXPORT } as const;

/**
 * One pass over the intervals (block demand readings are closed inside it; rolling
 * demand adds a pass over its readings), filling `plan.acc` with the energy totals,
 * counts and reactive maxima of every (period, window) under a correction. Allocates
 * nothing: the sizing search calls it once per candidate.
 *
 * A bank's kvarh first cancels the interval's lagging kvarh and the rest is added
 * to its leading kvarh, so a zero correction reproduces the meter's registers.
 */
export function aggregate(plan: AggregationPlan, correction: ReactiveCorrection = NONE): Float64Array {
  const { series, prefix, intervalSlot, patternAcc, blocks, blockSlot } = plan;
  const { kwh, kvarhLag, kvarhLead } = series;
  const n = series.length;
  // kWh, counts and missing-kvarh tallies do not depend on the correction: start from them.
  patternAcc.set(plan.baseAcc);
  const perInterval = correction.kind === 'per-interval' ? correction.kvarh : null;
  const constant = correction.kind === 'constant' ? correction.kvarh : 0;
  const ctl = correction.kind === 'equal-steps' ? correction : null;
  const useCtl = ctl !== null;
  // Controller constants in locals: property loads inside the loop are not hoisted.
  const cSteps = ctl?.steps ?? 0;
  const cStepKvarh = ctl?.stepKvarh ?? 0;
  const cTarget = ctl ? ctl.tanTarget * ctl.toPower * ctl.invStepKvar : 0;
  const cLimit = ctl ? ctl.tanLimit * ctl.toPower * ctl.invStepKvar : 0;
  const cScale = ctl ? ctl.toPower * ctl.invStepKvar : 0;
  // Block demand partitions the intervals, so readings are closed inside this loop;
  // rolling demand overlaps, so it keeps prefix sums for a second pass.
  const fused = blocks.partition;
  const oneToOne = fused && blocks.count === n && blocks.windowMinutes === series.intervalMinutes;
  const toKw = 60 / blocks.windowMinutes;
  const { end: blockEnd, kw: blockKw } = blocks;
  let b = 0;
  let bEnd = blocks.count > 0 ? blockEnd[0] : -1;
  let blockSum = 0;
  let bCur = -1;
  let maxQ = -Infinity, maxQb = -1, maxSq = -1, maxSqb = -1;
  let running = 0;
  if (!fused) prefix[0] = 0;
  // Sums run in locals while the slot (period, window pattern) stays the same, which
  // holds for hours at a time, and are added to the slot's record when it changes.
  let current = -1;
  let sLag = 0, sLead = 0, sLeadZero = 0, nLeading = 0, leadRatio = 0, sLagExport = 0, sLeadExport = 0;
  for (let i = 0; i < n; i++) {
    const lag0 = kvarhLag[i];
    const lead0 = kvarhLead[i];
    const e = kwh[i];
    let c = constant;
    if (perInterval !== null) c = perInterval[i];
    else if (useCtl && e > ZERO_KWH) {
      // Same decision as switchedBankKvarhInto's equal-step path (a test holds them together).
      const q = lag0 - lead0;
      const kTarget = Math.ceil(q * cScale - e * cTarget - CONTROLLER_EPS);
      const kRoom = Math.floor(q * cScale + e * cLimit + CONTROLLER_EPS);
      let k = (kTarget + kRoom - Math.abs(kTarget - kRoom)) * 0.5;
      k = (k + cSteps - Math.abs(k - cSteps)) * 0.5;
      c = (k + Math.abs(k)) * 0.5 * cStepKvarh;
    }
    // Branch-free split: the lag/lead crossing is data-dependent and mispredicts, and
    // Math.max is slow in V8; (d + |d|) / 2 is max(d, 0) exactly.
    const d = lag0 - c;
    const ad = Math.abs(d);
    const lag = (d + ad) * 0.5;
    const lead = lead0 + (ad - d) * 0.5;
    const net = lag - lead;
    // Export intervals are reported apart: their kvar stays out of demand readings too.
    const demandNet = e >= -ZERO_KWH ? net : 0;
    const slot = intervalSlot[i];
    if (fused) {
      blockSum += demandNet;
      // One reading per interval (demand window = meter interval) skips the block bookkeeping.
      if (oneToOne || i + 1 === bEnd) {
        if (oneToOne) b = i;
        const bs = oneToOne ? slot : blockSlot[b];
        if (bs !== bCur) {
          if (bCur >= 0) mergeMaxima(patternAcc, bCur * FIELD_COUNT, maxQ, maxQb, maxSq, maxSqb);
          bCur = bs;
          maxQ = -Infinity; maxQb = -1; maxSq = -1; maxSqb = -1;
        }
        const q = blockSum * toKw;
        const k = blockKw[b];
        const sq = k * k + q * q;
        if (q > maxQ) { maxQ = q; maxQb = b; }
        if (sq > maxSq) { maxSq = sq; maxSqb = b; }
        blockSum = 0;
        if (!oneToOne) {
          b++;
          bEnd = b < blocks.count ? blockEnd[b] : -1;
        }
      }
    } else {
      running += demandNet;
      prefix[i + 1] = running;
    }
    if (slot !== current) {
      if (current >= 0) {
        const o = current * FIELD_COUNT;
        patternAcc[o + LAG] += sLag; patternAcc[o + LEAD] += sLead; patternAcc[o + LEAD_ZERO] += sLeadZero;
        patternAcc[o + LEADING_N] += nLeading;
        if (leadRatio > patternAcc[o + MAX_LEAD_RATIO]) patternAcc[o + MAX_LEAD_RATIO] = leadRatio;
        patternAcc[o + LAG_EXPORT] += sLagExport; patternAcc[o + LEAD_EXPORT] += sLeadExport;
      }
      current = slot;
      sLag = 0; sLead = 0; sLeadZero = 0; nLeading = 0; leadRatio = 0; sLagExport = 0; sLeadExport = 0;
    }
    if (e > ZERO_KWH) {
      sLag += lag; sLead += lead;
      // m is 2|Q| when leading, else 0; m / (m + 1e-300) is then exactly 1 or 0, a
      // count without a data-dependent branch (kvarh never comes near 1e-284).
      const m = Math.abs(net) - net;
      nLeading += m / (m + 1e-300);
      // Compare m / 2e with the running maximum by cross-multiplying: divide only on a new maximum.
      if (m > 2 * e * leadRatio) leadRatio = m / (2 * e);
    } else if (e < -ZERO_KWH) {
      sLagExport += lag; sLeadExport += lead;
    } else {
      // The registers still advance at zero kW, so their kvarh counts in the totals.
      sLag += lag; sLead += lead; sLeadZero += lead;
    }
  }
  if (current >= 0) {
    const o = current * FIELD_COUNT;
    patternAcc[o + LAG] += sLag; patternAcc[o + LEAD] += sLead; patternAcc[o + LEAD_ZERO] += sLeadZero;
    patternAcc[o + LEADING_N] += nLeading;
    if (leadRatio > patternAcc[o + MAX_LEAD_RATIO]) patternAcc[o + MAX_LEAD_RATIO] = leadRatio;
    patternAcc[o + LAG_EXPORT] += sLagExport; patternAcc[o + LEAD_EXPORT] += sLeadExport;
  }
  if (fused) {
    if (bCur >= 0) mergeMaxima(patternAcc, bCur * FIELD_COUNT, maxQ, maxQb, maxSq, maxSqb);
    peakReadingKvar(plan, correction);
  } else {
    scanRollingReadings(plan);
  }
  combinePatterns(plan);
  return plan.acc;
}

/**
 * Net kvar of each peak-kW reading under the correction, recomputed after the pass from
 * the few readings concerned so the hot loop carries no per-reading flag.
 */
function peakReadingKvar(plan: AggregationPlan, correction: ReactiveCorrection): void {
  const { series, blocks, peakBlock, blockKvar } = plan;
  const toKw = 60 / blocks.windowMinutes;
  for (let slot = 0; slot < peakBlock.length; slot++) {
    const b = peakBlock[slot];
    if (b < 0) continue;
    let sum = 0;
    for (let i = blocks.first[b]; i < blocks.end[b]; i++) {
      if (series.kwh[i] < -ZERO_KWH) continue;
      sum += series.kvarhLag[i] - series.kvarhLead[i] - bankKvarhAt(series, correction, i);
    }
    blockKvar[b] = sum * toKw;
  }
}

/** The bank kvarh of one interval under a correction (the kernel's rule, for a single interval). */
function bankKvarhAt(series: AggregationPlan['series'], correction: ReactiveCorrection, i: number): number {
  if (correction.kind === 'none') return 0;
  if (correction.kind === 'constant') return correction.kvarh;
  if (correction.kind === 'per-interval') return correction.kvarh[i];
  const e = series.kwh[i];
  if (!(e > ZERO_KWH)) return 0;
  const ctl = correction;
  // Same expressions, in the same order, as the pass (rounding must match to the last bit).
  const cTarget = ctl.tanTarget * ctl.toPower * ctl.invStepKvar;
  const cLimit = ctl.tanLimit * ctl.toPower * ctl.invStepKvar;
  const cScale = ctl.toPower * ctl.invStepKvar;
  const q = series.kvarhLag[i] - series.kvarhLead[i];
  const kTarget = Math.ceil(q * cScale - e * cTarget - CONTROLLER_EPS);
  const kRoom = Math.floor(q * cScale + e * cLimit + CONTROLLER_EPS);
  return Math.max(0, Math.min(kTarget, kRoom, ctl.steps)) * ctl.stepKvarh;
}
