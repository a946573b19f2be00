import { useEffect, useRef } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../api';
import { QueryRoot } from '../QueryRoot';
import { BuyAudits } from './BuyAudits';
import { PurchaseHistory } from './PurchaseHistory';
import type { Purchase, PurchasesAnswer, SiteLite } from './types';

type Props = { canBuy: boolean; workspaceName: string; returned: 'paid' | 'cancelled' | null; purchaseId: string | null; openReceipt: string | null };

/** Back from the hosted page: wait for the payment confirmation, or close a cancelled checkout. */
function ReturnNotice({ returned, purchaseId, canBuy }: { returned: 'paid' | 'cancelled'; purchaseId: string; canBuy: boolean }) {
  const qc = useQueryClient();
  const cancelled = useRef(false);
  useEffect(() => {
    if (returned === 'cancelled' && canBuy && !cancelled.current) {
      cancelled.current = true;
      api(`/api/purchases/${purchaseId}/cancel`, { method: 'POST' }).catch(() => undefined).finally(() => qc.invalidateQueries({ queryKey: ['purchase', purchaseId] }));
    }
  }, [returned, purchaseId, canBuy, qc]);
  const one = useQuery({
    queryKey: ['purchase', purchaseId],
    queryFn: () => api<{ purchase: Purchase }>(`/api/purchases/${purchaseId}`),
    // Pending until the provider's webhook arrives: ask again every 1.5 s.
    refetchInterval: (q) => (returned === 'paid' && q.state.data?.purchase.status === 'pending' ? 1500 : false),
  });
  const status = one.data?.purchase.status;
  useEffect(() => {
    if (status && status !== 'pending') { qc.invalidateQueries({ queryKey: ['purchases'] }); qc.invalidateQueries({ queryKey: ['sites'] }); }
  }, [status, qc]);
  if (one.isError) return <p className="notice notice-error" role="alert">Could not read this purchase: {(one.error as Error).message}</p>;
  if (!one.data) return <p className="notice" role="status" aria-busy="true">Checking the purchase…</p>;
  const p = one.data.purchase;
  const what = p.sites.length === 1 ? `the Site audit of ${p.sites[0]!.name}` : `${p.sites.length} Site audits for ${p.sites.map((s) => s.name).join(', ').replace(/, ([^,]*)$/, ' and $1')}`;
  if (p.status === 'paid') return <p className="notice notice-ok" role="status">Paid: {what}. {p.sites.length === 1 ? 'The site is' : 'The sites are'} now Audited. Receipt {p.receiptNumber} was sent to {p.buyerEmail}.</p>;
  if (returned === 'paid' && p.status === 'pending') return <p className="notice" role="status" aria-busy="true">Payment sent for {what}. Waiting for the payment provider to confirm it; this page updates by itself.</p>;
  if (p.status === 'cancelled' || returned === 'cancelled') return <p className="notice" role="status">Checkout cancelled: nothing was charged for {what}. Choose sites again when you are ready.</p>;
  if (p.status === 'expired') return <p className="notice" role="status">That checkout expired before it was paid: nothing was charged. Start a new one below.</p>;
  return null;
}

function Purchases({ canBuy, workspaceName, returned, purchaseId, openReceipt }: Props) {
  const purchases = useQuery({ queryKey: ['purchases'], queryFn: () => api<PurchasesAnswer>('/api/purchases') });
  const sites = useQuery({ queryKey: ['sites'], queryFn: () => api<{ sites: SiteLite[] }>('/api/sites') });
  if (purchases.isPending || sites.isPending) return <p className="text-muted" aria-busy="true">Loading purchases…</p>;
  if (purchases.isError || sites.isError) return <p className="notice notice-error" role="alert">Could not load the purchases: {((purchases.error ?? sites.error) as Error).message} <button className="btn btn-quiet ml-2" onClick={() => { purchases.refetch(); sites.refetch(); }}>Retry</button></p>;
  return (
    <div className="flex flex-col gap-6">
      {returned && purchaseId && <ReturnNotice returned={returned} purchaseId={purchaseId} canBuy={canBuy} />}
      <BuyAudits sites={sites.data.sites} price={purchases.data.price} canBuy={canBuy} />
      <section aria-labelledby="history-h">
        <h2 id="history-h" className="mb-2">Purchase history</h2>
        <PurchaseHistory purchases={purchases.data.purchases} canBuy={canBuy} workspaceName={workspaceName} openReceipt={openReceipt} />
      </section>
    </div>
  );
}

export default function PurchasesPanel(props: Props) {
  return <QueryRoot><Purchases {...props} /></QueryRoot>;
}
