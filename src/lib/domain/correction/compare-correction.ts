import type { Period } from '../periods/period';
import type { IntervalSeries } from '../series/interval-series';
import { evaluateTariff, type EvaluateOptions, type TariffEvaluation } from '../tariff/evaluate-tariff';
import type { Tariff } from '../tariff/tariff-schema';
import type { FixedBank, SwitchedBankInput } from './bank-spec';
import { simulateFixedBank, simulateSwitchedBank, type BankSimulation } from './simulate-bank';

export type BankPlan = FixedBank | SwitchedBankInput;

export interface PeriodSaving {
  periodId: string;
  label: string;
  before: number;
  after: number;
  saving: number;
  /** Per rule: charge before and after in this period. */
  rules: { ruleId: string; ruleLabel: string; before: number; after: number }[];
}

export interface CorrectionComparison {
  simulation: BankSimulation;
  before: TariffEvaluation;
  after: TariffEvaluation;
  periods: PeriodSaving[];
  /** Total saving over the periods (not annualised). */
  saving: number;
}

/**
 * The site's PF charges with and without a bank, period by period and rule by rule:
 * two evaluations of the same tariff, on the metered and on the corrected series.
 */
export function compareCorrection(tariff: Tariff, series: IntervalSeries, periods: readonly Period[], plan: BankPlan, opts: EvaluateOptions = {}): CorrectionComparison {
  const simulation = plan.kind === 'fixed' ? simulateFixedBank(series, plan, periods) : simulateSwitchedBank(series, plan, periods);
  const before = evaluateTariff(tariff, series, periods, opts);
  const after = evaluateTariff(tariff, simulation.series, periods, opts);
  const rows = before.periods.map((b, k) => {
    const a = after.periods[k];
    return {
      periodId: b.periodId,
      label: b.label,
      before: b.total,
      after: a.total,
      saving: b.total - a.total,
      rules: b.rules.map((r, j) => ({ ruleId: r.ruleId, ruleLabel: r.ruleLabel, before: r.amount, after: a.rules[j].amount })),
    };
  });
  return { simulation, before, after, periods: rows, saving: before.total - after.total };
}
