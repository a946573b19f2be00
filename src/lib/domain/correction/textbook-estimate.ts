import { Field, FIELD_COUNT } from '../power/aggregate-fields';
import { averagePf, tanPhi } from '../power/quantities';
import type { PreparedTariff } from '../tariff/evaluate-tariff';
import { num } from '../tariff/format';

export interface TextbookEstimate {
  periodLabel: string;
  peakKw: number;
  pfFrom: number;
  pfTo: number;
  kvar: number;
  explanation: string;
}

/**
 * Qc = P (tan phi1 - tan phi2) for the worst month (lowest average lagging PF), with P
 * its peak kW. Reads the prepared plan's accumulator, so call it right after the
 * baseline evaluation.
 */
export function textbookEstimate(prep: PreparedTariff, pfTo: number): TextbookEstimate | null {
  const { plan } = prep;
  let worst = -1;
  let worstPf = 2;
  for (let p = 0; p < plan.periods.length; p++) {
    const o = p * plan.windowCount * FIELD_COUNT;
    const pf = averagePf(plan.acc[o + Field.kwh], plan.acc[o + Field.kvarhLag]);
    if (pf !== null && pf < worstPf) {
      worstPf = pf;
      worst = p;
    }
  }
  if (worst < 0) return null;
  const block = plan.peakBlock[worst * plan.windowCount];
  const peakKw = block >= 0 ? plan.blocks.kw[block] : 0;
  const t1 = tanPhi(worstPf);
  const t2 = tanPhi(pfTo);
  const kvar = Math.max(0, peakKw * (t1 - t2));
  const label = plan.periods[worst].label;
  const explanation =
    worstPf >= pfTo
      ? `Worst period ${label}: average PF ${worstPf.toFixed(3)} already meets ${pfTo}; no correction needed by the textbook formula.`
      : `Worst period ${label}: average PF ${worstPf.toFixed(3)} at a peak of ${num(peakKw, 1)} kW; Qc = ${num(peakKw, 1)} × (${t1.toFixed(4)} − ${t2.toFixed(4)}) = ${num(kvar, 1)} kvar.`;
  return { periodLabel: label, peakKw, pfFrom: worstPf, pfTo, kvar, explanation };
}
