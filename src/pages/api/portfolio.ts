import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { portfolio } from '@/lib/portfolio/summary';

export const prerender = false;

/** One row per site: last 12 months of PF cost, worst month's PF, coverage, best plan, audit state. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  return json({ rows: await portfolio(getDb(), workspace.id) });
});
