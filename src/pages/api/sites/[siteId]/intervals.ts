import { DateTime } from 'luxon';
import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { listMeters, readSeries } from '@/lib/db/intervals';
import { monthlyPeriods, spanOf } from '@/lib/domain/periods/monthly-periods';
import { IntervalViewsQuery, intervalViews } from '@/lib/findings/interval-views';
import { isCalendarDate } from '@/lib/domain/tariff/tariff-schema';

// A date that matches YYYY-MM-DD but names no day (2025-02-30) would reach the database as NaN.
const realDate = IntervalViewsQuery.shape.from.unwrap().refine(isCalendarDate, 'This is not a real calendar date.').optional();
const Query = IntervalViewsQuery.safeExtend({ from: realDate, to: realDate });

export const prerender = false;

/** The Quadrant cloud (sampled kW, kvar points), the PF duration curve, and both after a proposed bank. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const q = readParams(Object.fromEntries(ctx.url.searchParams), Query);
  const db = getDb();
  const m = (await listMeters(db, workspace.id, site.id))[0];
  if (!m) return json({ intervalMinutes: null, intervals: 0, sampled: 0, cloud: [], exportPoints: 0, duration: [] });
  const zone = site.timeZone;
  const fromMs = q.from ? DateTime.fromISO(q.from, { zone }).toMillis() : 0;
  const toMs = q.to ? DateTime.fromISO(q.to, { zone }).plus({ days: 1 }).toMillis() : 8.64e15;
  const series = await readSeries(db, workspace.id, m, fromMs, toMs);
  const months = series.length ? monthlyPeriods(spanOf(series), zone) : null;
  const periods = months?.ok ? months.value : [];
  const bank = q.bankKind && q.bankKvar ? (q.bankKind === 'fixed' ? { kind: 'fixed' as const, kvar: q.bankKvar } : { kind: 'switched' as const, kvar: q.bankKvar, steps: q.steps, targetPf: q.targetPf }) : undefined;
  return json(intervalViews(series, periods, { maxPoints: q.maxPoints, bank }));
});
