/**
 * The demo's purchase history: Brackwater Kiln Works was bought and paid (so it is Audited),
 * the other demo plants stay Draft. Idempotent: the purchase is found by its receipt number.
 */
import { recordEvent } from '../db/audit-log';
import { and, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { organization, purchase, site, user } from '../db/schema';
import { findSiteByName } from '../db/sites';
import { DEMO_WORKSPACES } from './scenario';

export const DEMO_RECEIPT_NUMBER = 'VLR-20260112-KLN4WB';
export const DEMO_PAID_SITE = 'Brackwater Kiln Works';
const DEMO_PAID_AT = new Date('2026-01-12T15:42:00Z');

export async function seedDemoPurchases(db: Db): Promise<{ created: number }> {
  const ws = DEMO_WORKSPACES[0]!;
  const org = await db.query.organization.findFirst({ where: eq(organization.slug, ws.slug) });
  const buyer = await db.query.user.findFirst({ where: eq(user.email, 'consultant@fieldline.example') });
  const paidSite = org ? await findSiteByName(db, org.id, DEMO_PAID_SITE) : undefined;
  if (!org || !buyer || !paidSite) return { created: 0 };
  const existing = await db.query.purchase.findFirst({ where: and(eq(purchase.organizationId, org.id), eq(purchase.receiptNumber, DEMO_RECEIPT_NUMBER)) });
  if (existing) return { created: 0 };
  await db.insert(purchase).values({
    id: 'pur_demoBrackwater01',
    organizationId: org.id,
    checkoutSessionId: 'cs_demo_brackwater_2026_01',
    status: 'paid',
    unitAmount: 29_000,
    amountTotal: 29_000,
    currency: 'USD',
    siteIds: [paidSite.id],
    siteNames: [paidSite.name],
    buyerUserId: buyer.id,
    buyerEmail: buyer.email,
    buyerName: buyer.name,
    receiptNumber: DEMO_RECEIPT_NUMBER,
    paymentIntentId: 'pi_demo_brackwater_2026_01',
    createdAt: new Date(DEMO_PAID_AT.getTime() - 4 * 60_000),
    paidAt: DEMO_PAID_AT,
    closedAt: DEMO_PAID_AT,
  });
  await db.update(site).set({ auditState: 'audited' }).where(and(eq(site.organizationId, org.id), eq(site.id, paidSite.id), eq(site.auditState, 'draft')));
  await recordEvent(db, org.id, buyer.id, { action: 'purchase.paid', subjectType: 'purchase', subjectId: 'pur_demoBrackwater01', detail: { receiptNumber: DEMO_RECEIPT_NUMBER, amountTotal: 29_000, currency: 'USD', siteIds: [paidSite.id], auditedSiteIds: [paidSite.id], via: 'demo' }, at: DEMO_PAID_AT });
  return { created: 1 };
}
