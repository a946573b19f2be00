/** The last 12 months' PF charges under the draft, beside the saved tariff: a bar chart and the table. */
import { BarElement, CategoryScale, Chart as ChartJS, Legend, LinearScale, Tooltip } from 'chart.js';
import { Bar } from 'react-chartjs-2';
import type { UseQueryResult } from '@tanstack/react-query';
import { money } from '@/lib/format';
import type { TariffPreview } from '@/lib/tariff-editor/preview';

ChartJS.register(BarElement, CategoryScale, LinearScale, Tooltip, Legend);

const INK = '#1d2430';
const COST = '#b23a2a';
const RULE = '#d9d4c7';

/** A signed change with its word, so the sense never rests on colour alone. */
export function Change({ amount, currency, compact = false }: { amount: number | null; currency: string; compact?: boolean }) {
  if (amount === null) return <span className="text-muted">—</span>;
  if (Math.abs(amount) < 0.005) return <span>{compact ? '0.00' : 'no change'}</span>;
  const up = amount > 0;
  return (
    <span className={up ? 'text-cost' : 'text-saving'}>
      {up ? '+' : '−'}{money(Math.abs(amount), currency)} <span className={compact ? 'sr-only' : 'unit'}>{up ? 'more' : 'less'}</span>
    </span>
  );
}

/** "January 2025" -> "Jan 2025" (or "Jan 25" for chart ticks). */
const shortMonth = (label: string, twoDigitYear = false) => {
  const [m, y] = label.split(' ');
  return `${m?.slice(0, 3)} ${twoDigitYear ? y?.slice(2) : y}`;
};

export function PreviewPanel({ q, valid, waiting, siteId }: { q: UseQueryResult<{ preview: TariffPreview }>; valid: boolean; waiting: boolean; siteId: string }) {
  const p = q.data?.preview;
  const status = !valid ? 'Fix the fields marked in the form to update the preview.' : waiting || q.isFetching ? 'Updating the preview…' : p ? 'Up to date with the form.' : '';
  return (
    <section aria-labelledby="preview-heading" className="card flex min-h-[34rem] flex-col gap-3 p-4">
      <div>
        <h3 id="preview-heading" className="font-semibold">Preview: last 12 months</h3>
        <p className="text-[0.8125rem] text-muted" role="status" aria-live="polite">{status}</p>
      </div>
      {q.isError && <p className="notice notice-error" role="alert">{(q.error as Error).message}</p>}
      {!p && !q.isError && <div className="h-[28rem] animate-pulse rounded border border-rule bg-paper" aria-busy="true" aria-label="Loading the preview" />}
      {p && !p.hasData && (
        <div className="notice">
          <p>No meter data for this site yet: upload meter data to preview charges.</p>
          <p className="mt-1"><a href={`/sites/${siteId}/meter-data`}>Go to Meter data</a></p>
        </div>
      )}
      {p && p.hasData && <PreviewBody p={p} />}
    </section>
  );
}

function PreviewBody({ p }: { p: TariffPreview }) {
  const change = p.saved ? p.total - p.saved.total : null;
  return (
    <>
      <dl className="grid grid-cols-2 gap-2">
        <div className="rounded border border-rule p-2">
          <dt className="text-[0.8125rem] text-muted">This draft</dt>
          <dd className="figure text-left text-lg text-cost" data-testid="preview-total">{money(p.total, p.currency)}</dd>
        </div>
        <div className="rounded border border-rule p-2">
          <dt className="text-[0.8125rem] text-muted">Against the saved tariff</dt>
          <dd className="figure text-left text-lg" data-testid="preview-change">{p.saved ? <Change amount={change} currency={p.currency} /> : <span className="text-muted">nothing saved</span>}</dd>
        </div>
      </dl>
      <div className="h-40" >
        <Bar
          role="img"
          aria-label={`Bar chart of the monthly PF charge, this draft against the saved tariff; the table below gives the figures.`}
          data={{
            labels: p.months.map((m) => shortMonth(m.label, true)),
            datasets: [
              { label: 'This draft', data: p.months.map((m) => m.pfCharge), backgroundColor: COST, borderWidth: 0 },
              ...(p.saved ? [{ label: 'Saved', data: p.months.map((m) => m.savedPfCharge ?? 0), backgroundColor: RULE, borderColor: INK, borderWidth: 1 }] : []),
            ],
          }}
          options={{
            responsive: true,
            maintainAspectRatio: false,
            animation: false,
            plugins: { legend: { position: 'bottom', labels: { boxWidth: 10, font: { family: 'IBM Plex Sans', size: 11 }, color: INK } }, tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${money(c.parsed.y, p.currency)}` } } },
            scales: {
              x: { grid: { display: false }, ticks: { font: { family: 'IBM Plex Sans', size: 10 }, color: INK } },
              y: { beginAtZero: true, grid: { color: RULE }, ticks: { font: { family: 'IBM Plex Mono', size: 10 }, color: INK, callback: (v) => money(Number(v), p.currency, 0) } },
            },
          }}
        />
      </div>
      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Monthly PF charges">
        <table className="ledger text-[0.8125rem] [&_td]:px-1.5 [&_th]:px-1.5">
          <caption className="sr-only">PF charge per month under this draft and the saved tariff, in {p.currency}</caption>
          <thead>
            <tr>
              <th scope="col">Month</th>
              <th scope="col" className="text-right">Draft</th>
              <th scope="col" className="text-right">Saved</th>
              <th scope="col" className="text-right">Change</th>
            </tr>
          </thead>
          <tbody>
            {p.months.map((m) => (
              <tr key={m.id}>
                <th scope="row" className="whitespace-nowrap">{shortMonth(m.label)}{m.completeness < 0.98 && <span className="text-muted" title="Not all intervals of this month are in the data"> *</span>}</th>
                <td className="figure">{money(m.pfCharge, p.currency)}</td>
                <td className="figure">{money(m.savedPfCharge, p.currency)}</td>
                <td className="figure"><Change amount={m.savedPfCharge === null ? null : m.pfCharge - m.savedPfCharge} currency={p.currency} compact /></td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <th scope="row">Total</th>
              <td className="figure">{money(p.total, p.currency)}</td>
              <td className="figure">{money(p.saved?.total, p.currency)}</td>
              <td className="figure"><Change amount={change} currency={p.currency} compact /></td>
            </tr>
          </tfoot>
        </table>
      </div>
      {p.byRule.length > 1 && (
        <ul className="text-[0.8125rem]">
          {p.byRule.map((r) => <li key={r.ruleId} className="flex justify-between gap-2"><span>{r.ruleLabel}</span><span className="figure">{money(r.total, p.currency)}</span></li>)}
        </ul>
      )}
      {p.saved && <p className="text-[0.8125rem] text-muted">Compared with {p.saved.label}.</p>}
      {p.notes.map((n) => <p key={n} className="text-[0.8125rem] text-muted">{n}</p>)}
    </>
  );
}
