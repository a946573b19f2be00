/** What a plan does on this site: charges before and after, leading operation, screening and economics. */
import { money, num, pct, pf } from '@/lib/format';
import { MonthlyCharges } from '../charts/MonthlyCharges';
import { years, type PlanEvaluation } from './types';

function Figure({ label, children, tone }: { label: string; children: React.ReactNode; tone?: string }) {
  return (
    <div className="flex flex-col border-l border-rule pl-3">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className={`figure whitespace-normal text-left text-base ${tone ?? ''}`}>{children}</dd>
    </div>
  );
}

export function EvaluationPanel({ ev, stale }: { ev: PlanEvaluation; stale: boolean }) {
  const e = ev.economics;
  const c = ev.currency;
  const s = ev.screening;
  return (
    <section aria-labelledby="eval-h" className="card flex min-w-0 flex-col gap-3 p-3" aria-busy={stale || undefined}>
      <div className="flex flex-wrap items-baseline gap-2">
        <h2 id="eval-h">Evaluation{ev.plan.name ? `: ${ev.plan.name}` : ''}</h2>
        {stale && <span className="text-xs text-muted">updating…</span>}
        <span className="text-sm text-muted">under {ev.tariffName}</span>
      </div>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Figure label="PF charges a year, now" tone="text-cost">{money(ev.totals.annualBefore, c, 0)}</Figure>
        <Figure label="With the plan" tone="text-cost">{money(ev.totals.annualAfter, c, 0)}</Figure>
        <Figure label="Saving a year" tone="text-saving">{money(e.annualSaving, c, 0)}</Figure>
        <Figure label="Average PF">{pf(ev.pf.before)} → {pf(ev.pf.after)}<span className="unit">lag</span></Figure>
        <Figure label="Capex">{money(e.capex, c, 0)}</Figure>
        <Figure label="O&M a year">{money(e.omPerYear, c, 0)}</Figure>
        <Figure label="Simple payback">{e.paybackYears === null ? <span className="text-cost">not paid back</span> : <>{years(e.paybackYears)}<span className="unit">years</span></>}</Figure>
        <Figure label={`NPV, ${e.lifeYears} years at ${pct(e.discountRate)}`} tone={e.npv < 0 ? 'text-cost' : ''}>{money(e.npv, c, 0)}</Figure>
        <Figure label="IRR">{e.irr === null ? 'none' : pct(e.irr)}</Figure>
        <Figure label="Bank">{num(ev.plan.kvar, 1)}<span className="unit">kvar rated</span>{Math.abs(ev.plan.effectiveKvar - ev.plan.kvar) > 0.05 && <> · {num(ev.plan.effectiveKvar, 1)}<span className="unit">kvar delivered</span></>}</Figure>
      </dl>

      {ev.leading.goesLeading && (
        <p className="notice border-l-leading text-sm" role="status" data-testid="leading-warning">
          <span className="font-medium text-leading-ink">▼ Leading:</span> {ev.leading.message}
        </p>
      )}

      <div>
        <h3 className="text-sm font-medium">PF charge by month: now, stacked by rule, and with the plan</h3>
        <MonthlyCharges months={ev.months.map((m) => ({ label: m.label, rules: m.rules.map((r) => ({ ruleLabel: r.ruleLabel, amount: r.before })), after: m.after }))} currency={c} afterLabel="With the plan" />
      </div>

      <details>
        <summary className="cursor-pointer text-sm font-medium">Month by month</summary>
        <div className="mt-2 overflow-x-auto rounded border border-rule">
          <table className="ledger text-sm">
            <thead><tr><th scope="col">Month</th><th scope="col" className="text-right">Now</th><th scope="col" className="text-right">With the plan</th><th scope="col" className="text-right">Saving</th><th scope="col" className="text-right">Leading</th></tr></thead>
            <tbody>
              {ev.months.map((m) => (
                <tr key={m.periodId}>
                  <th scope="row">{m.label}</th>
                  <td className="figure text-cost">{money(m.before, c)}</td>
                  <td className="figure">{money(m.after, c)}</td>
                  <td className="figure text-saving">{money(m.saving, c)}</td>
                  <td className={`figure ${m.overCorrected ? 'text-leading-ink' : ''}`}>{num(m.leadingHours, 1)}<span className="unit">h</span>{m.overCorrected && ' ▼ over-corrected'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>

      <div>
        <h3 className="text-sm font-medium">Sensitivity of the tariff savings</h3>
        <div className="mt-1 overflow-x-auto">
        <table className="ledger text-sm">
          <thead><tr><th scope="col">Savings</th><th scope="col" className="text-right">Saving a year</th><th scope="col" className="text-right">Payback</th><th scope="col" className="text-right">NPV</th><th scope="col" className="text-right">IRR</th></tr></thead>
          <tbody>
            {e.sensitivity.map((x) => (
              <tr key={x.savingsFactor}>
                <th scope="row">{Math.round(x.savingsFactor * 100)} %</th>
                <td className="figure">{money(x.annualSaving, c, 0)}</td>
                <td className="figure">{x.paybackYears === null ? 'not paid back' : <>{years(x.paybackYears)}<span className="unit">years</span></>}</td>
                <td className="figure">{money(x.npv, c, 0)}</td>
                <td className="figure">{x.irr === null ? 'none' : pct(x.irr)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
        {e.optional.length > 0 && (
          <ul className="mt-2 text-sm">
            {e.optional.map((o) => <li key={o.label}>{o.label}: <span className="figure inline">{money(o.perYear, c, 0)}</span><span className="unit">a year</span></li>)}
            <li className="text-muted">{e.optionalCounted ? 'Counted in the figures above.' : 'Shown apart; not counted in the figures above.'}</li>
          </ul>
        )}
      </div>

      <div aria-labelledby="screen-h">
        <h3 id="screen-h" className="text-sm font-medium">Screening (warnings, not a design)</h3>
        {s.missing.length > 0 && <p className="text-sm text-muted">Resonance and voltage-rise screens need the site’s {s.missing.join(' and ')}: add them to the site’s details.</p>}
        {s.resonance && (
          <p className={`mt-1 text-sm ${s.resonance.warning && !s.detuned ? 'text-cost' : ''}`} data-testid="resonance">
            {s.resonance.warning ? '⚠ ' : '✓ '}<span className="font-medium">Resonance near harmonic <span className="figure inline">{s.resonance.order.toFixed(2)}</span>:</span> {s.resonance.message}
          </p>
        )}
        {s.steps.some((x) => x.warning) && (
          <p className="mt-1 text-sm text-cost">⚠ Switching steps near a screened harmonic: {s.steps.map((x, i) => (x.warning ? `step ${i + 1} (h ${x.order.toFixed(2)}, near ${x.nearHarmonic}th)` : null)).filter(Boolean).join(', ')}.</p>
        )}
        {s.suggestDetuned && <p className="mt-1 text-sm">Consider a detuned bank: {s.resonance?.detunedOptions.map((o) => `${o.reactorPct} % reactor tunes to ${o.tuningOrder.toFixed(2)}`).join('; ')}.</p>}
        {s.detuned && <p className="mt-1 text-sm">✓ {s.detuned.message}</p>}
        {s.voltageRise && <p className="mt-1 text-sm">Voltage rise: <span className="figure inline">{s.voltageRise.risePct.toFixed(2)}</span><span className="unit">%</span>. {s.voltageRise.message}</p>}
        {s.duty && (
          <p className={`mt-1 text-sm ${s.duty.withinLimits ? '' : 'text-cost'}`}>
            Capacitor duty: {pct(s.duty.voltageRatio)} of rated voltage, conductors and disconnect at least <span className="figure inline">{num(s.duty.minConductorAmpacityA)}</span><span className="unit">A</span>. {s.duty.messages.join(' ')}
          </p>
        )}
      </div>
      {ev.notes.length > 0 && <ul className="text-sm text-muted">{ev.notes.map((n) => <li key={n}>{n}</li>)}</ul>}
    </section>
  );
}
