/**
 * Findings: the engine's metrics and tariff charges per calendar month or billing period,
 * for one meter's series and the site's tariff versions. Pure orchestration of the engine;
 * the endpoint loads the inputs and serialises the result.
 */
import { DateTime } from 'luxon';
import { computeMetrics, type PeriodMetrics } from '../domain/power/period-metrics';
import { monthlyPeriods, spanOf } from '../domain/periods/monthly-periods';
import { billingPeriods, type BillingRange } from '../domain/periods/billing-periods';
import type { Period } from '../domain/periods/period';
import type { RuleResult } from '../domain/tariff/evaluate-tariff';
import { evaluateTariffVersions } from '../domain/tariff/evaluate-versions';
import { tariffDataProblems } from '../domain/tariff/evaluate-tariff';
import { tariffSchema, type Tariff } from '../domain/tariff/tariff-schema';
import type { IntervalSeries } from '../domain/series/interval-series';

export type TariffVersionInput = { id: string; name: string; effectiveFrom: string; definition: unknown };

export type FindingsInput = {
  series: IntervalSeries;
  zone: string;
  tariffs: TariffVersionInput[];
  basis: 'month' | 'billing';
  billRanges?: BillingRange[];
  /** Clip to periods overlapping [fromMs, toMs). */
  fromMs?: number;
  toMs?: number;
};

export type RuleCharge = { ruleId: string; ruleLabel: string; type: string; windowLabel: string | null; amount: number; status: string; quantities: Record<string, number | null>; explanation: string };

export type PeriodFinding = {
  id: string;
  label: string;
  kind: 'month' | 'billing';
  start: string;
  end: string;
  metrics: Omit<PeriodMetrics, 'periodId' | 'label'>;
  tariff: { id: string; name: string; effectiveFrom: string } | null;
  pfCharge: number | null;
  rules: RuleCharge[];
  warnings: string[];
};

export type Findings = {
  basis: 'month' | 'billing';
  zone: string;
  intervalMinutes: number;
  currency: string | null;
  periods: PeriodFinding[];
  totals: { kwh: number; kvarhLag: number; kvarhLead: number; pfCharge: number; byRule: { ruleId: string; ruleLabel: string; total: number }[] };
  notes: string[];
};

const iso = (ms: number, zone: string) => DateTime.fromMillis(ms, { zone }).toISO({ suppressMilliseconds: true }) ?? new Date(ms).toISOString();

function toRuleCharge(r: RuleResult): RuleCharge {
  return { ruleId: r.ruleId, ruleLabel: r.ruleLabel, type: r.type, windowLabel: r.windowLabel, amount: r.amount, status: r.status, quantities: r.quantities, explanation: r.explanation };
}


export type FindingsOutcome = { ok: true; findings: Findings } | { ok: false; status: 400 | 422; message: string };

export function computeFindings(input: FindingsInput): FindingsOutcome {
  const { series, zone } = input;
  const notes: string[] = [];
  const versions = [] as (TariffVersionInput & { parsed: Tariff })[];
  for (const t of input.tariffs) {
    const parsed = tariffSchema.safeParse(t.definition);
    if (!parsed.success) notes.push(`Tariff version "${t.name}" from ${t.effectiveFrom} could not be read and was left out: fix it in the tariff editor.`);
    else {
      // A version saved before coarser data arrived (a 5-minute demand window on 15-minute data) cannot be read on it.
      const misfit = series.length ? tariffDataProblems(parsed.data, series)[0] : undefined;
      if (misfit) notes.push(`Tariff version "${t.name}" from ${t.effectiveFrom} was left out: ${misfit.message}`);
      else versions.push({ ...t, parsed: parsed.data });
    }
  }
  versions.sort((a, b) => a.effectiveFrom.localeCompare(b.effectiveFrom));

  let periods: Period[];
  if (input.basis === 'billing') {
    const r = billingPeriods(input.billRanges ?? [], zone);
    if (!r.ok) return { ok: false, status: 422, message: r.errors.map((e) => e.message).join(' ') };
    periods = r.value;
    notes.push(...r.warnings.map((w) => w.message));
  } else {
    // Months of the asked range when one is given (so months without data show as such), else of the data.
    const data = series.length ? spanOf(series) : { fromMs: 0, toMs: 0 };
    const span = { fromMs: input.fromMs ?? data.fromMs, toMs: input.toMs ?? data.toMs };
    const r = monthlyPeriods(span, zone);
    if (!r.ok) return { ok: false, status: 400, message: r.errors.map((e) => e.message).join(' ') };
    periods = r.value;
  }
  if (input.fromMs !== undefined) periods = periods.filter((p) => p.endMs > input.fromMs!);
  if (input.toMs !== undefined) periods = periods.filter((p) => p.startMs < input.toMs!);
  if (series.length === 0) notes.push('No interval data yet: upload a meter export to see figures.');
  if (versions.length === 0) notes.push('No tariff is entered for this site, so no power-factor charge is computed. Add the tariff’s PF rules on the Tariff page.');

  const demandWindow = versions.at(-1)?.parsed.demandWindowMinutes;
  const metrics = computeMetrics(series, periods, { demandWindowMinutes: demandWindow, demandMethod: versions.at(-1)?.parsed.demandMethod });

  // The engine picks the version in force on each period's first local day and carries ratchet
  // memory across versions for rules that keep their id.
  const ev = versions.length ? evaluateTariffVersions(versions.map((v) => ({ id: v.id, effectiveFrom: v.effectiveFrom, tariff: v.parsed })), series, periods) : null;
  const byVersion = new Map(versions.map((v) => [v.id, v]));
  const charges = new Map<string, { v: (typeof versions)[number]; total: number; rules: RuleCharge[]; warnings: string[] }>();
  for (const pc of ev?.periods ?? []) {
    const v = pc.versionId ? byVersion.get(pc.versionId) : undefined;
    if (v) charges.set(pc.periodId, { v, total: pc.total, rules: pc.rules.map(toRuleCharge), warnings: pc.warnings });
  }
  const byRule = new Map((ev?.byRule ?? []).map((r) => [`${r.ruleId}\u0000${r.ruleLabel}`, r]));

  const out: PeriodFinding[] = periods.map((p, k) => {
    const { periodId: _id, label: _label, ...m } = metrics[k]!;
    const c = charges.get(p.id);
    return {
      id: p.id,
      label: p.label,
      kind: p.kind,
      start: iso(p.startMs, zone),
      end: iso(p.endMs, zone),
      metrics: m,
      tariff: c ? { id: c.v.id, name: c.v.name, effectiveFrom: c.v.effectiveFrom } : null,
      pfCharge: c ? c.total : null,
      rules: c?.rules ?? [],
      warnings: c?.warnings ?? [],
    };
  });
  const currencies = new Set(versions.map((v) => v.parsed.currency));
  if (currencies.size > 1) notes.push('Tariff versions use different currencies; totals add them as entered.');
  return {
    ok: true,
    findings: {
      basis: input.basis,
      zone,
      intervalMinutes: series.intervalMinutes,
      currency: versions.at(-1)?.parsed.currency ?? null,
      periods: out,
      totals: {
        kwh: out.reduce((s, p) => s + p.metrics.kwh, 0),
        kvarhLag: out.reduce((s, p) => s + p.metrics.kvarhLag, 0),
        kvarhLead: out.reduce((s, p) => s + p.metrics.kvarhLead, 0),
        pfCharge: out.reduce((s, p) => s + (p.pfCharge ?? 0), 0),
        byRule: [...byRule.values()],
      },
      notes,
    },
  };
}
