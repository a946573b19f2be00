import type { Period } from '../periods/period';
import { computeMetrics } from '../power/period-metrics';
import type { IntervalSeries } from '../series/interval-series';

export interface PeriodLeading {
  periodId: string;
  label: string;
  leadingHours: number;
  leadingKvarh: number;
  /** Leading hours the bank added to the period. */
  addedLeadingHours: number;
  worstLeadPf: number | null;
  /** The bank pushed the site leading for at least the threshold hours (light-load over-correction). */
  overCorrected: boolean;
}

export interface CorrectionSummary {
  leadingIntervals: number;
  leadingHours: number;
  leadingKvarh: number;
  worstLeadPf: number | null;
  periods: PeriodLeading[];
  /** Labels of periods flagged as over-corrected. */
  overCorrectedPeriods: string[];
}

/**
 * Leading-power report of a corrected series against the original, per period.
 * A period counts as over-corrected when the bank added at least `minLeadingHours`
 * of leading operation (default 1 hour), which is light-load over-correction.
 */
export function summariseCorrection(before: IntervalSeries, after: IntervalSeries, periods: readonly Period[], minLeadingHours = 1): CorrectionSummary {
  const mb = computeMetrics(before, periods);
  const ma = computeMetrics(after, periods);
  let worst: number | null = null;
  let leadingIntervals = 0;
  let leadingKvarh = 0;
  const rows = ma.map((a, k) => {
    const added = a.leadingHours - mb[k].leadingHours;
    leadingIntervals += a.leadingIntervals;
    leadingKvarh += a.kvarhLead;
    if (a.worstLeadPf !== null && (worst === null || a.worstLeadPf < worst)) worst = a.worstLeadPf;
    return {
      periodId: a.periodId,
      label: a.label,
      leadingHours: a.leadingHours,
      leadingKvarh: a.kvarhLead,
      addedLeadingHours: added,
      worstLeadPf: a.worstLeadPf,
      overCorrected: added >= minLeadingHours,
    };
  });
  return {
    leadingIntervals,
    leadingHours: (leadingIntervals * before.intervalMinutes) / 60,
    leadingKvarh,
    worstLeadPf: worst,
    periods: rows,
    overCorrectedPeriods: rows.filter((r) => r.overCorrected).map((r) => r.label),
  };
}
