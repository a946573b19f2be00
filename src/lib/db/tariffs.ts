/** Tariff versions of a site. Every function is scoped by organization. */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { tariff } from './schema';
import type { Tariff } from '../domain/tariff/tariff-schema';

export type TariffRow = typeof tariff.$inferSelect;

export type TariffDto = { id: string; siteId: string; name: string; effectiveFrom: string; definition: Tariff; createdAt: string; updatedAt: string };

export function toTariffDto(r: TariffRow): TariffDto {
  return { id: r.id, siteId: r.siteId, name: r.name, effectiveFrom: r.effectiveFrom, definition: r.definition as unknown as Tariff, createdAt: r.createdAt.toISOString(), updatedAt: r.updatedAt.toISOString() };
}

export async function listTariffs(db: Db, organizationId: string, siteId: string): Promise<TariffDto[]> {
  const rows = await db.select().from(tariff).where(and(eq(tariff.organizationId, organizationId), eq(tariff.siteId, siteId))).orderBy(asc(tariff.effectiveFrom));
  return rows.map(toTariffDto);
}

export async function getTariff(db: Db, organizationId: string, siteId: string, tariffId: string): Promise<TariffDto | null> {
  const row = await db.query.tariff.findFirst({ where: and(eq(tariff.organizationId, organizationId), eq(tariff.siteId, siteId), eq(tariff.id, tariffId)) });
  return row ? toTariffDto(row) : null;
}

export async function findTariffFrom(db: Db, organizationId: string, siteId: string, effectiveFrom: string) {
  return db.query.tariff.findFirst({ where: and(eq(tariff.organizationId, organizationId), eq(tariff.siteId, siteId), eq(tariff.effectiveFrom, effectiveFrom)) });
}

export async function createTariff(db: Db, organizationId: string, siteId: string, t: Tariff & { effectiveFrom: string }, createdBy: string | null): Promise<TariffDto> {
  const [row] = await db
    .insert(tariff)
    .values({ id: newId('trf'), organizationId, siteId, name: t.name, effectiveFrom: t.effectiveFrom, definition: t as unknown as Record<string, unknown>, createdBy })
    .returning();
  return toTariffDto(row!);
}

export async function updateTariff(db: Db, organizationId: string, siteId: string, tariffId: string, t: Tariff & { effectiveFrom: string }): Promise<TariffDto | null> {
  const [row] = await db
    .update(tariff)
    .set({ name: t.name, effectiveFrom: t.effectiveFrom, definition: t as unknown as Record<string, unknown>, updatedAt: new Date() })
    .where(and(eq(tariff.organizationId, organizationId), eq(tariff.siteId, siteId), eq(tariff.id, tariffId)))
    .returning();
  return row ? toTariffDto(row) : null;
}

export async function deleteTariff(db: Db, organizationId: string, siteId: string, tariffId: string): Promise<boolean> {
  const rows = await db.delete(tariff).where(and(eq(tariff.organizationId, organizationId), eq(tariff.siteId, siteId), eq(tariff.id, tariffId))).returning({ id: tariff.id });
  return rows.length > 0;
}
