import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from './QueryRoot';
import { api } from './api';
import { money, num, pct } from '@/lib/format';
import type { SiteFindings } from '@/lib/findings/load';
import { MonthlyCharges } from './charts/MonthlyCharges';
import { PfTrend } from './charts/PfTrend';
import { PhaseDial } from './charts/PhaseDial';

/** One sentence a consultant can say to the client about the last twelve months. */
export function headline(f: SiteFindings, months: SiteFindings['periods'], thresholdPf: number): string {
  if (months.length === 0) return 'No interval data yet: upload the meter export to see what poor power factor costs this site.';
  const pfs = months.map((m) => m.metrics.pfAvgLagging).filter((x): x is number => x !== null);
  const kwh = months.reduce((s, m) => s + m.metrics.kwh, 0);
  const lag = months.reduce((s, m) => s + m.metrics.kvarhLag, 0);
  const avg = kwh / Math.hypot(kwh, lag);
  const below = pfs.filter((p) => p < thresholdPf).length;
  const span = `Over ${months.length === 12 ? 'the last 12 months' : `the ${months.length} months of data`}`;
  if (!f.currency || months.every((m) => m.pfCharge === null)) return `${span} the average PF was ${avg.toFixed(3)} lagging, below ${thresholdPf.toFixed(2)} in ${below} of ${months.length} months. Enter the tariff to put a price on it.`;
  const total = months.reduce((s, m) => s + (m.pfCharge ?? 0), 0);
  const worst = months.reduce((a, b) => ((b.pfCharge ?? 0) > (a.pfCharge ?? 0) ? b : a));
  return `${span} ${f.site.name} paid ${money(total, f.currency, 0)} in power-factor charges; the average PF was ${avg.toFixed(3)} lagging, below the ${thresholdPf.toFixed(2)} threshold in ${below} of ${months.length} months, and ${worst.label} cost most (${money(worst.pfCharge, f.currency, 0)}).`;
}

function Overview({ siteId, thresholdPf }: { siteId: string; thresholdPf: number }) {
  const q = useQuery({ queryKey: ['findings', siteId, 'month'], queryFn: () => api<SiteFindings>(`/api/sites/${siteId}/findings?basis=month`) });
  if (q.isPending) return <div className="flex flex-col gap-4" aria-busy="true" aria-label="Loading the overview"><div className="h-12 rounded border border-rule bg-surface" /><div className="h-[300px] rounded border border-rule bg-surface" /><div className="h-[280px] rounded border border-rule bg-surface" /></div>;
  if (q.isError) return <p className="notice notice-error" role="alert">{(q.error as Error).message}</p>;
  const f = q.data;
  const months = f.periods.filter((p) => p.metrics.presentIntervals > 0).slice(-12);
  const currency = f.currency ?? 'USD';
  return (
    <div className="flex flex-col gap-5">
      <p className="card p-4 text-base" data-testid="headline">{headline(f, months, thresholdPf)}</p>
      {months.length > 0 && (
        <>
          <section className="card p-4" aria-labelledby="ov-dials">
            <h2 id="ov-dials" className="mb-2">Average PF by month</h2>
            <ul className="grid grid-cols-3 gap-3 sm:grid-cols-6 lg:grid-cols-12">
              {months.map((m) => (
                <li key={m.id} className="flex flex-col items-center text-xs">
                  <PhaseDial pf={m.metrics.pfAvgLagging} thresholdPf={thresholdPf} size={40} />
                  <span className="font-mono">{m.metrics.pfAvgLagging?.toFixed(3) ?? '—'}</span>
                  <span className="text-muted">{m.label.slice(0, 3)} {m.label.slice(-2)}</span>
                </li>
              ))}
            </ul>
          </section>
          <section className="card p-4" aria-labelledby="ov-charges">
            <h2 id="ov-charges" className="mb-2">PF charge by month, by tariff rule</h2>
            {f.currency ? <MonthlyCharges currency={currency} months={months.map((m) => ({ label: m.label, rules: m.rules.map((r) => ({ ruleLabel: r.ruleLabel, amount: r.amount })) }))} /> : <p className="text-muted">No tariff entered: the charges appear once the tariff’s PF rules are in.</p>}
            <table className="sr-only"><caption>PF charge by month</caption><tbody>{months.map((m) => <tr key={m.id}><th scope="row">{m.label}</th><td>{money(m.pfCharge, currency)}</td></tr>)}</tbody></table>
          </section>
          <section className="card p-4" aria-labelledby="ov-pf">
            <h2 id="ov-pf" className="mb-2">Average PF and PF at peak against the threshold</h2>
            <PfTrend thresholdPf={thresholdPf} months={months.map((m) => ({ label: m.label.slice(0, 3), avg: m.metrics.pfAvgLagging, atPeak: m.metrics.peakPfSense === 'lead' ? null : m.metrics.peakPf }))} />
          </section>
          <p className="text-xs text-muted">{num(months.reduce((s, m) => s + m.metrics.kwh, 0))} kWh over {months.length} months · data coverage {pct(months.reduce((s, m) => s + m.metrics.presentIntervals, 0) / Math.max(1, months.reduce((s, m) => s + m.metrics.expectedIntervals, 0)))} · {f.status === 'final' ? 'findings final (Site audit paid)' : 'findings in Draft until the Site audit is paid'}</p>
        </>
      )}
    </div>
  );
}

export default function SiteOverview(props: { siteId: string; thresholdPf: number }) {
  return <QueryRoot><Overview {...props} /></QueryRoot>;
}
