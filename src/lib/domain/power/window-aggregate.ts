import { Field, FIELD_COUNT } from './aggregate-fields';
import type { AggregationPlan } from './aggregation-plan';

/**
 * Totals and demand figures of one period within one time-of-use window: the only
 * input tariff rules read. Reactive values are signed where named `Kvar` without a
 * register suffix (+ lagging, - leading).
 */
export interface WindowAggregate {
  /** Import energy, kWh. */
  kwh: number;
  /** Lagging kvarh of import and zero-kW intervals. */
  kvarhLag: number;
  /** Leading kvarh of import and zero-kW intervals. */
  kvarhLead: number;
  /** Leading kvarh recorded while kW was zero. */
  kvarhLeadZeroKw: number;
  importIntervals: number;
  zeroKwIntervals: number;
  exportIntervals: number;
  kwhExport: number;
  kvarhLagExport: number;
  kvarhLeadExport: number;
  /** Import intervals with net leading kvar. */
  leadingIntervals: number;
  leadingHours: number;
  /** Lowest PF among leading import intervals; null when none was leading. */
  worstLeadPf: number | null;
  reactiveMissingIntervals: number;
  /** Maximum import demand on the demand window, kW; 0 when the window is empty. */
  peakKw: number;
  peakAtMs: number | null;
  /** Net kvar of the peak-kW demand reading (coincident). */
  peakKvar: number;
  /** Highest net kvar of any demand reading (non-coincident); 0 when empty. */
  maxKvar: number;
  maxKvarAtMs: number | null;
  /** Highest kVA of any demand reading. */
  peakKva: number;
  peakKvaAtMs: number | null;
  /** kW of the reading with the highest kVA. */
  peakKvaKw: number;
}

/** Reads one (period, window) record out of the kernel's accumulator. */
export function readAggregate(plan: AggregationPlan, period: number, window: number): WindowAggregate {
  const slot = period * plan.windowCount + window;
  const o = slot * FIELD_COUNT;
  const a = plan.acc;
  const { blocks, series } = plan;
  const startOf = (b: number) => (b >= 0 ? series.startMs[blocks.first[b]] : null);
  const peakB = plan.peakBlock[slot];
  const kvarB = a[o + Field.maxKvarBlock];
  const kvaB = a[o + Field.maxKvaBlock];
  return {
    kwh: a[o + Field.kwh],
    kvarhLag: a[o + Field.kvarhLag],
    kvarhLead: a[o + Field.kvarhLead],
    kvarhLeadZeroKw: a[o + Field.kvarhLeadZeroKw],
    importIntervals: a[o + Field.importIntervals],
    zeroKwIntervals: a[o + Field.zeroKwIntervals],
    exportIntervals: a[o + Field.exportIntervals],
    kwhExport: a[o + Field.kwhExport],
    kvarhLagExport: a[o + Field.kvarhLagExport],
    kvarhLeadExport: a[o + Field.kvarhLeadExport],
    leadingIntervals: a[o + Field.leadingIntervals],
    leadingHours: (a[o + Field.leadingIntervals] * series.intervalMinutes) / 60,
    worstLeadPf: a[o + Field.leadingIntervals] > 0 ? 1 / Math.sqrt(1 + a[o + Field.maxLeadRatio] ** 2) : null,
    reactiveMissingIntervals: a[o + Field.reactiveMissing],
    peakKw: peakB >= 0 ? blocks.kw[peakB] : 0,
    peakAtMs: startOf(peakB),
    peakKvar: peakB >= 0 ? a[o + Field.coincidentKvar] : 0,
    maxKvar: kvarB >= 0 ? a[o + Field.maxKvar] : 0,
    maxKvarAtMs: startOf(kvarB),
    peakKva: kvaB >= 0 ? Math.sqrt(a[o + Field.maxKvaSq]) : 0,
    peakKvaAtMs: startOf(kvaB),
    peakKvaKw: kvaB >= 0 ? blocks.kw[kvaB] : 0,
  };
}
