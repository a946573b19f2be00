import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { PlanSpecSchema } from '@/lib/correction-plans/plan-spec';
import { loadSiteInputs } from '@/lib/correction-plans/site-inputs';
import { evaluatePlan } from '@/lib/correction-plans/evaluate-plan';

export const prerender = false;

/** Evaluates an unsaved plan on the site's data and tariff; writes nothing. */
export const POST = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const spec = await readJson(ctx.request, PlanSpecSchema);
  return json({ evaluation: evaluatePlan(await loadSiteInputs(getDb(), workspace.id, site), spec) });
});
