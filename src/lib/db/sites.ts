/** Site queries. Every function takes the organization id and filters by it. */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { site } from './schema';
import type { SiteCreate, SiteDto, SiteUpdate } from '../schemas/site';

type SiteRow = typeof site.$inferSelect;

export function toSiteDto(r: SiteRow): SiteDto {
  return {
    id: r.id,
    name: r.name,
    address: r.address,
    timeZone: r.timeZone,
    utility: r.utility,
    accountNumber: r.accountNumber,
    serviceVoltageV: r.serviceVoltageV,
    transformerKva: r.transformerKva,
    transformerImpedancePct: r.transformerImpedancePct,
    currency: r.currency,
    auditState: r.auditState,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

export async function listSites(db: Db, organizationId: string): Promise<SiteDto[]> {
  const rows = await db.select().from(site).where(eq(site.organizationId, organizationId)).orderBy(asc(site.name));
  return rows.map(toSiteDto);
}

export async function getSite(db: Db, organizationId: string, siteId: string): Promise<SiteDto | null> {
  const row = await db.query.site.findFirst({ where: and(eq(site.organizationId, organizationId), eq(site.id, siteId)) });
  return row ? toSiteDto(row) : null;
}

export async function findSiteByName(db: Db, organizationId: string, name: string) {
  return db.query.site.findFirst({ where: and(eq(site.organizationId, organizationId), eq(site.name, name)) });
}

export async function createSite(db: Db, organizationId: string, input: SiteCreate, id = newId('site')): Promise<SiteDto> {
  const [row] = await db
    .insert(site)
    .values({ id, organizationId, ...input, serviceVoltageV: input.serviceVoltageV ?? null, transformerKva: input.transformerKva ?? null, transformerImpedancePct: input.transformerImpedancePct ?? null })
    .returning();
  return toSiteDto(row!);
}

export async function updateSite(db: Db, organizationId: string, siteId: string, patch: SiteUpdate): Promise<SiteDto | null> {
  const [row] = await db
    .update(site)
    .set({ ...patch, updatedAt: new Date() })
    .where(and(eq(site.organizationId, organizationId), eq(site.id, siteId)))
    .returning();
  return row ? toSiteDto(row) : null;
}

export async function deleteSite(db: Db, organizationId: string, siteId: string): Promise<boolean> {
  const rows = await db.delete(site).where(and(eq(site.organizationId, organizationId), eq(site.id, siteId))).returning({ id: site.id });
  return rows.length > 0;
}
