import { useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { formatMinor } from '@/lib/payments/money';
import { api, ApiClientError } from '../api';
import type { Price, Purchase, SiteLite } from './types';

/** Choose Draft sites, see the price, go to the hosted payment page. */
export function BuyAudits({ sites, price, canBuy }: { sites: SiteLite[]; price: Price; canBuy: boolean }) {
  const drafts = sites.filter((s) => s.auditState === 'draft');
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const [error, setError] = useState<string | null>(null);
  const n = drafts.filter((s) => chosen.has(s.id)).length;
  const start = useMutation({
    mutationFn: () => api<{ purchase: Purchase; checkoutUrl: string }>('/api/purchases', { method: 'POST', body: { siteIds: drafts.filter((s) => chosen.has(s.id)).map((s) => s.id) } }),
    onSuccess: ({ checkoutUrl }) => window.location.assign(checkoutUrl),
    onError: (e) => setError(e instanceof ApiClientError ? e.message : 'Could not start the payment. Try again.'),
  });
  const toggle = (id: string) => setChosen((c) => { const next = new Set(c); if (next.has(id)) next.delete(id); else next.add(id); return next; });

  return (
    <section className="card p-4" aria-labelledby="buy-h">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="buy-h">{canBuy ? 'Buy Site audits' : 'Site audits'}</h2>
        <p className="text-sm text-muted">One Site audit per site: <span className="figure">{formatMinor(price.unitAmount, price.currency)}</span>. It makes the site’s findings final (Audited) and lets a Savings report be issued.</p>
      </div>
      {!canBuy ? (
        <>
          <p className="notice mb-3 text-sm">Your role can read the purchases of this workspace. An Owner or a Consultant buys Site audits.</p>
          <p className="text-sm">{drafts.length === 0 ? 'Every site of this workspace is already Audited or Reported.' : `Still Draft: ${drafts.map((s) => s.name).join(', ')}.`}</p>
        </>
      ) : drafts.length === 0 ? (
        <p className="text-sm text-muted">Every site of this workspace is already Audited or Reported.</p>
      ) : (
        <form onSubmit={(e) => { e.preventDefault(); setError(null); start.mutate(); }}>
          <fieldset disabled={start.isPending}>
            <legend className="mb-2 text-sm font-medium">Draft sites</legend>
            <table className="ledger text-sm">
              <thead><tr><th scope="col" className="w-10"><span className="sr-only">Choose</span></th><th scope="col">Site</th><th scope="col" className="text-right">Price</th></tr></thead>
              <tbody>
                {drafts.map((s) => (
                  <tr key={s.id}>
                    <td><input type="checkbox" id={`buy-${s.id}`} checked={chosen.has(s.id)} onChange={() => toggle(s.id)} /></td>
                    <td><label htmlFor={`buy-${s.id}`}>{s.name}</label> <span className="tag text-muted">Draft</span></td>
                    <td className="figure">{formatMinor(price.unitAmount, price.currency)}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot><tr><th scope="row" colSpan={2}>Total for {n} {n === 1 ? 'Site audit' : 'Site audits'}</th><td className="figure">{formatMinor(price.unitAmount * n, price.currency)}</td></tr></tfoot>
            </table>
            <div className="mt-3 flex flex-wrap items-center gap-3">
              <button type="submit" className="btn btn-primary" disabled={n === 0}>{start.isPending ? 'Opening the payment page…' : `Pay for ${n} ${n === 1 ? 'Site audit' : 'Site audits'}`}</button>
              <span className="text-sm text-muted">You pay on the payment provider’s page and come back here.</span>
            </div>
          </fieldset>
          {error && <p className="notice notice-error mt-3" role="alert">{error}</p>}
        </form>
      )}
    </section>
  );
}
