import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from './QueryRoot';
import { api } from './api';
import { money, num } from '@/lib/format';
import type { SiteFindings } from '@/lib/findings/load';
import type { IntervalViews } from '@/lib/findings/interval-views';
import { QuadrantCloud } from './charts/QuadrantCloud';
import { PfDuration } from './charts/PfDuration';

function Charts({ siteId, thresholdPf }: { siteId: string; thresholdPf: number }) {
  const [bank, setBank] = useState<{ on: boolean; kind: 'fixed' | 'switched'; kvar: number }>({ on: false, kind: 'switched', kvar: 300 });
  const qs = bank.on ? `?bankKind=${bank.kind}&bankKvar=${bank.kvar}&steps=6&targetPf=0.97` : '';
  const views = useQuery({ queryKey: ['intervals', siteId, qs], queryFn: () => api<IntervalViews>(`/api/sites/${siteId}/intervals${qs}`), placeholderData: (prev) => prev });
  const findings = useQuery({ queryKey: ['findings', siteId, 'month'], queryFn: () => api<SiteFindings>(`/api/sites/${siteId}/findings?basis=month`) });

  const months = findings.data?.periods.filter((p) => p.pfCharge !== null && p.pfCharge > 0) ?? [];
  const total = months.reduce((s, p) => s + (p.pfCharge ?? 0), 0);
  const drivers = [...months].sort((a, b) => (b.pfCharge ?? 0) - (a.pfCharge ?? 0)).slice(0, 3);

  return (
    <div className="grid grid-cols-1 gap-5 lg:grid-cols-3">
      <section className="card p-4 lg:col-span-2" aria-labelledby="fc-cloud">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
          <h2 id="fc-cloud">Quadrant cloud</h2>
          <div className="flex flex-wrap items-center gap-2 text-sm">
            <label className="flex items-center gap-1"><input type="checkbox" checked={bank.on} onChange={(e) => setBank({ ...bank, on: e.target.checked })} /> Show after a bank of</label>
            <label htmlFor="fc-kvar" className="sr-only">Bank size in kvar</label>
            <input id="fc-kvar" type="number" min={10} step={10} value={bank.kvar} onChange={(e) => setBank({ ...bank, kvar: Math.max(10, Number(e.target.value) || 10) })} className="w-20 rounded border border-rule px-1" /> kvar
            <label htmlFor="fc-kind" className="sr-only">Bank type</label>
            <select id="fc-kind" value={bank.kind} onChange={(e) => setBank({ ...bank, kind: e.target.value as 'fixed' | 'switched' })} className="rounded border border-rule bg-surface px-1"><option value="switched">Switched bank (6 steps, target 0.97)</option><option value="fixed">Fixed bank</option></select>
          </div>
        </div>
        {views.isPending ? <div className="h-[380px] rounded bg-paper" aria-busy="true" aria-label="Loading intervals" /> : views.isError ? <p className="notice notice-error" role="alert">{(views.error as Error).message}</p> : views.data.intervals === 0 ? <p className="text-muted">No interval data yet.</p> : (
          <>
            <QuadrantCloud points={views.data.cloud} after={bank.on ? views.data.after?.cloud : null} thresholdPf={thresholdPf} />
            <p className="mt-1 text-xs text-muted">{num(views.data.sampled)} of {num(views.data.intervals)} {views.data.intervalMinutes}-minute intervals shown{views.data.sampled < views.data.intervals ? ' (evenly spaced sample)' : ''}{views.data.exportPoints > 0 ? `; ${num(views.data.exportPoints)} exporting intervals sit left of the kvar axis and have no PF` : ''}.{bank.on && views.data.after ? ` With the bank: ${num(views.data.after.leadingHours, 1)} h leading.` : ''}</p>
          </>
        )}
      </section>
      <section className="card p-4" aria-labelledby="fc-drivers">
        <h2 id="fc-drivers" className="mb-2">Months that drive the cost</h2>
        {findings.isPending ? <div className="h-40" aria-busy="true" /> : drivers.length === 0 ? <p className="text-muted">No PF charge computed yet.</p> : (
          <ol className="flex flex-col gap-2 text-sm">
            {drivers.map((m) => (
              <li key={m.id}>
                <div className="flex justify-between"><span>{m.label}</span><span className="font-mono text-cost">{money(m.pfCharge, findings.data!.currency)}</span></div>
                <div className="h-2 rounded bg-paper"><div className="h-2 rounded bg-cost" style={{ width: `${((m.pfCharge ?? 0) / (drivers[0]!.pfCharge || 1)) * 100}%` }} /></div>
                <p className="text-xs text-muted">{((100 * (m.pfCharge ?? 0)) / total).toFixed(0)} % of the period’s PF cost · average PF {m.metrics.pfAvgLagging?.toFixed(3)} · peak {num(m.metrics.peakKw)} kW at PF {m.metrics.peakPf?.toFixed(3)}</p>
              </li>
            ))}
          </ol>
        )}
      </section>
      <section className="card p-4 lg:col-span-3" aria-labelledby="fc-dur">
        <h2 id="fc-dur" className="mb-2">PF duration curve</h2>
        {views.data && views.data.duration.length > 0 ? <PfDuration before={views.data.duration} after={bank.on ? views.data.after?.duration : null} thresholdPf={thresholdPf} /> : <div className="h-[260px]" />}
      </section>
    </div>
  );
}

export default function FindingsCharts(props: { siteId: string; thresholdPf: number }) {
  return <QueryRoot><Charts {...props} /></QueryRoot>;
}
