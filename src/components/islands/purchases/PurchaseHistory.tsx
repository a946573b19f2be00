import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { formatMinor } from '@/lib/payments/money';
import { api, ApiClientError } from '../api';
import { STATUS_CLASS, STATUS_LABEL, when, type Purchase } from './types';

function Receipt({ p, workspaceName }: { p: Purchase; workspaceName: string }) {
  return (
    <section className="card mt-2 p-4" aria-label={`Receipt ${p.receiptNumber}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">Receipt <span className="figure">{p.receiptNumber}</span></h3>
        <p className="text-sm text-muted">Paid {when(p.paidAt)}</p>
      </div>
      <p className="mt-1 text-sm">{workspaceName} · bought by {p.buyerName || p.buyerEmail} ({p.buyerEmail})</p>
      <table className="ledger mt-3 text-sm">
        <tbody>{p.sites.map((s) => <tr key={s.id}><th scope="row">Site audit, {s.name}</th><td className="figure">{formatMinor(p.unitAmount, p.currency)}</td></tr>)}</tbody>
        <tfoot><tr><th scope="row">Total paid</th><td className="figure">{formatMinor(p.amountTotal, p.currency)}</td></tr></tfoot>
      </table>
    </section>
  );
}

export function PurchaseHistory({ purchases, canBuy, workspaceName, openReceipt }: { purchases: Purchase[]; canBuy: boolean; workspaceName: string; openReceipt: string | null }) {
  const qc = useQueryClient();
  const [shown, setShown] = useState<string | null>(openReceipt);
  const [error, setError] = useState<string | null>(null);
  const cancel = useMutation({
    mutationFn: (id: string) => api(`/api/purchases/${id}/cancel`, { method: 'POST' }),
    onSuccess: () => { qc.invalidateQueries({ queryKey: ['purchases'] }); qc.invalidateQueries({ queryKey: ['sites'] }); },
    onError: (e) => setError(e instanceof ApiClientError ? e.message : 'Could not cancel. Try again.'),
  });
  if (purchases.length === 0) return <p className="text-sm text-muted">No purchases yet. Choose Draft sites above to buy their Site audits.</p>;
  return (
    <div>
      {error && <p className="notice notice-error mb-2" role="alert">{error}</p>}
      <div className="overflow-x-auto rounded border border-rule">
        <table className="ledger text-sm">
          <thead><tr><th scope="col">Started</th><th scope="col">Sites</th><th scope="col" className="text-right">Amount</th><th scope="col">State</th><th scope="col">Receipt</th></tr></thead>
          <tbody>
            {purchases.map((p) => (
              <tr key={p.id} data-purchase={p.id}>
                <td className="whitespace-nowrap">{when(p.createdAt)}</td>
                <td>{p.sites.map((s) => s.name).join(', ')}</td>
                <td className="figure">{formatMinor(p.amountTotal, p.currency)}</td>
                <td><span className={`tag ${STATUS_CLASS[p.status]}`}>{STATUS_LABEL[p.status]}</span>{p.status !== 'pending' && p.status !== 'paid' && p.closedAt && <span className="ml-1 text-muted">{when(p.closedAt)}</span>}</td>
                <td>
                  {p.status === 'paid' && p.receiptNumber && (
                    <button className="btn btn-quiet text-sm" aria-expanded={shown === p.id} onClick={() => setShown(shown === p.id ? null : p.id)}>{shown === p.id ? 'Hide' : 'View'} receipt {p.receiptNumber}</button>
                  )}
                  {p.status === 'pending' && canBuy && (
                    <span className="flex flex-wrap gap-2">
                      {p.checkoutUrl && <a className="btn btn-quiet text-sm" href={p.checkoutUrl}>Continue to payment</a>}
                      <button className="btn btn-quiet text-sm" disabled={cancel.isPending} onClick={() => cancel.mutate(p.id)}>Cancel</button>
                    </span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {shown && purchases.find((p) => p.id === shown && p.status === 'paid') && <Receipt p={purchases.find((p) => p.id === shown)!} workspaceName={workspaceName} />}
    </div>
  );
}
