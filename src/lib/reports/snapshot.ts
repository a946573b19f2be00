/**
 * The frozen content of a Savings report: everything it shows is computed once, at issue, and
 * stored, so the report reads the same later even if data, tariff or plan change.
 */
import type { Db } from '../db/client';
import type { SiteDto } from '../schemas/site';
import { siteFindings } from '../findings/load';
import { siteReconciliation } from '../bills/service';
import { loadSiteInputs } from '../correction-plans/site-inputs';
import { evaluatePlan, type PlanEvaluation } from '../correction-plans/evaluate-plan';
import type { PlanDto } from '../correction-plans/plans-store';
import { PlanSpecSchema } from '../correction-plans/plan-spec';
import { CAUTIONS } from '../domain/correction/cautions';
import { METHOD_NOTES } from './method-notes';

export type ReportSnapshot = {
  version: 1;
  title: string;
  issuedAt: string;
  issuedBy: { name: string; email: string };
  workspaceName: string;
  site: Pick<SiteDto, 'id' | 'name' | 'address' | 'utility' | 'accountNumber' | 'timeZone' | 'serviceVoltageV' | 'transformerKva' | 'transformerImpedancePct' | 'currency'>;
  currency: string;
  findings: {
    tariffName: string | null;
    months: { id: string; label: string; kwh: number; kvarhLag: number; pfAvg: number | null; peakKw: number; peakPf: number | null; pfCharge: number | null; completeness: number; rules: { label: string; amount: number; explanation: string }[] }[];
    totalPfCharge: number;
    notes: string[];
  };
  reconciliation: { bills: number; compared: number; flagged: number; disputable: number; multiplier: string | null; rows: { period: string; billedCharge: number | null; computedCharge: number | null; flagged: boolean; note: string | null }[] };
  plan: { id: string; name: string; evaluation: Omit<PlanEvaluation, 'cautions'> };
  cautions: { title: string; text: string }[];
  methodNotes: typeof METHOD_NOTES;
};

export async function buildSnapshot(db: Db, organizationId: string, ctx: { site: SiteDto; plan: PlanDto; workspaceName: string; issuedBy: { name: string; email: string }; title: string; now?: Date }): Promise<ReportSnapshot> {
  const { site, plan } = ctx;
  const [f, rec, inputs] = await Promise.all([siteFindings(db, organizationId, site, { basis: 'month' }), siteReconciliation(db, organizationId, site), loadSiteInputs(db, organizationId, site)]);
  const months = f.periods.filter((p) => p.metrics.presentIntervals > 0).slice(-12);
  const { cautions: _c, ...evaluation } = evaluatePlan(inputs, PlanSpecSchema.parse(plan.spec));
  return {
    version: 1,
    title: ctx.title,
    issuedAt: (ctx.now ?? new Date()).toISOString(),
    issuedBy: ctx.issuedBy,
    workspaceName: ctx.workspaceName,
    site: { id: site.id, name: site.name, address: site.address, utility: site.utility, accountNumber: site.accountNumber, timeZone: site.timeZone, serviceVoltageV: site.serviceVoltageV, transformerKva: site.transformerKva, transformerImpedancePct: site.transformerImpedancePct, currency: site.currency },
    currency: f.currency ?? site.currency,
    findings: {
      tariffName: months.at(-1)?.tariff?.name ?? null,
      months: months.map((m) => ({ id: m.id, label: m.label, kwh: m.metrics.kwh, kvarhLag: m.metrics.kvarhLag, pfAvg: m.metrics.pfAvgLagging, peakKw: m.metrics.peakKw, peakPf: m.metrics.peakPf, pfCharge: m.pfCharge, completeness: m.metrics.completeness, rules: m.rules.map((r) => ({ label: r.ruleLabel, amount: r.amount, explanation: r.explanation })) })),
      totalPfCharge: months.reduce((s, m) => s + (m.pfCharge ?? 0), 0),
      notes: f.notes,
    },
    reconciliation: {
      bills: rec.bills.length,
      compared: rec.bills.filter((b) => b.compared).length,
      flagged: rec.bills.filter((b) => b.pfCharge.flagged || b.kwh.flagged || b.pf.flagged || b.demand.flagged).length,
      disputable: rec.disputable,
      multiplier: rec.multiplier.message,
      rows: rec.bills.map((b) => ({ period: `${b.periodStart} to ${b.periodEnd}`, billedCharge: b.pfCharge.billed, computedCharge: b.pfCharge.computed, flagged: b.pfCharge.flagged, note: b.notes[0] ?? null })),
    },
    plan: { id: plan.id, name: plan.name, evaluation },
    cautions: CAUTIONS.map((c) => ({ title: c.title, text: c.text })),
    methodNotes: METHOD_NOTES,
  };
}
