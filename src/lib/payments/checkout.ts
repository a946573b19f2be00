/**
 * Starting and closing a Site audit purchase: our record first, then the hosted checkout
 * session at the payment provider (one line item per site, our ids in its metadata).
 */
import { and, eq, inArray } from 'drizzle-orm';
import { ApiError, notFound } from '../api/errors';
import { getConfig } from '../config';
import type { Db } from '../db/client';
import { newId } from '../db/ids';
import { purchase, site } from '../db/schema';
import { recordEvent } from '../db/audit-log';
import { AUDIT_STATE_LABELS } from '../schemas/site';
import { getStripe } from './stripe';
import { pendingPurchases, getPurchase, setPurchaseStatus, type PurchaseRow } from './purchases';
import { refreshPurchase } from './refresh';

/** How long a hosted checkout stays payable (the provider allows 30 minutes to 24 hours). */
const CHECKOUT_MINUTES = 60;

export type Buyer = { organizationId: string; userId: string; email: string; name: string };

export async function startPurchase(db: Db, buyer: Buyer, siteIds: string[]): Promise<PurchaseRow> {
  const cfg = getConfig();
  const rows = await db.select().from(site).where(and(eq(site.organizationId, buyer.organizationId), inArray(site.id, siteIds)));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const missing = siteIds.find((id) => !byId.has(id));
  if (missing) throw notFound(`Site ${missing}`);
  const sites = siteIds.map((id) => byId.get(id)!);
  const done = sites.filter((s) => s.auditState !== 'draft');
  if (done.length) {
    throw new ApiError(409, 'already_audited', `${done.map((s) => `${s.name} is already ${AUDIT_STATE_LABELS[s.auditState]}`).join('; ')}. Only Draft sites need a Site audit.`, Object.fromEntries(done.map((s) => [`siteIds.${siteIds.indexOf(s.id)}`, `Already ${AUDIT_STATE_LABELS[s.auditState]}.`])));
  }
  // A site already in an open checkout: bring that purchase up to date, refuse if it is still open.
  for (const p of await pendingPurchases(db, buyer.organizationId)) {
    if (!p.siteIds.some((id) => byId.has(id))) continue;
    const now = await refreshPurchase(db, p);
    if (now.status === 'pending') throw new ApiError(409, 'checkout_open', `A checkout for ${p.siteNames.join(', ')} is still open. Finish paying it or cancel it in the list below first.`, undefined, { purchaseId: p.id });
    if (now.status === 'paid') throw new ApiError(409, 'already_audited', `${p.siteNames.join(', ')} was paid a moment ago. Reload the page.`);
  }

  const id = newId('pur');
  const unitAmount = cfg.SITE_AUDIT_PRICE;
  const currency = cfg.SITE_AUDIT_CURRENCY;
  await db.insert(purchase).values({ id, organizationId: buyer.organizationId, status: 'pending', unitAmount, amountTotal: unitAmount * sites.length, currency, siteIds, siteNames: sites.map((s) => s.name), buyerUserId: buyer.userId, buyerEmail: buyer.email, buyerName: buyer.name });
  let session;
  try {
    session = await getStripe().checkout.sessions.create(
      {
        mode: 'payment',
        line_items: sites.map((s) => ({ quantity: 1, price_data: { currency: currency.toLowerCase(), unit_amount: unitAmount, product_data: { name: `Site audit: ${s.name}` } } })),
        metadata: { organization_id: buyer.organizationId, purchase_id: id, site_ids: siteIds.join(',') },
        client_reference_id: id,
        customer_email: buyer.email,
        success_url: `${cfg.baseUrl}/purchases?checkout=paid&purchase=${id}&session={CHECKOUT_SESSION_ID}`,
        cancel_url: `${cfg.baseUrl}/purchases?checkout=cancelled&purchase=${id}`,
        expires_at: Math.floor(Date.now() / 1000) + CHECKOUT_MINUTES * 60,
      },
      { idempotencyKey: `purchase-${id}` },
    );
  } catch (e) {
    await db.delete(purchase).where(and(eq(purchase.organizationId, buyer.organizationId), eq(purchase.id, id)));
    console.error('[payments] creating the checkout failed', e);
    throw new ApiError(502, 'payment_unavailable', 'The payment service did not answer. Nothing was charged; try again in a minute.');
  }
  const [row] = await db.update(purchase).set({ checkoutSessionId: session.id, checkoutUrl: session.url }).where(and(eq(purchase.organizationId, buyer.organizationId), eq(purchase.id, id))).returning();
  await recordEvent(db, buyer.organizationId, buyer.userId, { action: 'purchase.started', subjectType: 'purchase', subjectId: id, detail: { siteIds, amountTotal: row!.amountTotal, currency, sessionId: session.id } });
  return row!;
}

/** The buyer went back from the hosted page: close the checkout there so it cannot be paid later. */
export async function cancelPurchase(db: Db, organizationId: string, userId: string, id: string): Promise<PurchaseRow> {
  const row = await getPurchase(db, organizationId, id);
  if (!row) throw notFound('Purchase');
  if (row.status !== 'pending') return row;
  if (row.checkoutSessionId) {
    try {
      await getStripe().checkout.sessions.expire(row.checkoutSessionId);
    } catch {
      // Not open any more (paid or expired in the meantime): the refresh below tells which.
      return refreshPurchase(db, row);
    }
  }
  if (await setPurchaseStatus(db, organizationId, id, 'cancelled', ['pending', 'expired'])) {
    await recordEvent(db, organizationId, userId, { action: 'purchase.cancelled', subjectType: 'purchase', subjectId: id });
  }
  return (await getPurchase(db, organizationId, id))!;
}
