/** Saved correction plans. Every function is scoped by organization (another workspace's ids are not found). */
import { and, asc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { correctionPlan, site } from '../db/schema';
import { PlanSpecSchema, type PlanSpec } from './plan-spec';
import { PlanSummarySchema, type PlanSummary } from './summary';

export type PlanRow = typeof correctionPlan.$inferSelect;

export const PlanDtoSchema = z
  .object({
    id: z.string(),
    siteId: z.string(),
    name: z.string(),
    spec: PlanSpecSchema,
    summary: PlanSummarySchema.nullable(),
    createdBy: z.string().nullable(),
    createdAt: z.string(),
    updatedAt: z.string(),
  })
  .meta({ id: 'CorrectionPlan' });
export type PlanDto = z.infer<typeof PlanDtoSchema>;

export function toPlanDto(r: PlanRow): PlanDto {
  return {
    id: r.id,
    siteId: r.siteId,
    name: r.name,
    spec: r.spec as unknown as PlanSpec,
    summary: (r.summary as unknown as PlanSummary | null) ?? null,
    createdBy: r.createdBy ?? null,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

const scope = (organizationId: string, siteId: string) => and(eq(correctionPlan.organizationId, organizationId), eq(correctionPlan.siteId, siteId));

export async function listPlans(db: Db, organizationId: string, siteId: string): Promise<PlanDto[]> {
  const rows = await db.select().from(correctionPlan).where(scope(organizationId, siteId)).orderBy(asc(correctionPlan.name));
  return rows.map(toPlanDto);
}

export async function getPlan(db: Db, organizationId: string, siteId: string, planId: string): Promise<PlanDto | null> {
  const row = await db.query.correctionPlan.findFirst({ where: and(scope(organizationId, siteId), eq(correctionPlan.id, planId)) });
  return row ? toPlanDto(row) : null;
}

export async function findPlanByName(db: Db, organizationId: string, siteId: string, name: string) {
  return db.query.correctionPlan.findFirst({ where: and(scope(organizationId, siteId), eq(correctionPlan.name, name)) });
}

export async function createPlan(db: Db, organizationId: string, siteId: string, spec: PlanSpec, summary: PlanSummary, createdBy: string | null): Promise<PlanDto> {
  const [row] = await db
    .insert(correctionPlan)
    .values({ id: newId('pln'), organizationId, siteId, name: spec.name, spec: spec as unknown as Record<string, unknown>, summary: summary as unknown as Record<string, unknown>, createdBy })
    .returning();
  return toPlanDto(row!);
}

export async function updatePlan(db: Db, organizationId: string, siteId: string, planId: string, spec: PlanSpec, summary: PlanSummary): Promise<PlanDto | null> {
  const [row] = await db
    .update(correctionPlan)
    .set({ name: spec.name, spec: spec as unknown as Record<string, unknown>, summary: summary as unknown as Record<string, unknown>, updatedAt: new Date() })
    .where(and(scope(organizationId, siteId), eq(correctionPlan.id, planId)))
    .returning();
  return row ? toPlanDto(row) : null;
}

export async function deletePlan(db: Db, organizationId: string, siteId: string, planId: string): Promise<boolean> {
  const rows = await db.delete(correctionPlan).where(and(scope(organizationId, siteId), eq(correctionPlan.id, planId))).returning({ id: correctionPlan.id });
  return rows.length > 0;
}

/** Every saved plan of a workspace with its site's name, for the payback table. */
export async function listWorkspacePlans(db: Db, organizationId: string): Promise<(PlanDto & { siteName: string })[]> {
  const rows = await db
    .select({ plan: correctionPlan, siteName: site.name })
    .from(correctionPlan)
    .innerJoin(site, eq(site.id, correctionPlan.siteId))
    .where(and(eq(correctionPlan.organizationId, organizationId), eq(site.organizationId, organizationId)))
    .orderBy(asc(site.name), asc(correctionPlan.name));
  return rows.map((r) => ({ ...toPlanDto(r.plan), siteName: r.siteName }));
}
