import { z } from 'zod';
import { endpoint, readJson, readParams } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { deleteRecorded } from '@/lib/db/audit-log';
import { PlanSpecSchema } from '@/lib/correction-plans/plan-spec';
import { deletePlan, getPlan } from '@/lib/correction-plans/plans-store';
import { replacePlan } from '@/lib/correction-plans/service';

export const prerender = false;
const Params = z.object({ planId: z.string().min(1).max(64) });

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { planId } = readParams(ctx.params, Params);
  const plan = await getPlan(getDb(), workspace.id, site.id, planId);
  if (!plan) throw notFound('Plan');
  return json({ plan });
});

/** Replaces a plan (rename included); the summary is recomputed. */
export const PUT = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'plan:create');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { planId } = readParams(ctx.params, Params);
  const spec = await readJson(ctx.request, PlanSpecSchema);
  return json({ plan: await replacePlan(getDb(), workspace.id, user.id, site, planId, spec) });
});

export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'plan:create');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { planId } = readParams(ctx.params, Params);
  const db = getDb();
  const existing = await getPlan(db, workspace.id, site.id, planId);
  if (!existing) throw notFound('Plan');
  const deleted = await deleteRecorded(db, workspace.id, user.id, (tx) => deletePlan(tx, workspace.id, site.id, planId), { action: 'plan.deleted', subjectType: 'correction_plan', subjectId: planId, detail: { siteId: site.id, name: existing.name } });
  if (!deleted) throw notFound('Plan');
  return new Response(null, { status: 204 });
});
