import { z } from 'zod';
import type { RouteDoc } from '../route-doc';

const Row = z
  .object({
    site: z.object({ id: z.string(), name: z.string(), utility: z.string(), timeZone: z.string(), currency: z.string(), auditState: z.string() }),
    currency: z.string(),
    months: z.number().meta({ description: 'Months with data among the last twelve' }),
    annualPfCost: z.number().nullable().meta({ description: 'PF-related charges over the last 12 months with data, currency; null without a tariff' }),
    annualised: z.boolean().meta({ description: 'true when fewer than 12 months were scaled to a year' }),
    worstMonth: z.object({ id: z.string(), label: z.string(), pf: z.number().nullable() }).nullable().meta({ description: 'Month with the lowest average PF (lagging kvarh basis)' }),
    thresholdPf: z.number().meta({ description: 'PF the tariff judges against (first rule’s target), 0.90 without one' }),
    coverage: z.number().nullable().meta({ description: 'Intervals present / expected over those months, 0..1' }),
    dataFrom: z.string().nullable(),
    dataTo: z.string().nullable(),
    bestPlan: z.object({ id: z.string(), name: z.string(), paybackYears: z.number().nullable() }).nullable().meta({ description: 'Saved plan with the shortest payback, years' }),
    tariffName: z.string().nullable(),
  })
  .meta({ id: 'PortfolioRow' });

export const PORTFOLIO_ROUTES: RouteDoc[] = [
  { method: 'get', path: '/api/portfolio', summary: 'The Portfolio: one row per site with PF cost, worst-month PF, coverage, best plan and audit state', tag: 'Portfolio', permission: 'site:view', ok: { status: 200, schema: z.object({ rows: z.array(Row) }), description: 'Rows' }, errors: [401] },
];
