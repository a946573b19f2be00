/** The headline figures stored with a saved plan and read by the payback table. */
import { z } from 'zod';
import type { PlanEvaluation } from './evaluate-plan';

const money = (d: string) => z.number().meta({ description: d });
const years = z.number().nullable().meta({ description: 'Simple payback, years; null when the savings do not cover O&M (not paid back)' });

export const PlanSummarySchema = z
  .object({
    kind: z.enum(['fixed', 'switched']),
    kvar: z.number().meta({ description: 'Total rated kvar' }),
    steps: z.number().nullable().meta({ description: 'Steps of a Switched bank, null for a Fixed bank' }),
    detuned: z.boolean(),
    currency: z.string(),
    capex: money('Capex, plan currency'),
    annualSaving: money('PF charges avoided per year'),
    omPerYear: money('O&M per year'),
    paybackYears: years,
    npv: money('NPV over the life'),
    irr: z.number().nullable().meta({ description: 'IRR as a fraction; null when none exists' }),
    leadingHours: z.number().meta({ description: 'Hours at leading PF after correction, h' }),
    lifeYears: z.number(),
    discountRate: z.number(),
    sensitivity: z.object({
      low: z.object({ savingsFactor: z.number(), paybackYears: years, npv: z.number() }),
      high: z.object({ savingsFactor: z.number(), paybackYears: years, npv: z.number() }),
    }).meta({ description: 'Payback and NPV with the savings at 80 % and 120 %' }),
    evaluatedAt: z.string(),
  })
  .meta({ id: 'PlanSummary' });

export type PlanSummary = z.infer<typeof PlanSummarySchema>;

export function summaryOf(ev: PlanEvaluation, now = new Date()): PlanSummary {
  const e = ev.economics;
  const at = (f: number) => e.sensitivity.find((s) => s.savingsFactor === f)!;
  const lo = at(0.8);
  const hi = at(1.2);
  return {
    kind: ev.plan.kind,
    kvar: ev.plan.kvar,
    steps: ev.plan.stepsKvar?.length ?? null,
    detuned: ev.plan.detunedReactorPct !== null,
    currency: ev.currency,
    capex: e.capex,
    annualSaving: e.annualSaving,
    omPerYear: e.omPerYear,
    paybackYears: e.paybackYears,
    npv: e.npv,
    irr: e.irr,
    leadingHours: ev.leading.hours,
    lifeYears: e.lifeYears,
    discountRate: e.discountRate,
    sensitivity: { low: { savingsFactor: 0.8, paybackYears: lo.paybackYears, npv: lo.npv }, high: { savingsFactor: 1.2, paybackYears: hi.paybackYears, npv: hi.npv } },
    evaluatedAt: now.toISOString(),
  };
}
