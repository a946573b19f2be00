/**
 * Interval-level views for the Findings charts: a sample of (kW, kvar) points for the Quadrant
 * cloud (every interval when few, an even stride otherwise), the PF duration curve (interval PF
 * sorted, on all importing intervals), and the same cloud after a proposed bank when asked.
 */
import { z } from 'zod';
import type { IntervalSeries } from '../domain/series/interval-series';
import { simulateFixedBank, simulateSwitchedBank } from '../domain/correction/simulate-bank';
import { equalSteps } from '../domain/correction/bank-spec';
import type { Period } from '../domain/periods/period';

export type CloudPoint = [kw: number, kvar: number];
export type IntervalViews = { intervalMinutes: number; intervals: number; sampled: number; cloud: CloudPoint[]; exportPoints: number; duration: { share: number; pf: number; sense: 'lag' | 'lead' }[]; after?: { cloud: CloudPoint[]; duration: IntervalViews['duration']; leadingHours: number } };

const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

function cloudOf(s: IntervalSeries, maxPoints: number): { cloud: CloudPoint[]; exportPoints: number } {
  const toDemand = 60 / s.intervalMinutes;
  const stride = Math.max(1, Math.ceil(s.length / maxPoints));
  const cloud: CloudPoint[] = [];
  let exportPoints = 0;
  for (let i = 0; i < s.length; i += stride) {
    const kw = s.kwh[i]! * toDemand;
    if (kw < 0) exportPoints++;
    cloud.push([round(kw), round((s.kvarhLag[i]! - s.kvarhLead[i]!) * toDemand)]);
  }
  return { cloud, exportPoints };
}

/** Interval PF sorted from worst to best, as 201 points (0 %, 0.5 %, ... 100 % of importing time). */
function durationOf(s: IntervalSeries): IntervalViews['duration'] {
  const signed: number[] = [];
  for (let i = 0; i < s.length; i++) {
    const p = s.kwh[i]!;
    if (p <= 0) continue;
    const q = s.kvarhLag[i]! - s.kvarhLead[i]!;
    const pf = p / Math.hypot(p, q);
    // Leading intervals sort after all lagging ones, worst leading last.
    signed.push(q >= 0 ? pf : 2 - pf);
  }
  signed.sort((a, b) => a - b);
  if (signed.length === 0) return [];
  const out: IntervalViews['duration'] = [];
  for (let k = 0; k <= 200; k++) {
    const v = signed[Math.min(signed.length - 1, Math.floor((k / 200) * (signed.length - 1)))]!;
    out.push({ share: k / 200, pf: round(v > 1 ? 2 - v : v, 4), sense: v > 1 ? 'lead' : 'lag' });
  }
  return out;
}

export type ProposedBank = { kind: 'fixed'; kvar: number } | { kind: 'switched'; kvar: number; steps: number; targetPf: number };

export function intervalViews(series: IntervalSeries, periods: readonly Period[], opts: { maxPoints?: number; bank?: ProposedBank } = {}): IntervalViews {
  const max = opts.maxPoints ?? 6000;
  const { cloud, exportPoints } = cloudOf(series, max);
  const views: IntervalViews = { intervalMinutes: series.intervalMinutes, intervals: series.length, sampled: cloud.length, cloud, exportPoints, duration: durationOf(series) };
  if (opts.bank && series.length) {
    const sim = opts.bank.kind === 'fixed' ? simulateFixedBank(series, { kvar: opts.bank.kvar }, periods) : simulateSwitchedBank(series, { stepsKvar: equalSteps(opts.bank.kvar, opts.bank.steps), targetPf: opts.bank.targetPf }, periods);
    views.after = { cloud: cloudOf(sim.series, max).cloud, duration: durationOf(sim.series), leadingHours: sim.summary.leadingHours };
  }
  return views;
}

/** Query of GET /api/sites/{siteId}/intervals. */
export const IntervalViewsQuery = z.strictObject({
  from: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-01-31.').optional(),
  to: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-01-31.').optional(),
  maxPoints: z.coerce.number().int().min(100).max(50_000).default(6000),
  bankKind: z.enum(['fixed', 'switched']).optional().meta({ description: 'Overlay the cloud after a proposed bank' }),
  bankKvar: z.coerce.number().positive().max(100_000).optional().meta({ description: 'Proposed bank size, kvar' }),
  steps: z.coerce.number().int().min(1).max(32).default(6),
  targetPf: z.coerce.number().gt(0).max(1).default(0.95),
});

