/**
 * Tariff preview: what a draft tariff version would have charged over the site's last
 * twelve months of meter data, beside what the saved versions charge. Reads only.
 */
import { and, eq, sql } from 'drizzle-orm';
import { DateTime } from 'luxon';
import type { Db } from '../db/client';
import { intervalBlock } from '../db/schema';
import { listMeters, readSeries } from '../db/intervals';
import { listTariffs } from '../db/tariffs';
import { DAY_MS } from '../db/interval-blocks';
import { computeFindings, type Findings, type TariffVersionInput } from '../findings/compute';
import { ApiError, notFound } from '../api/errors';
import type { SiteDto } from '../schemas/site';
import type { TariffVersion } from '../schemas/tariff';
import { demandWindowMisfit } from './data-fit';

export type PreviewMonth = {
  id: string;
  label: string;
  start: string;
  end: string;
  /** Share of the month's intervals present, 0..1. */
  completeness: number;
  pfCharge: number;
  savedPfCharge: number | null;
  rules: { ruleId: string; ruleLabel: string; amount: number; status: string }[];
};

export type TariffPreview = {
  hasData: boolean;
  currency: string;
  zone: string;
  meter: { id: string; name: string } | null;
  months: PreviewMonth[];
  total: number;
  byRule: { ruleId: string; ruleLabel: string; total: number }[];
  /** The saved tariff over the same months: one version when `compareTo` is given, else the versions as in force. */
  saved: { label: string; currency: string | null; total: number } | null;
  notes: string[];
};

const MONTHS = 12;

/** First and last interval start of a meter, from its first and last stored day. */
async function dataSpan(db: Db, organizationId: string, m: Parameters<typeof readSeries>[2]): Promise<{ firstMs: number; lastMs: number } | null> {
  const [row] = await db
    .select({ first: sql<number | null>`min(${intervalBlock.day})`, last: sql<number | null>`max(${intervalBlock.day})` })
    .from(intervalBlock)
    .where(and(eq(intervalBlock.organizationId, organizationId), eq(intervalBlock.meterId, m.id)));
  if (!row || row.first === null || row.last === null) return null;
  const firstDay = await readSeries(db, organizationId, m, row.first * DAY_MS, (row.first + 1) * DAY_MS);
  const lastDay = await readSeries(db, organizationId, m, row.last * DAY_MS, (row.last + 1) * DAY_MS);
  if (!firstDay.length || !lastDay.length) return null;
  return { firstMs: firstDay.startMs[0]!, lastMs: lastDay.startMs[lastDay.length - 1]! };
}

/** The calendar months (site zone) of the last twelve months that hold data: [fromMs, toMs). */
export function previewRange(firstMs: number, lastMs: number, zone: string): { fromMs: number; toMs: number } {
  const to = DateTime.fromMillis(lastMs, { zone }).startOf('month').plus({ months: 1 });
  const earliest = to.minus({ months: MONTHS });
  const first = DateTime.fromMillis(firstMs, { zone }).startOf('month');
  return { fromMs: Math.max(earliest.toMillis(), first.toMillis()), toMs: to.toMillis() };
}

function run(series: Awaited<ReturnType<typeof readSeries>>, zone: string, tariffs: TariffVersionInput[], fromMs: number, toMs: number): Findings {
  const r = computeFindings({ series, zone, tariffs, basis: 'month', fromMs, toMs });
  if (!r.ok) throw new ApiError(r.status, 'cannot_compute', r.message);
  return r.findings;
}

/**
 * Evaluates `draft` as if in force over the whole range (its own start date is ignored, so a
 * future version can be judged on past data). `compareTo` picks one saved version to set beside it.
 */
export async function previewTariff(db: Db, organizationId: string, site: SiteDto, draft: TariffVersion, compareTo?: string): Promise<TariffPreview> {
  const saved = await listTariffs(db, organizationId, site.id);
  let comparison = saved;
  let savedLabel = 'the saved versions, each month under the one in force';
  if (compareTo) {
    const one = saved.find((t) => t.id === compareTo);
    if (!one) throw notFound('Tariff');
    comparison = [{ ...one, effectiveFrom: '0000-01-01' }];
    savedLabel = `the saved version “${one.name}” (from ${one.effectiveFrom}) over every month`;
  }
  const zone = site.timeZone;
  const empty: TariffPreview = { hasData: false, currency: draft.currency, zone, meter: null, months: [], total: 0, byRule: [], saved: null, notes: [] };
  const meter = (await listMeters(db, organizationId, site.id))[0];
  if (!meter) return { ...empty, notes: ['No meter data yet: upload a meter export to preview charges.'] };
  const span = await dataSpan(db, organizationId, meter);
  if (!span) return { ...empty, meter: { id: meter.id, name: meter.name }, notes: ['No meter data yet: upload a meter export to preview charges.'] };

  const { fromMs, toMs } = previewRange(span.firstMs, span.lastMs, zone);
  const series = await readSeries(db, organizationId, meter, fromMs, toMs);
  // The engine cannot read a demand window that is not made of whole meter intervals (it throws).
  const misfit = demandWindowMisfit(draft, series.intervalMinutes);
  if (misfit) throw new ApiError(400, 'invalid_input', `demandWindowMinutes: ${misfit}`, { demandWindowMinutes: misfit });
  const unfit = comparison.filter((t) => demandWindowMisfit(t.definition, series.intervalMinutes));
  comparison = comparison.filter((t) => !unfit.includes(t));
  const draftRun = run(series, zone, [{ id: 'draft', name: draft.name, effectiveFrom: '0000-01-01', definition: draft }], fromMs, toMs);
  const savedRun = comparison.length ? run(series, zone, comparison.map((t) => ({ id: t.id, name: t.name, effectiveFrom: t.effectiveFrom, definition: t.definition })), fromMs, toMs) : null;
  const savedById = new Map(savedRun?.periods.map((p) => [p.id, p.pfCharge]) ?? []);

  const months: PreviewMonth[] = draftRun.periods.map((p) => ({
    id: p.id,
    label: p.label,
    start: p.start,
    end: p.end,
    completeness: p.metrics.completeness,
    pfCharge: p.pfCharge ?? 0,
    savedPfCharge: savedRun ? (savedById.get(p.id) ?? null) : null,
    rules: p.rules.map((r) => ({ ruleId: r.ruleId, ruleLabel: r.ruleLabel, amount: r.amount, status: r.status })),
  }));
  const notes = draftRun.notes.filter((n) => !n.startsWith('No tariff'));
  for (const t of unfit) notes.push(`The saved version “${t.name}” (from ${t.effectiveFrom}) is left out of the comparison: ${demandWindowMisfit(t.definition, series.intervalMinutes)}`);
  if (months.some((m) => m.completeness < 0.98)) notes.push('Some months are not complete in the meter data; their charges cover only the intervals present.');
  if (savedRun && savedRun.currency && savedRun.currency !== draft.currency) notes.push(`The saved tariff is in ${savedRun.currency} and this draft in ${draft.currency}: the change adds them as entered.`);
  const needsInput = new Set(months.flatMap((m) => m.rules.filter((r) => r.status === 'needs-input').map((r) => r.ruleLabel)));
  for (const label of needsInput) notes.push(`${label} takes its base from amounts on the bills, so the preview counts it as zero.`);
  if (draft.rules.some((r) => 'ratchet' in r && r.ratchet)) notes.push('Ratchets look back only over the months shown here.');
  return {
    hasData: true,
    currency: draft.currency,
    zone,
    meter: { id: meter.id, name: meter.name },
    months,
    total: draftRun.totals.pfCharge,
    byRule: draftRun.totals.byRule,
    saved: savedRun ? { label: savedLabel, currency: savedRun.currency, total: savedRun.totals.pfCharge } : null,
    notes,
  };
}
