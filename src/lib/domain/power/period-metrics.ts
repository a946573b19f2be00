import { expectedIntervals, type Period } from '../periods/period';
import { periodRanges } from '../periods/period-ranges';
import { SeriesFlag, type IntervalSeries } from '../series/interval-series';
import { ZERO_KWH } from './aggregate-fields';
import { aggregate } from './aggregate-kernel';
import { createAggregationPlan } from './aggregation-plan';
import type { DemandMethod } from './demand-blocks';
import { averagePf, pfSense, powerFactor, type PfSense } from './quantities';
import { readAggregate } from './window-aggregate';

export interface MetricsOptions {
  /** Demand window in minutes (defaults to the meter interval). */
  demandWindowMinutes?: number;
  demandMethod?: DemandMethod;
  /** Interval PF below which hours are counted (default 0.90). */
  pfThreshold?: number;
}

/** The audit figures of one period. Energies in kWh/kvarh, demands in kW/kvar/kVA. */
export interface PeriodMetrics {
  periodId: string;
  label: string;
  hours: number;
  expectedIntervals: number;
  presentIntervals: number;
  /** present / expected, 0..1. */
  completeness: number;
  kwh: number;
  kvarhLag: number;
  kvarhLead: number;
  /** Lagging minus leading kvarh (signed). */
  kvarhNet: number;
  /** Average PF from period totals on each kvarh basis; null without import. */
  pfAvgLagging: number | null;
  pfAvgNet: number | null;
  pfAvgNetSense: PfSense;
  pfAvgAbsolute: number | null;
  peakKw: number;
  peakAtMs: number | null;
  /** kvar of the peak-kW demand reading (coincident), signed. */
  peakKvar: number;
  peakPf: number | null;
  peakPfSense: PfSense;
  peakKva: number;
  peakKvaAtMs: number | null;
  maxKvar: number;
  maxKvarAtMs: number | null;
  /** Lowest PF of any import interval (zero-kW, export and no-kvarh intervals excluded). */
  minIntervalPf: number | null;
  minIntervalPfAtMs: number | null;
  minIntervalPfSense: PfSense;
  pfThreshold: number;
  hoursBelowThreshold: number;
  /** kWh / (peak kW x hours); null without a peak. */
  loadFactor: number | null;
  zeroKwIntervals: number;
  exportIntervals: number;
  kwhExport: number;
  kvarhLagExport: number;
  kvarhLeadExport: number;
  leadingIntervals: number;
  leadingHours: number;
  worstLeadPf: number | null;
  reactiveMissingIntervals: number;
}

/**
 * Computes every period's metrics: energy totals, average PF on the three kvarh
 * bases, peak demand on the demand window with its coincident kvar and PF, peak kVA,
 * maximum kvar, interval PF statistics, load factor, completeness and the zero-kW,
 * export and leading interval counts.
 */
export function computeMetrics(series: IntervalSeries, periods: readonly Period[], opts: MetricsOptions = {}): PeriodMetrics[] {
  const plan = createAggregationPlan(series, periods, { demandWindowMinutes: opts.demandWindowMinutes, demandMethod: opts.demandMethod });
  aggregate(plan);
  const threshold = opts.pfThreshold ?? 0.9;
  const stepHours = series.intervalMinutes / 60;
  const ranges = periodRanges(series, periods);
  return periods.map((period, p) => {
    const a = readAggregate(plan, p, 0);
    const stats = intervalPfStats(series, ranges.first[p], ranges.end[p], threshold);
    const present = a.importIntervals + a.zeroKwIntervals + a.exportIntervals;
    const expected = expectedIntervals(period, series.intervalMinutes);
    const net = a.kvarhLag - a.kvarhLead;
    // Without any kvarh reading a PF would read 1.000 by accident: report none instead.
    const hasReactive = a.reactiveMissingIntervals < a.importIntervals + a.zeroKwIntervals + a.exportIntervals;
    const pfOrNull = (v: number | null) => (hasReactive ? v : null);
    return {
      periodId: period.id,
      label: period.label,
      hours: period.hours,
      expectedIntervals: expected,
      presentIntervals: present,
      completeness: expected > 0 ? present / expected : 0,
      kwh: a.kwh,
      kvarhLag: a.kvarhLag,
      kvarhLead: a.kvarhLead,
      kvarhNet: net,
      pfAvgLagging: pfOrNull(averagePf(a.kwh, a.kvarhLag)),
      pfAvgNet: pfOrNull(averagePf(a.kwh, net)),
      pfAvgNetSense: pfSense(net),
      pfAvgAbsolute: pfOrNull(averagePf(a.kwh, a.kvarhLag + a.kvarhLead)),
      peakKw: a.peakKw,
      peakAtMs: a.peakAtMs,
      peakKvar: a.peakKvar,
      peakPf: pfOrNull(powerFactor(a.peakKw, a.peakKvar)),
      peakPfSense: pfSense(a.peakKvar),
      peakKva: a.peakKva,
      peakKvaAtMs: a.peakKvaAtMs,
      maxKvar: a.maxKvar,
      maxKvarAtMs: a.maxKvarAtMs,
      minIntervalPf: stats.minPf,
      minIntervalPfAtMs: stats.minAtMs,
      minIntervalPfSense: stats.minSense,
      pfThreshold: threshold,
      hoursBelowThreshold: stats.below * stepHours,
      loadFactor: a.peakKw > 0 ? a.kwh / (a.peakKw * period.hours) : null,
      zeroKwIntervals: a.zeroKwIntervals,
      exportIntervals: a.exportIntervals,
      kwhExport: a.kwhExport,
      kvarhLagExport: a.kvarhLagExport,
      kvarhLeadExport: a.kvarhLeadExport,
      leadingIntervals: a.leadingIntervals,
      leadingHours: a.leadingHours,
      worstLeadPf: a.worstLeadPf,
      reactiveMissingIntervals: a.reactiveMissingIntervals,
    };
  });
}

function intervalPfStats(series: IntervalSeries, from: number, to: number, threshold: number) {
  let minPf = Number.POSITIVE_INFINITY;
  let minAt = -1;
  let below = 0;
  for (let i = from; i < to; i++) {
    const e = series.kwh[i];
    // Zero-kW and export intervals have no PF; an interval without kvarh has an unknown one.
    if (!(e > ZERO_KWH) || (series.flags[i] & SeriesFlag.reactiveMissing) !== 0) continue;
    const q = series.kvarhLag[i] - series.kvarhLead[i];
    const pf = e / Math.sqrt(e * e + q * q);
    if (pf < threshold) below++;
    if (pf < minPf) {
      minPf = pf;
      minAt = i;
    }
  }
  return {
    minPf: minAt >= 0 ? minPf : null,
    minAtMs: minAt >= 0 ? series.startMs[minAt] : null,
    minSense: minAt >= 0 ? pfSense(series.kvarhLag[minAt] - series.kvarhLead[minAt]) : ('unity' as PfSense),
    below,
  };
}
