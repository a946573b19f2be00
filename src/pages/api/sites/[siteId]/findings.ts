import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { siteFindings } from '@/lib/findings/load';
import { FindingsQuerySchema } from '@/lib/schemas/findings';

export const prerender = false;

/** Per month or billing period: the engine's metrics and each tariff rule's charge with its explanation. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const q = readParams(Object.fromEntries(ctx.url.searchParams), FindingsQuerySchema);
  return json(await siteFindings(getDb(), workspace.id, site, q));
});
