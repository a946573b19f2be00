import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { siteReconciliation } from '@/lib/bills/service';

export const prerender = false;

/** Each bill against the same billing period recomputed from the interval data and the tariff. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  return json(await siteReconciliation(getDb(), workspace.id, site));
});
