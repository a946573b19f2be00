/**
 * The payback table: every saved plan of a workspace with the figures stored in its summary
 * (the evaluation made when it was saved), and totals per currency (never added across currencies).
 */
import { z } from 'zod';
import type { Db } from '../db/client';
import { listWorkspacePlans } from '../correction-plans/plans-store';

const years = z.number().nullable().meta({ description: 'Years; null = not paid back (savings do not cover O&M)' });

export const PaybackRowSchema = z.object({
  siteId: z.string(),
  siteName: z.string(),
  planId: z.string(),
  planName: z.string(),
  type: z.string().meta({ description: 'Fixed bank, Switched bank (n steps), detuned marked' }),
  kind: z.enum(['fixed', 'switched']),
  kvar: z.number().meta({ description: 'kvar' }),
  capex: z.number(),
  annualSaving: z.number().meta({ description: 'per year' }),
  omPerYear: z.number().meta({ description: 'per year' }),
  paybackYears: years,
  npv: z.number(),
  irr: z.number().nullable().meta({ description: 'fraction' }),
  paybackLow: years.meta({ description: 'Payback with savings at 80 %' }),
  npvLow: z.number().meta({ description: 'NPV with savings at 80 %' }),
  paybackHigh: years.meta({ description: 'Payback with savings at 120 %' }),
  npvHigh: z.number().meta({ description: 'NPV with savings at 120 %' }),
  currency: z.string(),
}).meta({ id: 'PaybackRow' });

export const PaybackTableSchema = z.object({
  workspace: z.object({ id: z.string(), name: z.string() }),
  rows: z.array(PaybackRowSchema),
  totals: z.array(z.object({ currency: z.string(), plans: z.number(), kvar: z.number(), capex: z.number(), annualSaving: z.number(), omPerYear: z.number(), npv: z.number() })),
}).meta({ id: 'PaybackTable' });

export type PaybackRow = z.infer<typeof PaybackRowSchema>;
export type PaybackTable = z.infer<typeof PaybackTableSchema>;

export function typeLabel(kind: 'fixed' | 'switched', steps: number | null, detuned: boolean): string {
  const base = kind === 'fixed' ? 'Fixed bank' : `Switched bank (${steps ?? '?'} steps)`;
  return detuned ? `${base}, detuned` : base;
}

export async function paybackTable(db: Db, workspace: { id: string; name: string }): Promise<PaybackTable> {
  const plans = await listWorkspacePlans(db, workspace.id);
  const rows: PaybackRow[] = [];
  for (const p of plans) {
    const s = p.summary;
    if (!s) continue;
    rows.push({
      siteId: p.siteId,
      siteName: p.siteName,
      planId: p.id,
      planName: p.name,
      type: typeLabel(s.kind, s.steps, s.detuned),
      kind: s.kind,
      kvar: s.kvar,
      capex: s.capex,
      annualSaving: s.annualSaving,
      omPerYear: s.omPerYear,
      paybackYears: s.paybackYears,
      npv: s.npv,
      irr: s.irr,
      paybackLow: s.sensitivity.low.paybackYears,
      npvLow: s.sensitivity.low.npv,
      paybackHigh: s.sensitivity.high.paybackYears,
      npvHigh: s.sensitivity.high.npv,
      currency: s.currency,
    });
  }
  const byCurrency = new Map<string, PaybackTable['totals'][number]>();
  for (const r of rows) {
    const t = byCurrency.get(r.currency) ?? { currency: r.currency, plans: 0, kvar: 0, capex: 0, annualSaving: 0, omPerYear: 0, npv: 0 };
    t.plans++;
    t.kvar += r.kvar;
    t.capex += r.capex;
    t.annualSaving += r.annualSaving;
    t.omPerYear += r.omPerYear;
    t.npv += r.npv;
    byCurrency.set(r.currency, t);
  }
  return { workspace: { id: workspace.id, name: workspace.name }, rows, totals: [...byCurrency.values()].sort((a, b) => a.currency.localeCompare(b.currency)) };
}
