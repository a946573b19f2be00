/**
 * The Portfolio row of each site: last twelve months of PF cost, the worst month's average PF
 * against the tariff's threshold, data coverage, the best saved plan's payback and the audit state.
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { correctionPlan } from '../db/schema';
import { listSites } from '../db/sites';
import { listTariffs } from '../db/tariffs';
import { siteFindings } from '../findings/load';
import type { SiteDto } from '../schemas/site';
import type { PeriodFinding } from '../findings/compute';
import { tariffThreshold } from './threshold';

export { tariffThreshold };

export type PortfolioRow = {
  site: Pick<SiteDto, 'id' | 'name' | 'utility' | 'timeZone' | 'currency' | 'auditState'>;
  currency: string;
  months: number;
  annualPfCost: number | null;
  annualised: boolean;
  worstMonth: { id: string; label: string; pf: number | null } | null;
  thresholdPf: number;
  coverage: number | null;
  dataFrom: string | null;
  dataTo: string | null;
  bestPlan: { id: string; name: string; paybackYears: number | null } | null;
  tariffName: string | null;
};

function lastTwelve(periods: PeriodFinding[]) {
  const withData = periods.filter((p) => p.metrics.presentIntervals > 0);
  return withData.slice(-12);
}

export async function portfolioRow(db: Db, organizationId: string, site: SiteDto): Promise<PortfolioRow> {
  const [f, tariffs, plans] = await Promise.all([
    siteFindings(db, organizationId, site, { basis: 'month' }),
    listTariffs(db, organizationId, site.id),
    db.select().from(correctionPlan).where(and(eq(correctionPlan.organizationId, organizationId), eq(correctionPlan.siteId, site.id))),
  ]);
  const months = lastTwelve(f.periods);
  const expected = months.reduce((s, p) => s + p.metrics.expectedIntervals, 0);
  const present = months.reduce((s, p) => s + p.metrics.presentIntervals, 0);
  let worst: PeriodFinding | null = null;
  for (const p of months) if (p.metrics.pfAvgLagging !== null && (worst === null || p.metrics.pfAvgLagging < worst.metrics.pfAvgLagging!)) worst = p;
  const hasCharges = months.some((p) => p.pfCharge !== null);
  let best: PortfolioRow['bestPlan'] = null;
  for (const pl of plans) {
    const pb = (pl.summary as { paybackYears?: number | null } | null)?.paybackYears;
    const years = typeof pb === 'number' && Number.isFinite(pb) ? pb : null;
    if (!best || (years !== null && (best.paybackYears === null || years < best.paybackYears))) best = { id: pl.id, name: pl.name, paybackYears: years };
  }
  const current = tariffs.at(-1);
  return {
    site: { id: site.id, name: site.name, utility: site.utility, timeZone: site.timeZone, currency: site.currency, auditState: site.auditState },
    currency: f.currency ?? site.currency,
    months: months.length,
    // Fewer than twelve months of data are scaled to a year, and the row says so (`annualised`).
    annualPfCost: hasCharges ? (months.reduce((s, p) => s + (p.pfCharge ?? 0), 0) * 12) / months.length : null,
    annualised: hasCharges && months.length < 12,
    worstMonth: worst ? { id: worst.id, label: worst.label, pf: worst.metrics.pfAvgLagging } : null,
    thresholdPf: current ? tariffThreshold(current.definition) : 0.9,
    coverage: expected > 0 ? present / expected : null,
    dataFrom: months[0]?.start ?? null,
    dataTo: months.at(-1)?.end ?? null,
    bestPlan: best,
    tariffName: current?.name ?? null,
  };
}

export async function portfolio(db: Db, organizationId: string): Promise<PortfolioRow[]> {
  const sites = await listSites(db, organizationId);
  return Promise.all(sites.map((s) => portfolioRow(db, organizationId, s)));
}
