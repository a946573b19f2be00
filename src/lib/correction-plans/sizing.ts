/**
 * Sizing search over a site's own data: Fixed banks and Switched banks of 4, 6 and 8 equal
 * steps from 25 kvar up to a largest size, about a hundred candidates, with the engine's
 * best-NPV and shortest-payback marks and the textbook Qc = P (tan φ1 − tan φ2) beside them.
 */
import { sizingSearch, type SizingRow } from '../domain/correction/sizing-search';
import type { TextbookEstimate } from '../domain/correction/textbook-estimate';
import type { SizingQuery } from './plan-spec';
import type { SiteInputs } from './site-inputs';

export const SIZING_STEP_COUNTS = [4, 6, 8] as const;

export type SizingResult = {
  currency: string;
  tariffName: string;
  targetPf: number;
  baselineAnnualPfCharge: number;
  sizesKvar: number[];
  rows: (Omit<SizingRow, 'paybackYears'> & { paybackYears: number | null })[];
  bestNpvIndex: number | null;
  shortestPaybackIndex: number | null;
  textbook: TextbookEstimate | null;
  assumptions: { fixedPerKvar: number; switchedPerKvar: number; fixedInstallation: number; detunedPremiumPerKvar: number | null; omPctOfCapex: number; discountRate: number; lifeYears: number };
  notes: string[];
};

/** Highest lagging kvar demand of any interval (kvarh × 60 / T). */
export function maxLaggingKvar(inputs: SiteInputs): number {
  const { series } = inputs;
  let max = 0;
  for (let i = 0; i < series.length; i++) if (series.kvarhLag[i]! > max) max = series.kvarhLag[i]!;
  return (max * 60) / series.intervalMinutes;
}

/** Candidate sizes: 25 kvar steps (or coarser) up to the largest size, at most 25 sizes. */
export function candidateSizes(maxKvar: number): number[] {
  const top = Math.max(25, Math.ceil(maxKvar / 25) * 25);
  const step = Math.max(25, Math.ceil(top / 24 / 25) * 25);
  const out: number[] = [];
  for (let k = 25; k <= top; k += step) out.push(k);
  if (out.at(-1)! < top) out.push(top);
  return out;
}

export function runSizing(inputs: SiteInputs, q: SizingQuery): SizingResult {
  const sizesKvar = candidateSizes(q.maxKvar ?? maxLaggingKvar(inputs));
  const t = sizingSearch(inputs.tariff, inputs.series, inputs.periods, {
    sizesKvar,
    kinds: ['fixed', 'switched'],
    stepCounts: SIZING_STEP_COUNTS,
    targetPf: q.targetPf,
    costs: {
      fixed: { perKvar: q.fixedPerKvar, fixedCost: q.fixedInstallation },
      switched: { perKvar: q.switchedPerKvar, fixedCost: q.fixedInstallation },
      detuningPremiumPerKvar: q.detunedPremiumPerKvar,
      omPctOfCapex: q.omPctOfCapex,
    },
    finance: { lifeYears: q.lifeYears, discountRate: q.discountRate },
  });
  return {
    currency: t.currency,
    tariffName: inputs.tariffName,
    targetPf: q.targetPf,
    baselineAnnualPfCharge: t.baselineAnnualPfCharge,
    sizesKvar,
    rows: t.rows.map((r) => ({ ...r, paybackYears: Number.isFinite(r.paybackYears) ? r.paybackYears : null })),
    bestNpvIndex: t.bestNpvIndex,
    shortestPaybackIndex: t.shortestPaybackIndex,
    textbook: t.textbook,
    assumptions: { fixedPerKvar: q.fixedPerKvar, switchedPerKvar: q.switchedPerKvar, fixedInstallation: q.fixedInstallation, detunedPremiumPerKvar: q.detunedPremiumPerKvar ?? null, omPctOfCapex: q.omPctOfCapex, discountRate: q.discountRate, lifeYears: q.lifeYears },
    notes: [...inputs.notes, ...t.notes, ...(t.notes.some((n) => /within an interval/.test(n)) ? [] : ['Switched banks are simulated on interval averages: switching within an interval is not seen.'])],
  };
}
