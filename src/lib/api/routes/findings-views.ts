import { z } from 'zod';
import { siteParams, type RouteDoc } from '../route-doc';
import { IntervalViewsQuery } from '../../findings/interval-views';

const Point = z.tuple([z.number().meta({ description: 'kW' }), z.number().meta({ description: 'kvar, negative is leading' })]);
const Duration = z.array(z.object({ share: z.number().meta({ description: 'share of importing time, 0..1' }), pf: z.number(), sense: z.enum(['lag', 'lead']) }));

export const FINDINGS_VIEW_ROUTES: RouteDoc[] = [
  {
    method: 'get',
    path: '/api/sites/{siteId}/intervals',
    summary: 'Quadrant cloud points (kW, kvar), PF duration curve, and both after a proposed bank',
    tag: 'Findings',
    permission: 'site:view',
    params: siteParams,
    query: IntervalViewsQuery,
    ok: { status: 200, schema: z.object({ intervalMinutes: z.number().nullable(), intervals: z.number(), sampled: z.number(), cloud: z.array(Point), exportPoints: z.number(), duration: Duration, after: z.object({ cloud: z.array(Point), duration: Duration, leadingHours: z.number() }).optional() }), description: 'Interval views' },
    errors: [400, 401, 404],
  },
];
