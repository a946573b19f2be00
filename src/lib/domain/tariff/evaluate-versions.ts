import { DateTime } from 'luxon';
import type { Period } from '../periods/period';
import type { IntervalSeries } from '../series/interval-series';
import { evaluateTariff, type EvaluateOptions, type PeriodCharges } from './evaluate-tariff';
import type { RuleMemory } from './rule-contract';
import type { Tariff } from './tariff-schema';

/** A stored tariff version: the parsed tariff and the first local date it applies to. */
export interface TariffVersion {
  id: string;
  /** `YYYY-MM-DD`, local date. */
  effectiveFrom: string;
  tariff: Tariff;
}

export interface VersionedPeriodCharges extends PeriodCharges {
  /** The version in force on the period's first local day; null when none was. */
  versionId: string | null;
  currency: string | null;
}

export interface VersionedEvaluation {
  periods: VersionedPeriodCharges[];
  total: number;
  byRule: { ruleId: string; ruleLabel: string; total: number }[];
}

/**
 * Evaluates each period under the version in force on its first local day. Periods
 * under the same version are evaluated together, and ratchet memory passes from one
 * version to the next for rules that keep their id, so a tariff change does not reset
 * a ratchet the utility would keep.
 */
export function evaluateTariffVersions(versions: readonly TariffVersion[], series: IntervalSeries, periods: readonly Period[], opts: Omit<EvaluateOptions, 'memory'> = {}): VersionedEvaluation {
  const sorted = [...versions].sort((a, b) => a.effectiveFrom.localeCompare(b.effectiveFrom));
  const versionOf = (p: Period) => {
    const day = DateTime.fromMillis(p.startMs, { zone: p.zone }).toISODate() ?? '';
    return sorted.filter((v) => v.effectiveFrom <= day).at(-1) ?? null;
  };
  const out: VersionedPeriodCharges[] = [];
  const byRule = new Map<string, { ruleId: string; ruleLabel: string; total: number }>();
  let memory: Record<string, RuleMemory[]> = {};
  let history = opts.history;
  let i = 0;
  while (i < periods.length) {
    const v = versionOf(periods[i]);
    let j = i + 1;
    while (j < periods.length && versionOf(periods[j]) === v) j++;
    const run = periods.slice(i, j);
    if (v === null) {
      run.forEach((p) => out.push({ periodId: p.id, label: p.label, total: 0, rules: [], warnings: ['No tariff version is in force for this period.'], versionId: null, currency: null }));
    } else {
      const e = evaluateTariff(v.tariff, series, run, { ...opts, history, memory });
      e.periods.forEach((pc) => out.push({ ...pc, versionId: v.id, currency: v.tariff.currency }));
      e.byRule.forEach((r) => {
        const key = `${r.ruleId}\u0000${r.ruleLabel}`;
        const acc = byRule.get(key) ?? { ruleId: r.ruleId, ruleLabel: r.ruleLabel, total: 0 };
        acc.total += r.total;
        byRule.set(key, acc);
      });
      // Entered history is already inside the carried memory from here on.
      memory = { ...memory, ...e.memory };
      history = undefined;
    }
    i = j;
  }
  return { periods: out, total: out.reduce((s, p) => s + p.total, 0), byRule: [...byRule.values()] };
}
