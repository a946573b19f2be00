/**
 * Applying a paid checkout session: the one place a Site audit is granted. Called inside a
 * transaction by the webhook (and by the refresh of a pending purchase when the webhook is
 * late), it checks the session against our own purchase record before granting anything.
 */
import { and, eq, inArray } from 'drizzle-orm';
import type Stripe from 'stripe';
import type { Db } from '../db/client';
import { organization, purchase, site } from '../db/schema';
import { recordEvent } from '../db/audit-log';
import { newReceiptNumber } from './receipt-number';
import type { PurchaseRow } from './purchases';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export type Outcome =
  | 'granted'
  | 'unknown_purchase'
  | 'session_mismatch'
  | 'not_paid'
  | 'already_paid'
  | 'purchase_closed'
  | 'amount_mismatch'
  | 'unknown_site'
  | 'expired'
  | 'ignored';

export type Applied = { outcome: Outcome; purchase: PurchaseRow | null; grantedSiteIds?: string[]; workspaceName?: string; detail?: Record<string, unknown> };

/** Our purchase for a session, found by the ids we put in its metadata when we created it. */
export async function purchaseOfSession(tx: Tx, s: Stripe.Checkout.Session): Promise<PurchaseRow | null> {
  const orgId = s.metadata?.organization_id;
  const purchaseId = s.metadata?.purchase_id ?? s.client_reference_id;
  if (!orgId || !purchaseId) return null;
  return (await tx.query.purchase.findFirst({ where: and(eq(purchase.organizationId, orgId), eq(purchase.id, purchaseId)) })) ?? null;
}

export async function applyPaidSession(tx: Tx, s: Stripe.Checkout.Session, source: 'webhook' | 'refresh'): Promise<Applied> {
  const row = await purchaseOfSession(tx, s);
  if (!row) return { outcome: 'unknown_purchase', purchase: null, detail: { sessionId: s.id } };
  if (row.checkoutSessionId !== s.id) return { outcome: 'session_mismatch', purchase: row, detail: { sessionId: s.id, expected: row.checkoutSessionId } };
  if (s.status !== 'complete' || s.payment_status !== 'paid') return { outcome: 'not_paid', purchase: row, detail: { status: s.status, paymentStatus: s.payment_status } };
  if (row.status === 'paid') return { outcome: 'already_paid', purchase: row };
  if (row.status !== 'pending') return { outcome: 'purchase_closed', purchase: row, detail: { status: row.status } };
  if (s.amount_total !== row.amountTotal || (s.currency ?? '').toUpperCase() !== row.currency) {
    return { outcome: 'amount_mismatch', purchase: row, detail: { paid: s.amount_total, paidCurrency: s.currency, expected: row.amountTotal, expectedCurrency: row.currency } };
  }
  const sites = await tx.select({ id: site.id }).from(site).where(and(eq(site.organizationId, row.organizationId), inArray(site.id, row.siteIds)));
  if (sites.length !== row.siteIds.length) {
    const found = new Set(sites.map((x) => x.id));
    return { outcome: 'unknown_site', purchase: row, detail: { missingSiteIds: row.siteIds.filter((id) => !found.has(id)) } };
  }

  const now = new Date();
  const [paid] = await tx
    .update(purchase)
    .set({ status: 'paid', paidAt: now, receiptNumber: newReceiptNumber(now), paymentIntentId: typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null) })
    .where(and(eq(purchase.organizationId, row.organizationId), eq(purchase.id, row.id), eq(purchase.status, 'pending')))
    .returning();
  if (!paid) return { outcome: 'already_paid', purchase: row };
  // Only a Draft becomes Audited: a site already Audited or Reported keeps its state.
  const granted = await tx
    .update(site)
    .set({ auditState: 'audited', updatedAt: now })
    .where(and(eq(site.organizationId, row.organizationId), inArray(site.id, row.siteIds), eq(site.auditState, 'draft')))
    .returning({ id: site.id });
  const grantedSiteIds = granted.map((g) => g.id);
  await recordEvent(tx as unknown as Db, row.organizationId, row.buyerUserId, {
    action: 'purchase.paid',
    subjectType: 'purchase',
    subjectId: row.id,
    detail: { receiptNumber: paid.receiptNumber, amountTotal: paid.amountTotal, currency: paid.currency, siteIds: row.siteIds, auditedSiteIds: grantedSiteIds, via: source, sessionId: s.id },
  });
  const org = await tx.query.organization.findFirst({ where: eq(organization.id, row.organizationId) });
  return { outcome: 'granted', purchase: paid, grantedSiteIds, workspaceName: org?.name ?? '' };
}

/** An expired session closes its pending purchase (nothing is granted). */
export async function applyExpiredSession(tx: Tx, s: Stripe.Checkout.Session): Promise<Applied> {
  const row = await purchaseOfSession(tx, s);
  if (!row) return { outcome: 'unknown_purchase', purchase: null, detail: { sessionId: s.id } };
  if (row.checkoutSessionId !== s.id) return { outcome: 'session_mismatch', purchase: row };
  if (row.status !== 'pending') return { outcome: 'ignored', purchase: row, detail: { status: row.status } };
  await tx.update(purchase).set({ status: 'expired', closedAt: new Date() }).where(and(eq(purchase.organizationId, row.organizationId), eq(purchase.id, row.id), eq(purchase.status, 'pending')));
  return { outcome: 'expired', purchase: row };
}
