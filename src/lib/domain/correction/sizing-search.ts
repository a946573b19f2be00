import { capexOf } from '../economics/capex';
import { economics } from '../economics/economics';
import type { Period } from '../periods/period';
import { Field, FIELD_COUNT } from '../power/aggregate-fields';
import type { ReactiveCorrection } from '../power/aggregate-kernel';
import type { IntervalSeries } from '../series/interval-series';
import { evaluatePrepared, prepareTariff, type EvaluateOptions, type PreparedTariff } from '../tariff/evaluate-tariff';
import type { Tariff } from '../tariff/tariff-schema';
import { switchedBankSchema } from './bank-spec';
import { fixedBankKvarhPerInterval, switchedBankCorrection } from './bank-kvarh';
import { textbookEstimate, type TextbookEstimate } from './textbook-estimate';
import { screenResonance, screenResonanceSteps } from './resonance';
import { voltageRise } from './voltage-and-duty';

/** Bank sizes from `fromKvar` to `toKvar` inclusive in steps of `stepKvar`, for `sizesKvar`. */
export function kvarRange(fromKvar: number, toKvar: number, stepKvar: number): number[] {
  if (!(stepKvar > 0) || !(toKvar >= fromKvar) || !(fromKvar > 0)) throw new RangeError('Use a positive start, an end not below it and a positive step.');
  const count = Math.floor((toKvar - fromKvar) / stepKvar + 1e-9) + 1;
  return Array.from({ length: count }, (_, k) => Number((fromKvar + k * stepKvar).toFixed(6)));
}

export interface BankCosts {
  perKvar: number;
  fixedCost: number;
}

export interface SizingOptions {
  /** Candidate bank sizes, kvar at rated voltage. */
  sizesKvar: readonly number[];
  kinds?: readonly ('fixed' | 'switched')[];
  /** Step counts tried for switched banks (equal steps), default [6]. */
  stepCounts?: readonly number[];
  /** Switched-bank controller target, also the textbook estimate's target. */
  targetPf: number;
  leadingLimitPf?: number;
  ratedVoltageV?: number;
  serviceVoltageV?: number;
  costs: { fixed: BankCosts; switched: BankCosts; detuningPremiumPerKvar?: number; omPctOfCapex?: number };
  finance: { lifeYears: number; discountRate: number };
  evaluate?: EvaluateOptions;
  /** Supply transformer, to screen each row for resonance and voltage rise. */
  transformer?: { kva: number; impedancePct: number };
}

/** Screening of one row against the supply transformer (warnings, not design). */
export interface RowScreen {
  /** Resonance order with all steps in. */
  order: number;
  /** Screened harmonics that some step combination comes close to (empty when none). */
  nearHarmonics: number[];
  voltageRisePct: number;
}

export interface SizingRow {
  kind: 'fixed' | 'switched';
  kvar: number;
  steps: number | null;
  annualPfCharge: number;
  annualSaving: number;
  capex: number;
  omPerYear: number;
  paybackYears: number;
  npv: number;
  irr: number | null;
  leadingHours: number;
  leadingKvarh: number;
  worstLeadPf: number | null;
  bestNpv: boolean;
  shortestPayback: boolean;
  /** Present when a transformer was given. */
  screen?: RowScreen;
}

export interface SizingTable {
  currency: string;
  baselineAnnualPfCharge: number;
  /** Multiplier from the evaluated periods to one year (1 for a year of data). */
  annualFactor: number;
  rows: SizingRow[];
  bestNpvIndex: number | null;
  shortestPaybackIndex: number | null;
  textbook: TextbookEstimate | null;
  notes: string[];
}

/**
 * Evaluates fixed and switched banks of each size on the site's own intervals with
 * the site's tariff; the saving of a row is baseline minus corrected PF charges,
 * both from the same evaluation. One prepared plan serves all candidates; each costs
 * one pass over the data (equal-step controllers run inside it) and no allocation.
 */
export function sizingSearch(tariff: Tariff, series: IntervalSeries, periods: readonly Period[], opts: SizingOptions): SizingTable {
  const prep = prepareTariff(tariff, series, periods);
  const baseline = evaluatePrepared(prep, undefined, opts.evaluate);
  const textbook = textbookEstimate(prep, opts.targetPf);
  const hours = periods.reduce((s, p) => s + p.hours, 0);
  const annualFactor = hours >= 8700 && hours <= 8800 ? 1 : 8766 / Math.max(hours, 1);
  const baselineAnnual = baseline.total * annualFactor;
  const scratch = new Float64Array(series.length);
  const rows: SizingRow[] = [];
  const kinds = opts.kinds ?? ['fixed', 'switched'];
  const om = (opts.costs.omPctOfCapex ?? 1) / 100;

  const addRow = (kind: 'fixed' | 'switched', kvar: number, steps: number | null, correction: ReactiveCorrection) => {
    const evaluation = evaluatePrepared(prep, correction, { ...opts.evaluate, explain: false });
    const lead = leadingTotals(prep);
    const costs = opts.costs[kind];
    const capex = capexOf({ kvar, costPerKvar: costs.perKvar, fixedCost: costs.fixedCost, detuningPremiumPerKvar: opts.costs.detuningPremiumPerKvar }).total;
    const annualPfCharge = evaluation.total * annualFactor;
    const e = economics({ capex, annualSaving: baselineAnnual - annualPfCharge, omPerYear: capex * om, lifeYears: opts.finance.lifeYears, discountRate: opts.finance.discountRate });
    const row: SizingRow = { kind, kvar, steps, annualPfCharge, annualSaving: e.annualSaving, capex, omPerYear: capex * om, paybackYears: e.paybackYears, npv: e.npv, irr: e.irr, ...lead, bestNpv: false, shortestPayback: false };
    if (opts.transformer) row.screen = screenRow(opts.transformer, kvar, steps);
    rows.push(row);
  };

  for (const kvar of opts.sizesKvar) {
    if (kinds.includes('fixed')) {
      const perInterval = fixedBankKvarhPerInterval(series, { kind: 'fixed', kvar, ratedVoltageV: opts.ratedVoltageV, serviceVoltageV: opts.serviceVoltageV });
      addRow('fixed', kvar, null, { kind: 'constant', kvarh: perInterval });
    }
    if (kinds.includes('switched')) {
      for (const n of opts.stepCounts ?? [6]) {
        const bank = switchedBankSchema.parse({
          kind: 'switched',
          stepsKvar: Array.from({ length: n }, () => kvar / n),
          targetPf: opts.targetPf,
          leadingLimitPf: opts.leadingLimitPf,
          ratedVoltageV: opts.ratedVoltageV,
          serviceVoltageV: opts.serviceVoltageV,
        });
        addRow('switched', kvar, n, switchedBankCorrection(series, bank, scratch));
      }
    }
  }
  const bestNpvIndex = argBest(rows, (r) => r.npv, (a, b) => a > b);
  const shortestPaybackIndex = argBest(rows.map((r) => (Number.isFinite(r.paybackYears) ? r : null)), (r) => r.paybackYears, (a, b) => a < b);
  if (bestNpvIndex !== null) rows[bestNpvIndex].bestNpv = true;
  if (shortestPaybackIndex !== null) rows[shortestPaybackIndex].shortestPayback = true;
  const notes = annualFactor === 1 ? [] : [`The periods cover ${Math.round(hours)} hours; charges were scaled by ${annualFactor.toFixed(3)} to a year.`];
  if (kinds.includes('switched')) notes.push(`Switched banks were simulated on ${series.intervalMinutes}-min averages: switching within an interval is not seen.`);
  return { currency: tariff.currency, baselineAnnualPfCharge: baselineAnnual, annualFactor, rows, bestNpvIndex, shortestPaybackIndex, textbook, notes };
}

function leadingTotals(prep: PreparedTariff): { leadingHours: number; leadingKvarh: number; worstLeadPf: number | null } {
  const { plan } = prep;
  let intervals = 0;
  let kvarh = 0;
  let ratio = -1;
  for (let p = 0; p < plan.periods.length; p++) {
    const o = p * plan.windowCount * FIELD_COUNT;
    intervals += plan.acc[o + Field.leadingIntervals];
    kvarh += plan.acc[o + Field.kvarhLead];
    if (plan.acc[o + Field.leadingIntervals] > 0) ratio = Math.max(ratio, plan.acc[o + Field.maxLeadRatio]);
  }
  return { leadingHours: (intervals * plan.series.intervalMinutes) / 60, leadingKvarh: kvarh, worstLeadPf: ratio >= 0 ? 1 / Math.sqrt(1 + ratio * ratio) : null };
}

function argBest<T>(items: readonly (T | null)[], key: (t: T) => number, better: (a: number, b: number) => boolean): number | null {
  let best: number | null = null;
  items.forEach((item, i) => {
    if (item === null) return;
    if (best === null || better(key(item), key(items[best] as T))) best = i;
  });
  return best;
}

function screenRow(tx: { kva: number; impedancePct: number }, kvar: number, steps: number | null): RowScreen {
  const input = { transformerKva: tx.kva, impedancePct: tx.impedancePct };
  const levels = steps === null ? [screenResonance({ ...input, bankKvar: kvar })] : screenResonanceSteps(input, Array.from({ length: steps }, () => kvar / steps));
  const near = [...new Set(levels.map((l) => l.nearHarmonic).filter((h): h is number => h !== null))].sort((a, b) => a - b);
  return { order: levels[levels.length - 1].order, nearHarmonics: near, voltageRisePct: voltageRise({ bankKvar: kvar, transformerKva: tx.kva, impedancePct: tx.impedancePct }).risePct };
}
