/** Bills of a site. Every function is scoped by organization. */
import { and, asc, eq, gte, lte } from 'drizzle-orm';
import type { Db } from './client';
import { newId } from './ids';
import { bill } from './schema';
import type { BillDeterminants } from '../import/bills/bill-schema';

export type BillRow = typeof bill.$inferSelect;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export async function listBills(db: Db | Tx, organizationId: string, siteId: string): Promise<BillRow[]> {
  return db.select().from(bill).where(and(eq(bill.organizationId, organizationId), eq(bill.siteId, siteId))).orderBy(asc(bill.periodStart));
}

export async function getBill(db: Db, organizationId: string, siteId: string, billId: string) {
  return db.query.bill.findFirst({ where: and(eq(bill.organizationId, organizationId), eq(bill.siteId, siteId), eq(bill.id, billId)) });
}

/** Bills whose period shares at least one day with [start, end] (inclusive dates). */
export async function overlappingBills(db: Db | Tx, organizationId: string, siteId: string, start: string, end: string) {
  return db
    .select()
    .from(bill)
    .where(and(eq(bill.organizationId, organizationId), eq(bill.siteId, siteId), lte(bill.periodStart, end), gte(bill.periodEnd, start)));
}

export function billValues(organizationId: string, siteId: string, b: BillDeterminants, source: 'form' | 'csv', currency: string, createdBy: string) {
  return {
    id: newId('bill'),
    organizationId,
    siteId,
    periodStart: b.periodStart,
    periodEnd: b.periodEnd,
    kwh: b.kwh,
    billedDemand: b.billedDemand ?? null,
    demandUnit: b.billedDemandUnit ?? ('kW' as const),
    kvarh: b.kvarh ?? null,
    pf: b.powerFactor ?? null,
    pfCharge: b.pfCharge ?? null,
    total: b.total ?? null,
    currency: b.currency ?? currency,
    source,
    createdBy,
  };
}

export async function deleteBill(db: Db, organizationId: string, siteId: string, billId: string) {
  const rows = await db.delete(bill).where(and(eq(bill.organizationId, organizationId), eq(bill.siteId, siteId), eq(bill.id, billId))).returning({ id: bill.id });
  return rows.length > 0;
}

export async function setBillDocument(db: Db, organizationId: string, billId: string, fileId: string) {
  await db.update(bill).set({ documentFileId: fileId }).where(and(eq(bill.organizationId, organizationId), eq(bill.id, billId)));
}

export function billDto(b: BillRow) {
  return { id: b.id, periodStart: b.periodStart, periodEnd: b.periodEnd, kwh: b.kwh, billedDemand: b.billedDemand, demandUnit: b.demandUnit, kvarh: b.kvarh, pf: b.pf, pfCharge: b.pfCharge, total: b.total, currency: b.currency, source: b.source, hasDocument: !!b.documentFileId, createdAt: b.createdAt.toISOString() };
}
