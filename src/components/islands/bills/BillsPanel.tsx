import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { money, num, pct } from '@/lib/format';
import { QueryRoot } from '../QueryRoot';
import { api, ApiClientError } from '../api';
import { uploadWithProgress } from '../meter-data/upload';
import { BillForm } from './BillForm';
import { BillImport } from './BillImport';

type Bill = { id: string; periodStart: string; periodEnd: string; kwh: number; billedDemand: number | null; demandUnit: 'kW' | 'kVA'; pf: number | null; pfCharge: number | null; total: number | null; currency: string; hasDocument: boolean };
type Cmp = { billed: number | null; computed: number | null; difference: number | null; flagged: boolean };
type Rec = { currency: string; disputable: number; multiplier: { suspected: boolean; message: string | null }; notes: string[]; bills: { billId: string; periodStart: string; periodEnd: string; completeness: number; compared: boolean; kwh: Cmp & { ratio: number | null }; demand: Cmp & { unit: string }; pf: Cmp; pfCharge: Cmp; disputable: number; notes: string[] }[] };

function Cell({ c, fmt }: { c: Cmp; fmt: (x: number | null) => string }) {
  return (
    <td className={`figure ${c.flagged ? 'bg-[#fbeae7] text-cost' : ''}`}>
      <div>{fmt(c.billed)}</div>
      <div className="text-xs text-muted">{c.computed === null ? 'not computed' : `computed ${fmt(c.computed)}`}</div>
      {c.flagged && <div className="text-xs font-medium">differs ▲</div>}
    </td>
  );
}

function Panel({ siteId, currency, canEdit }: { siteId: string; currency: string; canEdit: boolean }) {
  const qc = useQueryClient();
  const bills = useQuery({ queryKey: ['bills', siteId], queryFn: () => api<{ bills: Bill[] }>(`/api/sites/${siteId}/bills`) });
  const rec = useQuery({ queryKey: ['reconciliation', siteId], queryFn: () => api<Rec>(`/api/sites/${siteId}/reconciliation`) });
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);
  const [viewing, setViewing] = useState<Bill | null>(null);
  const refresh = () => { qc.invalidateQueries({ queryKey: ['bills', siteId] }); qc.invalidateQueries({ queryKey: ['reconciliation', siteId] }); };
  const add = useMutation({
    mutationFn: (b: unknown) => api(`/api/sites/${siteId}/bills`, { method: 'POST', body: b }),
    onSuccess: () => { setServerErrors({}); setNotice({ ok: true, text: 'Bill added.' }); refresh(); },
    onError: (e) => setServerErrors(e instanceof ApiClientError ? { ...e.fields, form: e.message } : { form: 'Could not save the bill.' }),
  });
  const remove = useMutation({ mutationFn: (id: string) => api(`/api/sites/${siteId}/bills/${id}`, { method: 'DELETE' }), onSuccess: refresh });

  async function attach(b: Bill, f: File) {
    const form = new FormData();
    form.append('file', f, f.name);
    const r = await uploadWithProgress(`/api/sites/${siteId}/bills/${b.id}/document`, form, () => undefined);
    setNotice(r.status === 201 ? { ok: true, text: `Document attached to the bill ${b.periodStart} to ${b.periodEnd}.` } : { ok: false, text: r.body?.error?.message ?? 'Could not attach the document.' });
    refresh();
  }

  const byBill = new Map(rec.data?.bills.map((r) => [r.billId, r]));
  const cur = rec.data?.currency ?? currency;
  return (
    <div className="flex flex-col gap-6">
      {notice && <p className={`notice ${notice.ok ? 'notice-ok' : 'notice-error'}`} role={notice.ok ? 'status' : 'alert'}>{notice.text}</p>}
      <section aria-labelledby="rec-h" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="rec-h">Billed against computed</h2>
          {rec.data && <p className="text-sm">Disputable: <span className={`figure inline text-base ${rec.data.disputable > 0 ? 'text-cost' : ''}`}>{money(rec.data.disputable, cur)}</span></p>}
        </div>
        {rec.isPending && <div className="h-40 animate-pulse rounded border border-rule bg-surface" aria-busy="true" aria-label="Loading reconciliation" />}
        {rec.isError && <p className="notice notice-error" role="alert">{(rec.error as Error).message}</p>}
        {rec.data?.multiplier.suspected && <p className="notice notice-error" role="alert">{rec.data.multiplier.message}</p>}
        {rec.data?.notes.map((n) => <p key={n} className="notice">{n}</p>)}
        {bills.data && bills.data.bills.length > 0 && (
          <div className="overflow-x-auto rounded border border-rule">
            <table className="ledger text-sm">
              <thead><tr><th scope="col">Billing period</th><th scope="col" className="text-right">Energy (kWh)</th><th scope="col" className="text-right">Demand</th><th scope="col" className="text-right">Power factor</th><th scope="col" className="text-right">PF charge</th><th scope="col" className="text-right">Disputable</th><th scope="col">Document</th>{canEdit && <th scope="col"><span className="sr-only">Actions</span></th>}</tr></thead>
              <tbody>
                {bills.data.bills.map((b) => {
                  const r = byBill.get(b.id);
                  return (
                    <tr key={b.id}>
                      <th scope="row">
                        {b.periodStart} to {b.periodEnd}
                        {r && !r.compared && <div className="text-xs text-cost">{r.notes[0]}</div>}
                        {r?.compared && <div className="text-xs text-muted">data {pct(r.completeness)}</div>}
                      </th>
                      {r ? <Cell c={r.kwh} fmt={(x) => num(x)} /> : <td />}
                      {r ? <Cell c={r.demand} fmt={(x) => (x === null ? '—' : `${num(x, 1)} ${r.demand.unit}`)} /> : <td />}
                      {r ? <Cell c={r.pf} fmt={(x) => (x === null ? '—' : x.toFixed(3))} /> : <td />}
                      {r ? <Cell c={r.pfCharge} fmt={(x) => money(x, cur)} /> : <td />}
                      <td className={`figure ${r && r.disputable > 0 ? 'text-cost' : ''}`}>{r ? money(r.disputable, cur) : '—'}</td>
                      <td>
                        {b.hasDocument ? <button className="btn btn-quiet text-xs" onClick={() => setViewing(b)}>View</button> : <span className="text-muted">none</span>}
                        {canEdit && <label className="btn btn-quiet ml-1 text-xs">Attach…<input type="file" className="sr-only" accept="application/pdf,image/png,image/jpeg" aria-label={`Attach the document of the bill ${b.periodStart} to ${b.periodEnd}`} onChange={(e) => e.target.files?.[0] && attach(b, e.target.files[0])} /></label>}
                      </td>
                      {canEdit && <td><button className="btn btn-danger text-xs" aria-label={`Delete the bill ${b.periodStart} to ${b.periodEnd}`} onClick={() => window.confirm('Delete this bill?') && remove.mutate(b.id)}>Delete</button></td>}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
        {bills.data?.bills.length === 0 && <p className="card p-4 text-muted">No bills yet. {canEdit ? 'Enter the last twelve bills below, or import a bill history CSV.' : 'An Energy manager or Consultant enters them.'}</p>}
        <p className="text-xs text-muted">Flagged when kWh or demand differ by more than 2 %, PF by more than 0.005, or the PF charge by more than the larger of 5 {cur} and 2 %. Periods without complete interval data are not compared.</p>
      </section>

      {viewing && (
        <section aria-labelledby="doc-h" className="card flex flex-col gap-2 p-3">
          <div className="flex items-center justify-between"><h2 id="doc-h">Bill {viewing.periodStart} to {viewing.periodEnd}</h2><div className="flex gap-2"><a className="btn btn-quiet text-sm no-underline" href={`/api/sites/${siteId}/bills/${viewing.id}/document?download=1`}>Download</a><button className="btn btn-quiet text-sm" onClick={() => setViewing(null)}>Close</button></div></div>
          <iframe title={`Bill document ${viewing.periodStart} to ${viewing.periodEnd}`} src={`/api/sites/${siteId}/bills/${viewing.id}/document`} className="h-[70vh] w-full rounded border border-rule bg-white" />
        </section>
      )}

      {canEdit && (
        <>
          <section aria-labelledby="add-h" className="card p-4"><h2 id="add-h" className="mb-3">Enter a bill</h2><BillForm currency={currency} busy={add.isPending} serverErrors={serverErrors} onSubmit={(b) => add.mutate(b)} /></section>
          <section aria-labelledby="imp-h" className="card p-4"><h2 id="imp-h" className="mb-3">Import a bill history</h2><BillImport siteId={siteId} currency={currency} onDone={(text) => { setNotice({ ok: true, text }); refresh(); }} /></section>
        </>
      )}
    </div>
  );
}

export default function BillsPanel(props: { siteId: string; currency: string; canEdit: boolean }) {
  return <QueryRoot><Panel {...props} /></QueryRoot>;
}
