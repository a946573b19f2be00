/** Purchase queries. Every function takes the organization id and filters by it. */
import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/client';
import { purchase } from '../db/schema';
import type { PurchaseDto } from './schemas';

export type PurchaseRow = typeof purchase.$inferSelect;
export type PurchaseStatus = PurchaseRow['status'];

export function toPurchaseDto(r: PurchaseRow): PurchaseDto {
  return {
    id: r.id,
    status: r.status,
    unitAmount: r.unitAmount,
    amountTotal: r.amountTotal,
    currency: r.currency,
    sites: r.siteIds.map((id, i) => ({ id, name: r.siteNames[i] ?? id })),
    buyerName: r.buyerName,
    buyerEmail: r.buyerEmail,
    receiptNumber: r.receiptNumber,
    checkoutUrl: r.status === 'pending' ? r.checkoutUrl : null,
    createdAt: r.createdAt.toISOString(),
    paidAt: r.paidAt?.toISOString() ?? null,
    closedAt: r.closedAt?.toISOString() ?? null,
  };
}

export async function listPurchases(db: Db, organizationId: string, limit = 200): Promise<PurchaseRow[]> {
  return db.select().from(purchase).where(eq(purchase.organizationId, organizationId)).orderBy(desc(purchase.createdAt)).limit(limit);
}

export async function getPurchase(db: Db, organizationId: string, id: string): Promise<PurchaseRow | undefined> {
  return db.query.purchase.findFirst({ where: and(eq(purchase.organizationId, organizationId), eq(purchase.id, id)) });
}

export async function pendingPurchases(db: Db, organizationId: string): Promise<PurchaseRow[]> {
  return db.select().from(purchase).where(and(eq(purchase.organizationId, organizationId), eq(purchase.status, 'pending')));
}

/** Moves a purchase out of `from` states only, so a late answer never overwrites a payment. */
export async function setPurchaseStatus(db: Db, organizationId: string, id: string, to: PurchaseStatus, from: PurchaseStatus[], at = new Date()): Promise<boolean> {
  const rows = await db
    .update(purchase)
    .set({ status: to, closedAt: at })
    .where(and(eq(purchase.organizationId, organizationId), eq(purchase.id, id), inArray(purchase.status, from)))
    .returning({ id: purchase.id });
  return rows.length > 0;
}
