import type { MeterQuality } from '@/lib/import/quality';
import { num, pf } from '@/lib/format';

const rows = (r: number[]) => (r.length ? ` (rows ${r.slice(0, 5).map((x) => x.toLocaleString('en-US')).join(', ')}${r.length > 5 ? ', …' : ''})` : '');

/** The stored data-quality report of an import, one block per meter. */
export function QualityReport({ quality }: { quality: { bytesRead?: number; dataRows?: number; meters?: MeterQuality[] } | null }) {
  if (!quality?.meters?.length) return <p className="text-muted">No data-quality report for this import.</p>;
  return (
    <div className="flex flex-col gap-4">
      {quality.meters.map((q) => (
        <section key={q.meterId} className="card p-4" aria-label={`Data quality of ${q.meterId}`}>
          <h3 className="mb-2 font-medium">{q.meterId}</h3>
          <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-[14rem_1fr]">
            <dt className="text-muted">Interval length</dt><dd>{q.intervalMinutes} minutes ({q.intervalSource === 'detected' ? `detected, ${(q.modalShare * 100).toFixed(1)} % of spacings` : 'as stated in the mapping'})</dd>
            <dt className="text-muted">Period covered</dt><dd>{q.period.firstStartUtc.replace('T', ' ').replace('Z', ' UTC')} to {q.period.lastEndUtc.replace('T', ' ').replace('Z', ' UTC')}</dd>
            <dt className="text-muted">Intervals</dt><dd><span className="figure inline">{num(q.intervals.present)}</span> present of <span className="figure inline">{num(q.intervals.expected)}</span> expected{q.intervals.missing > 0 && <span className="text-cost"> · {num(q.intervals.missing)} missing</span>}</dd>
            <dt className="text-muted">Gaps</dt><dd>{q.gaps.count === 0 ? 'none' : `${q.gaps.count} gap(s), ${num(q.gaps.missingIntervals)} intervals; first: ${q.gaps.first.slice(0, 3).map((g) => `${g.fromUtc} to ${g.toUtc} (after row ${g.afterRow})`).join('; ')}`}</dd>
            <dt className="text-muted">Duplicates</dt><dd>{q.duplicates.identicalDropped === 0 ? 'none' : `${num(q.duplicates.identicalDropped)} identical repeated rows dropped${rows(q.duplicates.first.map((d) => d.row))}`}</dd>
            <dt className="text-muted">Clock changes</dt><dd>{q.timestamps.note}{q.timestamps.dstDays.length > 0 && ` (${q.timestamps.dstDays.length} day(s) with a clock change)`}</dd>
            <dt className="text-muted">Energy</dt><dd><span className="figure inline">{num(q.active.totalImportKwh)}</span> kWh imported{q.active.totalExportKwh > 0 && <>, <span className="figure inline">{num(q.active.totalExportKwh)}</span> kWh exported in {num(q.active.export.count)} intervals</>}</dd>
            <dt className="text-muted">Zero and missing kW</dt><dd>{num(q.active.zero.count)} zero{rows(q.active.zero.firstRows)}, {num(q.active.missing.count)} missing{rows(q.active.missing.firstRows)}</dd>
            <dt className="text-muted">Spikes</dt><dd>{num(q.active.spikes.count)}{rows(q.active.spikes.firstRows)} · rule: {q.active.spikes.rule}</dd>
            <dt className="text-muted">Reactive data</dt><dd><span className="text-lagging">{num(q.reactive.totalLagKvarh)} kvarh lagging</span>, <span className="text-leading-ink">{num(q.reactive.totalLeadKvarh)} kvarh leading</span>{q.reactive.netOnly && ' · net channel only: lagging and leading cannot be told apart within an interval'}{q.reactive.missing.count > 0 && <span className="text-cost"> · {num(q.reactive.missing.count)} intervals without kvarh</span>}</dd>
            <dt className="text-muted">Average PF (lagging)</dt><dd className="font-mono">{pf(q.pf.averageLagging, 'lag')}</dd>
            <dt className="text-muted">Implausible PF</dt><dd>{num(q.pf.implausible.count)}{rows(q.pf.implausible.firstRows)} · rule: {q.pf.implausible.rule}; kvar with zero kW: {num(q.pf.kvarWithZeroKw.count)}</dd>
          </dl>
          {q.findings.length > 0 && (
            <ul className="mt-3 flex flex-col gap-1 text-sm">
              {q.findings.map((f) => <li key={f.code} className={f.severity === 'warning' ? 'text-cost' : 'text-muted'}>{f.severity === 'warning' ? 'Warning: ' : 'Note: '}{f.message}{rows(f.firstRows)}</li>)}
            </ul>
          )}
        </section>
      ))}
    </div>
  );
}
