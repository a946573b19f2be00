import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot';
import { api, ApiClientError } from '../api';
import { money } from '@/lib/format';

type Report = { id: string; title: string; issuedAt: string; issuedBy: string | null; planName: string | null; annualSaving: number | null; paybackYears: number | null; currency: string };
type Plan = { id: string; name: string; summary?: { kind?: string; kvar?: number; annualSaving?: number; paybackYears?: number | null; currency?: string } | null };

function Panel({ siteId, siteName, canIssue, paid }: { siteId: string; siteName: string; canIssue: boolean; paid: boolean }) {
  const qc = useQueryClient();
  const reports = useQuery({ queryKey: ['reports', siteId], queryFn: () => api<{ reports: Report[] }>(`/api/sites/${siteId}/reports`) });
  const plans = useQuery({ queryKey: ['plans', siteId], queryFn: () => api<{ plans: Plan[] }>(`/api/sites/${siteId}/plans`), enabled: canIssue });
  const [planId, setPlanId] = useState('');
  const [title, setTitle] = useState(`Power-factor savings report: ${siteName}`);
  const [error, setError] = useState<{ message: string; status: number } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const issue = useMutation({
    mutationFn: () => api<{ report: Report; notified: string[] }>(`/api/sites/${siteId}/reports`, { method: 'POST', body: { planId, title } }),
    onSuccess: (r) => { setError(null); setDone(`Issued “${r.report.title}”. ${r.notified.length ? `Finance (${r.notified.join(', ')}) was sent a link.` : 'No Finance member to notify in this workspace.'}`); qc.invalidateQueries({ queryKey: ['reports', siteId] }); },
    onError: (e) => setError(e instanceof ApiClientError ? { message: e.message, status: e.status } : { message: 'Could not issue the report.', status: 0 }),
  });

  return (
    <div className="flex flex-col gap-5">
      {canIssue && (
        <section className="card flex flex-col gap-3 p-4" aria-labelledby="issue-h">
          <h2 id="issue-h">Issue a Savings report</h2>
          {!paid && <p className="notice" role="status">{siteName} is a Draft: its findings become final and a report can be issued once its Site audit is paid. <a href="/purchases">Go to Purchases</a>.</p>}
          {plans.data && plans.data.plans.length === 0 && <p className="text-muted">No saved plan yet: build and save one on the Correction page first.</p>}
          {plans.data && plans.data.plans.length > 0 && (
            <div className="flex flex-wrap items-end gap-3">
              <div className="field"><label htmlFor="r-plan">Recommended plan</label>
                <select id="r-plan" value={planId} onChange={(e) => setPlanId(e.target.value)} className="rounded border border-rule bg-surface px-2 py-1">
                  <option value="">Choose a saved plan…</option>
                  {plans.data.plans.map((p) => <option key={p.id} value={p.id}>{p.name}{p.summary?.annualSaving !== undefined ? ` · saves ${money(p.summary.annualSaving, p.summary.currency ?? 'USD', 0)}/yr` : ''}{p.summary?.paybackYears != null ? ` · payback ${p.summary.paybackYears.toFixed(1)} yr` : ''}</option>)}
                </select></div>
              <div className="field grow"><label htmlFor="r-title">Title</label><input id="r-title" value={title} onChange={(e) => setTitle(e.target.value)} /></div>
              <button className="btn btn-primary" disabled={!planId || issue.isPending} onClick={() => issue.mutate()}>{issue.isPending ? 'Issuing…' : 'Issue report'}</button>
            </div>
          )}
          {error && <p className="notice notice-error" role="alert">{error.message}{error.status === 402 && <> <a href="/purchases">Buy the Site audit</a>.</>}</p>}
          {done && <p className="notice notice-ok" role="status">{done}</p>}
          <p className="text-xs text-muted">Issuing freezes the figures as they are now, sets the site to Reported and e-mails the workspace’s Finance members a link. Every report carries the capacitor cautions and the method notes.</p>
        </section>
      )}
      <section aria-labelledby="list-h" className="flex flex-col gap-2">
        <h2 id="list-h">Issued reports</h2>
        {reports.isPending && <div className="h-24 rounded border border-rule bg-surface" aria-busy="true" />}
        {reports.isError && <p className="notice notice-error" role="alert">{(reports.error as Error).message}</p>}
        {reports.data?.reports.length === 0 && <p className="card p-4 text-muted">No report issued for this site yet.</p>}
        {reports.data && reports.data.reports.length > 0 && (
          <div className="overflow-x-auto rounded border border-rule">
            <table className="ledger text-sm">
              <thead><tr><th scope="col">Issued</th><th scope="col">Title</th><th scope="col">Plan</th><th scope="col" className="text-right">Annual saving</th><th scope="col" className="text-right">Payback</th><th scope="col"><span className="sr-only">Open</span></th></tr></thead>
              <tbody>{reports.data.reports.map((r) => (
                <tr key={r.id}>
                  <td className="whitespace-nowrap">{new Date(r.issuedAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })}{r.issuedBy && <div className="text-xs text-muted">{r.issuedBy}</div>}</td>
                  <td>{r.title}</td><td>{r.planName}</td>
                  <td className="figure text-saving">{money(r.annualSaving, r.currency, 0)}</td>
                  <td className="figure">{r.paybackYears === null ? 'not paid back' : `${r.paybackYears.toFixed(1)} yr`}</td>
                  <td className="whitespace-nowrap"><a href={`/sites/${siteId}/reports/${r.id}`}>Open</a> · <a href={`/api/sites/${siteId}/reports/${r.id}/pdf?download=1`}>PDF</a></td>
                </tr>
              ))}</tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}

export default function ReportPanel(props: { siteId: string; siteName: string; canIssue: boolean; paid: boolean }) {
  return <QueryRoot><Panel {...props} /></QueryRoot>;
}
