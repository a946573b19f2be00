/** Bills of a site. Every function is scoped by organization. */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { bill } from './schema';

export type BillRow = typeof bill.$inferSelect;

export async function listBills(db: Db, organizationId: string, siteId: string): Promise<BillRow[]> {
  return db.select().from(bill).where(and(eq(bill.organizationId, organizationId), eq(bill.siteId, siteId))).orderBy(asc(bill.periodStart));
}
