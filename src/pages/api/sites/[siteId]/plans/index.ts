import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { PlanSpecSchema } from '@/lib/correction-plans/plan-spec';
import { listPlans } from '@/lib/correction-plans/plans-store';
import { savePlan } from '@/lib/correction-plans/service';

export const prerender = false;

/** The site's saved correction plans, by name. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  return json({ plans: await listPlans(getDb(), workspace.id, site.id) });
});

/** Saves a plan with the summary of its evaluation. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'plan:create');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const spec = await readJson(ctx.request, PlanSpecSchema);
  return json({ plan: await savePlan(getDb(), workspace.id, user.id, site, spec) }, 201);
});
