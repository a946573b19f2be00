/**
 * Reconciliation: each bill's billed determinants against the same billing period recomputed
 * from the interval data and the site's tariff. Pure; thresholds are named constants.
 */
import type { PeriodFinding } from './compute';

export const TOLERANCE = {
  /** Average PF differing by more than this is flagged. */
  pf: 0.005,
  /** kWh and demand differing by more than this share are flagged. */
  share: 0.02,
  /** A PF charge differing by more than max(abs, share x computed) is flagged. */
  chargeAbs: 5,
  chargeShare: 0.02,
  /** Below this completeness a bill is not compared at all. */
  completeness: 0.99,
  /** kWh ratios whose spread (max - min) / mean is under this are "steady". */
  steadySpread: 0.02,
};

export type BilledDeterminants = {
  id: string;
  periodStart: string;
  periodEnd: string;
  kwh: number;
  billedDemand: number | null;
  demandUnit: 'kW' | 'kVA';
  kvarh: number | null;
  pf: number | null;
  pfCharge: number | null;
  total: number | null;
};

export type Comparison = { billed: number | null; computed: number | null; difference: number | null; flagged: boolean };

export type BillReconciliation = {
  billId: string;
  periodId: string;
  periodStart: string;
  periodEnd: string;
  completeness: number;
  compared: boolean;
  kwh: Comparison & { ratio: number | null };
  demand: Comparison & { unit: 'kW' | 'kVA' };
  pf: Comparison;
  pfCharge: Comparison;
  /** Billed PF charge above the computed one, when flagged; else 0. */
  disputable: number;
  notes: string[];
};

export type Reconciliation = {
  bills: BillReconciliation[];
  disputable: number;
  multiplier: { suspected: boolean; impliedMultiplier: number | null; message: string | null };
};

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

function compare(billed: number | null, computed: number | null, flagged: (b: number, c: number) => boolean): Comparison {
  if (billed === null || computed === null) return { billed, computed, difference: null, flagged: false };
  return { billed, computed, difference: billed - computed, flagged: flagged(billed, computed) };
}

/** The PF printed on the bill, or derived from its kWh and kvarh when only those are printed. */
export function billedPf(b: Pick<BilledDeterminants, 'pf' | 'kwh' | 'kvarh'>): number | null {
  if (b.pf !== null) return b.pf;
  if (b.kvarh !== null && b.kwh > 0) return b.kwh / Math.hypot(b.kwh, b.kvarh);
  return null;
}

/**
 * Compares bills with findings computed on the bills' own billing periods (same order and ids
 * `from..to`). Missing interval data is reported, never guessed.
 */
export function reconcile(bills: BilledDeterminants[], periods: PeriodFinding[], meterMultiplier = 1): Reconciliation {
  const byId = new Map(periods.map((p) => [p.id, p]));
  const out: BillReconciliation[] = bills.map((b) => {
    const periodId = `${b.periodStart}..${b.periodEnd}`;
    const p = byId.get(periodId);
    const completeness = p?.metrics.completeness ?? 0;
    const notes: string[] = [];
    const compared = !!p && completeness >= TOLERANCE.completeness;
    if (!p || p.metrics.presentIntervals === 0) notes.push('No interval data covers this billing period, so it is not compared. Upload the meter export for these dates.');
    else if (!compared) notes.push(`Interval data covers only ${(completeness * 100).toFixed(1)} % of this billing period, so it is not compared: missing data would understate every figure.`);
    const m = compared ? p!.metrics : null;
    const kwh = compare(b.kwh, m?.kwh ?? null, (x, c) => Math.abs(x - c) > TOLERANCE.share * c);
    const computedDemand = m ? (b.demandUnit === 'kVA' ? m.peakKva : m.peakKw) : null;
    const demand = compare(b.billedDemand, computedDemand, (x, c) => Math.abs(x - c) > TOLERANCE.share * c);
    const pf = compare(billedPf(b), m?.pfAvgLagging ?? null, (x, c) => Math.abs(x - c) > TOLERANCE.pf);
    const computedCharge = compared && p!.pfCharge !== null ? p!.pfCharge : null;
    const pfCharge = compare(b.pfCharge, computedCharge, (x, c) => Math.abs(x - c) > Math.max(TOLERANCE.chargeAbs, TOLERANCE.chargeShare * Math.abs(c)));
    if (compared && p!.pfCharge === null) notes.push('No tariff applies to this period, so the PF charge is not recomputed.');
    const disputable = pfCharge.flagged && pfCharge.difference! > 0 ? pfCharge.difference! : 0;
    if (pfCharge.flagged) notes.push(pfCharge.difference! > 0 ? `The bill's PF charge is ${round(pfCharge.difference!, 2)} above the recomputed charge.` : `The bill's PF charge is ${round(-pfCharge.difference!, 2)} below the recomputed charge.`);
    if (pf.flagged) notes.push(`The billed PF ${pf.billed!.toFixed(3)} differs from the PF in the interval data, ${pf.computed!.toFixed(3)}.`);
    return { billId: b.id, periodId, periodStart: b.periodStart, periodEnd: b.periodEnd, completeness, compared, kwh: { ...kwh, ratio: kwh.computed ? b.kwh / kwh.computed : null }, demand: { ...demand, unit: b.demandUnit }, pf, pfCharge, disputable, notes };
  });
  return { bills: out, disputable: out.reduce((s, b) => s + b.disputable, 0), multiplier: multiplierCheck(out, meterMultiplier) };
}

/** A steady kWh ratio away from 1 across bills points to a meter-multiplier error. */
function multiplierCheck(bills: BillReconciliation[], current: number): Reconciliation['multiplier'] {
  const ratios = bills.filter((b) => b.compared && b.kwh.ratio !== null).map((b) => b.kwh.ratio!);
  if (ratios.length < 2) return { suspected: false, impliedMultiplier: null, message: null };
  const mean = ratios.reduce((s, r) => s + r, 0) / ratios.length;
  const spread = (Math.max(...ratios) - Math.min(...ratios)) / mean;
  if (spread > TOLERANCE.steadySpread || Math.abs(mean - 1) <= TOLERANCE.share) return { suspected: false, impliedMultiplier: null, message: null };
  const implied = current * mean;
  return {
    suspected: true,
    impliedMultiplier: implied,
    message: `Billed kWh is a steady ${mean.toFixed(3)} × the interval kWh over ${ratios.length} bills: the meter multiplier looks wrong. The bills imply a multiplier of ${round(implied, 3)} where the import used ${current}. Check the CT and PT ratios with the utility before disputing.`,
  };
}
