import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { SizingQuerySchema } from '@/lib/correction-plans/plan-spec';
import { loadSiteInputs } from '@/lib/correction-plans/site-inputs';
import { runSizing } from '@/lib/correction-plans/sizing';

export const prerender = false;

/** Fixed and Switched banks over a range of sizes on the site's data, best NPV and shortest payback marked. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const q = readParams(Object.fromEntries(ctx.url.searchParams), SizingQuerySchema);
  return json({ sizing: runSizing(await loadSiteInputs(getDb(), workspace.id, site), q) });
});
