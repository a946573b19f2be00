/** Saving a plan: evaluate it on the site's data, store the spec with the summary, record the event. */
import type { Db } from '../db/client';
import { ApiError, notFound } from '../api/errors';
import { atomically, recordEvent } from '../db/audit-log';
import type { SiteDto } from '../schemas/site';
import { evaluatePlan } from './evaluate-plan';
import type { PlanSpec } from './plan-spec';
import { createPlan, findPlanByName, getPlan, updatePlan, type PlanDto } from './plans-store';
import { loadSiteInputs } from './site-inputs';
import { summaryOf } from './summary';

const nameTaken = (name: string) => new ApiError(409, 'duplicate_name', `A plan named “${name}” already exists on this site. Choose another name or open that plan.`, { name: 'Already used on this site.' });

export async function savePlan(db: Db, organizationId: string, userId: string, site: SiteDto, spec: PlanSpec): Promise<PlanDto> {
  if (await findPlanByName(db, organizationId, site.id, spec.name)) throw nameTaken(spec.name);
  const summary = summaryOf(evaluatePlan(await loadSiteInputs(db, organizationId, site), spec));
  return atomically(db, async (tx) => {
    const plan = await createPlan(tx, organizationId, site.id, spec, summary, userId);
    await recordEvent(tx, organizationId, userId, { action: 'plan.created', subjectType: 'correction_plan', subjectId: plan.id, detail: { siteId: site.id, name: spec.name, kind: summary.kind, kvar: summary.kvar } });
    return plan;
  });
}

export async function replacePlan(db: Db, organizationId: string, userId: string, site: SiteDto, planId: string, spec: PlanSpec): Promise<PlanDto> {
  const existing = await getPlan(db, organizationId, site.id, planId);
  if (!existing) throw notFound('Plan');
  const clash = await findPlanByName(db, organizationId, site.id, spec.name);
  if (clash && clash.id !== planId) throw nameTaken(spec.name);
  const summary = summaryOf(evaluatePlan(await loadSiteInputs(db, organizationId, site), spec));
  return atomically(db, async (tx) => {
    const plan = (await updatePlan(tx, organizationId, site.id, planId, spec, summary))!;
    await recordEvent(tx, organizationId, userId, { action: 'plan.updated', subjectType: 'correction_plan', subjectId: planId, detail: { siteId: site.id, before: existing.spec, after: spec } });
    return plan;
  });
}
