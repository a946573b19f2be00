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
import { refreshPurchase, refreshPurchaseChecked } from './refresh';
import { noteProvider, providerUnreachable } from './provider-status';

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
    if (!p.checkoutSessionId && (await closeAbandonedStart(db, p))) continue;
    const { row: now, reached } = await refreshPurchaseChecked(db, p);
    if (!reached) throw unavailable(`We could not ask the payment service whether the open checkout for ${p.siteNames.join(', ')} was paid, so no new checkout was started and nothing was charged. Try again in a minute.`);
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
    // No checkout exists that anyone could pay: remove our record (a start left behind by a
    // failed delete has no checkout and is closed by the next attempt, see closeAbandonedStart).
    await db.delete(purchase).where(and(eq(purchase.organizationId, buyer.organizationId), eq(purchase.id, id))).catch((d) => console.error(`[payments] could not remove the unstarted purchase ${id}`, d));
    console.error('[payments] creating the checkout failed', (e as Error).message);
    if (providerUnreachable(e)) noteProvider(false);
    throw unavailable('The payment service could not be reached, so no checkout was opened and nothing was charged. Try again in a minute.');
  }
  noteProvider(true);
  let row: PurchaseRow | undefined;
  try {
    await db.transaction(async (tx) => {
      [row] = await tx.update(purchase).set({ checkoutSessionId: session.id, checkoutUrl: session.url }).where(and(eq(purchase.organizationId, buyer.organizationId), eq(purchase.id, id), eq(purchase.status, 'pending'))).returning();
      if (!row) throw new ApiError(409, 'checkout_closed', 'This purchase was closed while its checkout was being opened. Nothing was charged; start again.');
      await recordEvent(tx as unknown as Db, buyer.organizationId, buyer.userId, { action: 'purchase.started', subjectType: 'purchase', subjectId: id, detail: { siteIds, amountTotal: row!.amountTotal, currency, sessionId: session.id } });
    });
  } catch (e) {
    // The checkout exists but we could not record it (e.g. the database stayed locked): close it
    // at the provider so it can never be paid unrecorded, drop our record, and let the API answer.
    await getStripe().checkout.sessions.expire(session.id).catch((x) => console.error(`[payments] could not expire unrecorded session ${session.id}`, (x as Error).message));
    await db.delete(purchase).where(and(eq(purchase.organizationId, buyer.organizationId), eq(purchase.id, id))).catch(() => undefined);
    throw e;
  }
  return row!;
}

const unavailable = (message: string) => new ApiError(502, 'payment_unavailable', message, undefined, { retryAfterSeconds: 30 });

/** A pending purchase without a checkout is a start that failed half-way; after 2 minutes (past any SDK retry) it is closed. */
const ABANDONED_START_MS = 2 * 60_000;
async function closeAbandonedStart(db: Db, p: PurchaseRow): Promise<boolean> {
  if (Date.now() - p.createdAt.getTime() < ABANDONED_START_MS) throw new ApiError(409, 'checkout_starting', `A checkout for ${p.siteNames.join(', ')} is being opened right now. Wait a moment and reload the page.`, undefined, { purchaseId: p.id });
  return setPurchaseStatus(db, p.organizationId, p.id, 'cancelled', ['pending']);
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
