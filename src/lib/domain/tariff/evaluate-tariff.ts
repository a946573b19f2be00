import { expectedIntervals, type Period } from '../periods/period';
import { aggregate, type ReactiveCorrection } from '../power/aggregate-kernel';
import { createAggregationPlan, type AggregationPlan } from '../power/aggregation-plan';
import { readAggregate, type WindowAggregate } from '../power/window-aggregate';
import type { IntervalSeries } from '../series/interval-series';
import type { Issue } from '../result';
import { demandWindowProblem } from '../power/demand-blocks';
import { describeWindow, type TouWindow } from './tou-window';
import type { EnteredAmounts, RuleMemory, RuleOutcome } from './rule-contract';
import { evaluateRule, ruleTypeLabel, type TariffRule } from './rule-registry';
import type { Tariff } from './tariff-schema';
import { historyMemory, type PriorPeriod } from './history';

export interface EvaluateOptions {
  /** Bills before the interval data, oldest first, for ratchets. */
  history?: readonly PriorPeriod[];
  /** Bill amounts per period id, for rules whose base is an entered amount. */
  amounts?: Readonly<Record<string, EnteredAmounts>>;
  /** Format explanations and data-quality warnings (default true); the sizing search turns this off. */
  explain?: boolean;
  /**
   * Ratchet memory of earlier evaluated periods by rule id (from a previous
   * evaluation's `memory`), placed after the entered `history`. Lets a new tariff
   * version keep the ratchet of rules whose id it keeps.
   */
  memory?: Readonly<Record<string, readonly RuleMemory[]>>;
}

/** One rule's result in one period. */
export interface RuleResult extends Omit<RuleOutcome, 'explain'> {
  /** The formula with the numbers filled in ('' when explanations were turned off). */
  explanation: string;
  ruleId: string;
  type: TariffRule['type'];
  /** The rule's own name, else its type label. */
  ruleLabel: string;
  /** The time-of-use window's description, null for all hours. */
  windowLabel: string | null;
}

export interface PeriodCharges {
  periodId: string;
  label: string;
  /** Sum of the rules' amounts (credits negative). */
  total: number;
  rules: RuleResult[];
  /** Data-quality notes that affect these figures. */
  warnings: string[];
}

export interface TariffEvaluation {
  tariffName: string;
  currency: string;
  periods: PeriodCharges[];
  total: number;
  byRule: { ruleId: string; ruleLabel: string; total: number }[];
  /** Ratchet memory by rule id after the last period, to continue in a later evaluation. */
  memory: Record<string, RuleMemory[]>;
}

/** A tariff bound to a series and periods; reusable across correction scenarios. */
export interface PreparedTariff {
  tariff: Tariff;
  plan: AggregationPlan;
  /** Aggregation window index of each rule (0 = all hours). */
  ruleWindow: number[];
  /** Window description of each rule, null for all hours. */
  windowLabels: (string | null)[];
}

/**
 * Problems that stop a tariff from being evaluated on a series (today: a demand window
 * that is not a whole multiple of the meter interval). Check before `evaluateTariff`,
 * which throws a RangeError with the same message.
 */
export function tariffDataProblems(tariff: Tariff, series: Pick<IntervalSeries, 'intervalMinutes'>): Issue[] {
  const problem = demandWindowProblem(tariff.demandWindowMinutes ?? series.intervalMinutes, series.intervalMinutes);
  return problem ? [{ code: 'demand-window-mismatch', message: `${problem} Change the tariff's demand window or load data at a finer interval.` }] : [];
}

/** Binds a parsed tariff to a series and periods: windows, demand readings, peaks. */
export function prepareTariff(tariff: Tariff, series: IntervalSeries, periods: readonly Period[]): PreparedTariff {
  const windows: TouWindow[] = [];
  const keys: string[] = [];
  const ruleWindow = tariff.rules.map((rule) => {
    if (!rule.window) return 0;
    const key = JSON.stringify(rule.window);
    let k = keys.indexOf(key);
    if (k < 0) {
      k = keys.push(key) - 1;
      windows.push(rule.window);
    }
    return k + 1;
  });
  const plan = createAggregationPlan(series, periods, {
    windows,
    holidays: tariff.holidays,
    demandWindowMinutes: tariff.demandWindowMinutes ?? series.intervalMinutes,
    demandMethod: tariff.demandMethod,
  });
  const windowLabels = tariff.rules.map((rule) => (rule.window ? describeWindow(rule.window) : null));
  return { tariff, plan, ruleWindow, windowLabels };
}

/**
 * Evaluates a prepared tariff under a reactive correction (none for the site as
 * metered). Periods run in order so ratchets see earlier periods.
 */
export function evaluatePrepared(prep: PreparedTariff, correction?: ReactiveCorrection, opts: EvaluateOptions = {}): TariffEvaluation {
  const { tariff, plan, ruleWindow } = prep;
  const explain = opts.explain ?? true;
  aggregate(plan, correction);
  // Own entries only: a rule id such as "constructor" or "valueOf" must not find Object.prototype's member.
  const carried = (id: string) => (opts.memory && Object.hasOwn(opts.memory, id) ? opts.memory[id]! : []);
  const memories: RuleMemory[][] = tariff.rules.map((rule) => [...historyMemory(rule, opts.history ?? []), ...carried(rule.id)]);
  const byRule = tariff.rules.map((rule) => ({ ruleId: rule.id, ruleLabel: rule.name ?? ruleTypeLabel(rule.type), total: 0 }));
  let total = 0;
  const periods = plan.periods.map((period, p) => {
    const rules = tariff.rules.map((rule, r) => {
      const agg = readAggregate(plan, p, ruleWindow[r]);
      const outcome = evaluateRule(rule, { agg, period, currency: tariff.currency, memory: memories[r], amounts: opts.amounts?.[period.id] });
      if (outcome.memory) memories[r].push(outcome.memory);
      byRule[r].total += outcome.amount;
      const result: RuleResult = {
        amount: outcome.amount,
        status: outcome.status,
        quantities: outcome.quantities,
        memory: outcome.memory,
        explanation: explain ? outcome.explain() : '',
        ruleId: rule.id,
        type: rule.type,
        ruleLabel: byRule[r].ruleLabel,
        windowLabel: prep.windowLabels[r],
      };
      return result;
    });
    const periodTotal = rules.reduce((s, r) => s + r.amount, 0);
    total += periodTotal;
    return { periodId: period.id, label: period.label, total: periodTotal, rules, warnings: explain ? periodWarnings(period, readAggregate(plan, p, 0), plan.series.intervalMinutes) : [] };
  });
  const memory = Object.fromEntries(tariff.rules.map((rule, r) => [rule.id, memories[r]]));
  return { tariffName: tariff.name, currency: tariff.currency, periods, total, byRule, memory };
}

/** Evaluates a tariff on a series over periods: the PF-related charge per period and rule. */
export function evaluateTariff(tariff: Tariff, series: IntervalSeries, periods: readonly Period[], opts: EvaluateOptions = {}): TariffEvaluation {
  return evaluatePrepared(prepareTariff(tariff, series, periods), undefined, opts);
}

function periodWarnings(period: Period, all: WindowAggregate, intervalMinutes: number): string[] {
  const out: string[] = [];
  const expected = expectedIntervals(period, intervalMinutes);
  const present = all.importIntervals + all.zeroKwIntervals + all.exportIntervals;
  if (present < expected) out.push(`${expected - present} of ${expected} intervals are missing: peaks and totals may be understated.`);
  if (all.reactiveMissingIntervals > 0) out.push(`${all.reactiveMissingIntervals} intervals have no kvarh reading: average PF is overstated.`);
  if (all.exportIntervals > 0) out.push(`${all.exportIntervals} intervals exported power; they are left out of PF figures.`);
  return out;
}
