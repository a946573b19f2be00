/**
 * Brings a pending purchase up to date from the provider's API: expired there means expired
 * here, paid there is applied the same way the webhook would (in case the webhook is late).
 */
import type { Db } from '../db/client';
import { applyPaidSession } from './fulfil';
import { getPurchase, setPurchaseStatus, type PurchaseRow } from './purchases';
import { sendReceipt } from './receipt-mail';
import { getStripe } from './stripe';

export async function refreshPurchase(db: Db, row: PurchaseRow): Promise<PurchaseRow> {
  if (row.status !== 'pending' || !row.checkoutSessionId) return row;
  let session;
  try {
    session = await getStripe().checkout.sessions.retrieve(row.checkoutSessionId);
  } catch (e) {
    console.error(`[payments] could not refresh purchase ${row.id}`, (e as Error).message);
    return row;
  }
  if (session.status === 'expired') await setPurchaseStatus(db, row.organizationId, row.id, 'expired', ['pending']);
  else if (session.status === 'complete' && session.payment_status === 'paid') {
    const applied = await db.transaction((tx) => applyPaidSession(tx, session, 'refresh'));
    if (applied.outcome === 'granted' && applied.purchase) sendReceipt(applied.purchase, applied.workspaceName ?? '');
  }
  return (await getPurchase(db, row.organizationId, row.id)) ?? row;
}
