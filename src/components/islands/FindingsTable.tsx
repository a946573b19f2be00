import { Fragment, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from './QueryRoot';
import { api } from './api';
import { money, num, pct, pf } from '@/lib/format';
import type { SiteFindings } from '@/lib/findings/load';

function Table({ siteId }: { siteId: string }) {
  const [basis, setBasis] = useState<'month' | 'billing'>('month');
  const [open, setOpen] = useState<string | null>(null);
  const q = useQuery({ queryKey: ['findings', siteId, basis], queryFn: () => api<SiteFindings>(`/api/sites/${siteId}/findings?basis=${basis}`) });

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <label htmlFor="basis" className="text-sm font-medium">Periods</label>
        <select id="basis" className="rounded border border-rule bg-surface px-2 py-1 text-sm" value={basis} onChange={(e) => setBasis(e.target.value as 'month' | 'billing')}>
          <option value="month">Calendar months</option>
          <option value="billing">Billing periods (from the bills)</option>
        </select>
        {q.data && <span className={`tag ${q.data.status === 'final' ? 'text-active' : 'text-muted'}`}>{q.data.status === 'final' ? 'Final' : 'Draft: final once the Site audit is paid'}</span>}
      </div>
      {q.isPending && <div className="h-64 animate-pulse rounded border border-rule bg-surface" aria-busy="true" aria-label="Loading findings" />}
      {q.isError && <p className="notice notice-error" role="alert">{(q.error as Error).message}</p>}
      {q.data && (
        <>
          {q.data.notes.map((n) => <p key={n} className="notice">{n}</p>)}
          <div className="overflow-x-auto rounded border border-rule">
            <table className="ledger text-sm">
              <thead>
                <tr>
                  <th scope="col">Period</th>
                  <th scope="col" className="text-right">Energy</th>
                  <th scope="col" className="text-right">Lagging</th>
                  <th scope="col" className="text-right">Leading</th>
                  <th scope="col" className="text-right">Average PF</th>
                  <th scope="col" className="text-right">Peak demand</th>
                  <th scope="col" className="text-right">PF at peak</th>
                  <th scope="col" className="text-right">Data</th>
                  <th scope="col" className="text-right">PF charge</th>
                  <th scope="col"><span className="sr-only">Details</span></th>
                </tr>
              </thead>
              <tbody>
                {q.data.periods.map((p) => (
                  <Fragment key={p.id}>
                    <tr>
                      <th scope="row" className="text-left font-normal">{p.label}</th>
                      <td className="figure">{num(p.metrics.kwh)}<span className="unit">kWh</span></td>
                      <td className="figure text-lagging">{num(p.metrics.kvarhLag)}<span className="unit">kvarh</span></td>
                      <td className="figure text-leading-ink">{num(p.metrics.kvarhLead)}<span className="unit">kvarh</span></td>
                      <td className="figure">{pf(p.metrics.pfAvgLagging, 'lag')}</td>
                      <td className="figure">{num(p.metrics.peakKw, 1)}<span className="unit">kW</span></td>
                      <td className="figure">{pf(p.metrics.peakPf, p.metrics.peakPfSense)}</td>
                      <td className={`figure ${p.metrics.completeness < 0.99 ? 'text-cost' : ''}`}>{pct(p.metrics.completeness)}</td>
                      <td className="figure text-cost">{money(p.pfCharge, q.data.currency)}</td>
                      <td>{p.rules.length > 0 && <button className="btn btn-quiet text-xs" aria-expanded={open === p.id} onClick={() => setOpen(open === p.id ? null : p.id)}>{open === p.id ? 'Hide' : 'Explain'}</button>}</td>
                    </tr>
                    {open === p.id && (
                      <tr>
                        <td colSpan={10} className="bg-paper">
                          <ul className="flex flex-col gap-2 py-1">
                            {p.rules.map((r) => (
                              <li key={r.ruleId}>
                                <span className="font-medium">{r.ruleLabel}</span>{r.windowLabel && <span className="text-muted"> · {r.windowLabel}</span>}: <span className="figure inline">{money(r.amount, q.data.currency)}</span>
                                <p className="text-muted">{r.explanation}</p>
                              </li>
                            ))}
                            {p.warnings.map((w) => <li key={w} className="text-cost">{w}</li>)}
                          </ul>
                        </td>
                      </tr>
                    )}
                  </Fragment>
                ))}
              </tbody>
              <tfoot>
                <tr className="font-medium">
                  <th scope="row" className="text-left">Total</th>
                  <td className="figure">{num(q.data.totals.kwh)}<span className="unit">kWh</span></td>
                  <td className="figure">{num(q.data.totals.kvarhLag)}<span className="unit">kvarh</span></td>
                  <td className="figure">{num(q.data.totals.kvarhLead)}<span className="unit">kvarh</span></td>
                  <td colSpan={4} />
                  <td className="figure text-cost">{q.data.currency ? money(q.data.totals.pfCharge, q.data.currency) : '—'}</td>
                  <td />
                </tr>
              </tfoot>
            </table>
          </div>
        </>
      )}
    </div>
  );
}

export default function FindingsTable(props: { siteId: string }) {
  return <QueryRoot><Table {...props} /></QueryRoot>;
}
