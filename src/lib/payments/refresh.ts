/**
 * Brings a pending purchase up to date from the provider's API: expired there means expired
 * here, paid there is applied the same way the webhook would (in case the webhook is late).
 */
import type { Db } from '../db/client';
import { applyPaidSession } from './fulfil';
import { getPurchase, setPurchaseStatus, type PurchaseRow } from './purchases';
import { sendReceipt } from './receipt-mail';
import { getStripe } from './stripe';
import { noteProvider, providerUnreachable } from './provider-status';

export async function refreshPurchase(db: Db, row: PurchaseRow): Promise<PurchaseRow> {
  return (await refreshPurchaseChecked(db, row)).row;
}

/**
 * The same, saying whether the provider answered: when it did not, the row is returned as
 * stored (a page still renders it) and `reached` is false, so a caller that must know the
 * true state (starting another checkout for the same site) can refuse instead of guessing.
 */
export async function refreshPurchaseChecked(db: Db, row: PurchaseRow): Promise<{ row: PurchaseRow; reached: boolean }> {
  if (row.status !== 'pending' || !row.checkoutSessionId) return { row, reached: true };
  let session;
  try {
    session = await getStripe().checkout.sessions.retrieve(row.checkoutSessionId);
    noteProvider(true);
  } catch (e) {
    console.error(`[payments] could not refresh purchase ${row.id}`, (e as Error).message);
    const reached = !providerUnreachable(e);
    noteProvider(reached);
    return { row, reached };
  }
  if (session.status === 'expired') await setPurchaseStatus(db, row.organizationId, row.id, 'expired', ['pending']);
  else if (session.status === 'complete' && session.payment_status === 'paid') {
    const applied = await db.transaction((tx) => applyPaidSession(tx, session, 'refresh'));
    if (applied.outcome === 'granted' && applied.purchase) sendReceipt(applied.purchase, applied.workspaceName ?? '');
  }
  return { row: (await getPurchase(db, row.organizationId, row.id)) ?? row, reached: true };
}
