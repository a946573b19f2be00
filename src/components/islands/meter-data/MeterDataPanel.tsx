import { useRef, useState, type DragEvent } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { MeterMappingInput } from '@/lib/import/mapping-schema';
import { bytes, num } from '@/lib/format';
import { QueryRoot } from '../QueryRoot';
import { api, ApiClientError } from '../api';
import { MappingForm, type Column } from './MappingForm';
import { ProblemsTable } from './ProblemsTable';
import { QualityReport } from './QualityReport';
import { newImportId, uploadWithProgress } from './upload';

const HEAD = 256 * 1024;

type Proposal = { ok: boolean; mapping: MeterMappingInput | null; draft: Partial<MeterMappingInput>; needs: { field: string; message: string }[]; choices: { field: string; note: string; confidence: string }[]; columns: Column[]; problems: { message: string }[] };
type Parsed = { rows: { row: number; meterId: string; start: string; kwh: number; kvarhLag: number; kvarhLead: number }[]; problems: { row: number | null; column: string | null; value: string | null; message: string; code: string }[]; totalProblems: number; intervalMinutes?: number | null };
type ImportRow = { id: string; status: string; fileName: string | null; intervals: number; firstStart: string | null; lastStart: string | null; createdAt: string; totalProblems: number; bytesTotal: number; bytesProcessed: number; rowsProcessed: number; quality?: unknown; problems?: Parsed['problems'] };
type Meter = { id: string; name: string; intervalMinutes: number | null; importProfile: MeterMappingInput | null };

const EMPTY_MAPPING: MeterMappingInput = { version: 1, delimiter: ',', decimalSeparator: '.', timestamp: { column: '', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' }, meters: [{ meterId: 'Main meter', active: { column: '', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: '', lead: '', unit: 'kvarh' } }] };

function fill(draft: Partial<MeterMappingInput>): MeterMappingInput {
  return { ...EMPTY_MAPPING, ...draft, timestamp: { ...EMPTY_MAPPING.timestamp, ...(draft.timestamp ?? {}) }, meters: draft.meters?.length ? draft.meters : EMPTY_MAPPING.meters } as MeterMappingInput;
}

function Panel({ siteId, siteZone, canUpload }: { siteId: string; siteZone: string; canUpload: boolean }) {
  const qc = useQueryClient();
  const data = useQuery({ queryKey: ['meter-data', siteId], queryFn: () => api<{ meters: Meter[]; imports: ImportRow[] }>(`/api/sites/${siteId}/meter-data`) });
  const [file, setFile] = useState<File | null>(null);
  const [head, setHead] = useState<{ text: string; truncated: boolean } | null>(null);
  const [proposal, setProposal] = useState<Proposal | null>(null);
  const [mapping, setMapping] = useState<MeterMappingInput | null>(null);
  const [parsed, setParsed] = useState<Parsed | null>(null);
  const [drag, setDrag] = useState(false);
  const [progress, setProgress] = useState<{ sent: number; total: number } | null>(null);
  const [importId, setImportId] = useState<string | null>(null);
  const [outcome, setOutcome] = useState<{ kind: 'ok' | 'problems' | 'overlap' | 'duplicate' | 'error'; body: any } | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);

  const previewUrl = `/api/sites/${siteId}/meter-data/preview`;
  const preview = useMutation({
    mutationFn: (body: { head: string; truncated: boolean; mapping?: MeterMappingInput }) => api<{ proposal: Proposal; parsed: Parsed | null }>(previewUrl, { method: 'POST', body }),
  });
  const running = useQuery({
    queryKey: ['import', importId],
    queryFn: () => api<{ import: ImportRow }>(`/api/sites/${siteId}/meter-data/imports/${importId}`).catch(() => null),
    enabled: !!importId && !!progress,
    refetchInterval: 500,
  });
  const detail = useQuery({ queryKey: ['import-detail', selected], queryFn: () => api<{ import: ImportRow }>(`/api/sites/${siteId}/meter-data/imports/${selected}`), enabled: !!selected });

  async function choose(f: File) {
    setFile(f);
    setOutcome(null);
    setParsed(null);
    const text = await f.slice(0, HEAD).text();
    const h = { text, truncated: f.size > HEAD };
    setHead(h);
    const r = await preview.mutateAsync({ head: h.text, truncated: h.truncated }).catch((e) => {
      setOutcome({ kind: 'error', body: { message: e instanceof ApiClientError ? e.message : 'Could not read the file.' } });
      return null;
    });
    if (!r) return;
    // A single proposed meter takes the name of the site's only meter (or "Main meter"), so re-imports land on it.
    const existing = data.data?.meters ?? [];
    if (r.proposal.draft.meters?.length === 1 && /^Meter \d+$/.test(r.proposal.draft.meters[0]!.meterId)) {
      const name = existing.length === 1 ? existing[0]!.name : 'Main meter';
      r.proposal.draft.meters[0]!.meterId = name;
      if (r.proposal.mapping) r.proposal.mapping.meters[0]!.meterId = name;
    }
    setProposal(r.proposal);
    const saved = data.data?.meters.find((m) => m.importProfile)?.importProfile;
    setMapping(r.proposal.mapping ?? (saved && !r.proposal.ok ? saved : fill(r.proposal.draft)));
    setParsed(r.parsed);
  }

  async function check(m: MeterMappingInput) {
    if (!head) return;
    const r = await preview.mutateAsync({ head: head.text, truncated: head.truncated, mapping: m }).catch(() => null);
    if (r) setParsed(r.parsed);
  }

  async function upload(replace = false) {
    if (!file || !mapping) return;
    const id = newImportId();
    setImportId(id);
    setOutcome(null);
    const form = new FormData();
    form.append('mapping', JSON.stringify(mapping));
    if (replace) form.append('replace', 'true');
    form.append('file', file, file.name);
    setProgress({ sent: 0, total: file.size });
    try {
      const r = await uploadWithProgress(`/api/sites/${siteId}/meter-data?importId=${id}`, form, (sent, total) => setProgress({ sent, total }));
      const code = r.body?.error?.code;
      if (r.status === 201) setOutcome({ kind: 'ok', body: r.body.import });
      else if (r.status === 422) setOutcome({ kind: 'problems', body: r.body.error });
      else if (code === 'overlap') setOutcome({ kind: 'overlap', body: r.body.error });
      else if (code === 'already_imported') setOutcome({ kind: 'duplicate', body: r.body.error });
      else setOutcome({ kind: 'error', body: r.body?.error ?? { message: `The server answered ${r.status}.` } });
    } catch (e) {
      setOutcome({ kind: 'error', body: { message: (e as Error).message } });
    } finally {
      setProgress(null);
      qc.invalidateQueries({ queryKey: ['meter-data', siteId] });
    }
  }

  function onDrop(e: DragEvent) {
    e.preventDefault();
    setDrag(false);
    const f = e.dataTransfer.files[0];
    if (f) void choose(f);
  }

  const live = running.data?.import;
  return (
    <div className="flex flex-col gap-6">
      {canUpload && (
        <section aria-labelledby="upload-h" className="flex flex-col gap-3">
          <h2 id="upload-h">Upload a meter export</h2>
          <div
            onDragOver={(e) => { e.preventDefault(); setDrag(true); }}
            onDragLeave={() => setDrag(false)}
            onDrop={onDrop}
            className={`flex flex-col items-center gap-2 rounded border-2 border-dashed p-6 text-center ${drag ? 'border-ink bg-surface' : 'border-rule'}`}
          >
            <p>Drop a CSV export of interval data here (kW or kWh and kvarh per 5 to 60 minutes), up to 100 MB.</p>
            <button className="btn btn-quiet" onClick={() => input.current?.click()}>Choose a file…</button>
            <input ref={input} type="file" accept=".csv,.txt,text/csv,text/plain" className="sr-only" aria-label="Meter export file" onChange={(e) => e.target.files?.[0] && choose(e.target.files[0])} />
            {file && <p className="text-sm text-muted">{file.name} · {bytes(file.size)}</p>}
          </div>

          {preview.isPending && <p className="text-muted" aria-busy="true">Reading the first rows…</p>}
          {proposal && mapping && (
            <div className="card flex flex-col gap-4 p-4">
              <h3 className="font-medium">Check the columns</h3>
              {proposal.problems.map((p, i) => <p key={i} className="notice notice-error">{p.message}</p>)}
              {proposal.needs.map((n) => <p key={n.field} className="notice" role="status">{n.message}</p>)}
              {proposal.choices.length > 0 && (
                <details className="text-sm"><summary className="cursor-pointer">How the columns were proposed ({proposal.choices.length} choices)</summary>
                  <ul className="mt-2 list-disc pl-5">{proposal.choices.map((c) => <li key={c.field}><span className="font-mono">{c.field}</span>: {c.note} <span className="text-muted">({c.confidence} confidence)</span></li>)}</ul>
                </details>
              )}
              <MappingForm mapping={mapping} columns={proposal.columns} siteZone={siteZone} onChange={(m) => { setMapping(m); setParsed(null); }} />
              <div className="flex gap-2">
                <button className="btn btn-quiet" onClick={() => check(mapping)} disabled={preview.isPending}>Preview the first rows</button>
                <button className="btn btn-primary" onClick={() => upload(false)} disabled={!!progress}>Import the whole file</button>
              </div>
              {parsed && parsed.problems.length > 0 && <ProblemsTable problems={parsed.problems} total={parsed.totalProblems} />}
              {parsed && parsed.rows.length > 0 && (
                <div className="overflow-x-auto rounded border border-rule">
                  <table className="ledger text-sm">
                    <caption className="p-2 text-left text-muted">First rows as they will be read{parsed.intervalMinutes ? `, ${parsed.intervalMinutes}-minute intervals` : ''} (times in the site zone, interval start)</caption>
                    <thead><tr><th scope="col" className="text-right">Row</th><th scope="col">Meter</th><th scope="col">Interval start</th><th scope="col" className="text-right">Energy</th><th scope="col" className="text-right">Lagging</th><th scope="col" className="text-right">Leading</th></tr></thead>
                    <tbody>{parsed.rows.map((r, i) => (
                      <tr key={i}><td className="figure">{r.row}</td><td>{r.meterId}</td><td className="font-mono text-xs">{r.start}</td><td className="figure">{num(r.kwh, 3)}<span className="unit">kWh</span></td><td className="figure text-lagging">{num(r.kvarhLag, 3)}<span className="unit">kvarh</span></td><td className="figure text-leading-ink">{num(r.kvarhLead, 3)}<span className="unit">kvarh</span></td></tr>
                    ))}</tbody>
                  </table>
                </div>
              )}
            </div>
          )}

          {progress && (
            <div className="card p-4" role="status" aria-live="polite">
              <p className="mb-2 text-sm">{progress.sent < progress.total ? `Sending: ${bytes(progress.sent)} of ${bytes(progress.total)}` : live ? `Reading rows: ${num(live.rowsProcessed)} rows, ${bytes(live.bytesProcessed)} of ${bytes(live.bytesTotal)}` : 'Reading the file…'}</p>
              <progress className="w-full" max={progress.total} value={progress.sent < progress.total ? progress.sent : (live?.bytesProcessed ?? 0)} aria-label="Upload progress" />
            </div>
          )}
          {outcome?.kind === 'ok' && (
            <div className="flex flex-col gap-3">
              <p className="notice notice-ok" role="status">Imported {num(outcome.body.intervals)} intervals from {outcome.body.firstStart?.slice(0, 10)} to {outcome.body.lastStart?.slice(0, 10)}. Next: check the tariff, then read the findings.</p>
              <QualityReport quality={outcome.body.quality} />
            </div>
          )}
          {outcome?.kind === 'problems' && <ProblemsTable problems={outcome.body.problems ?? []} total={outcome.body.totalProblems ?? 0} />}
          {outcome?.kind === 'overlap' && (
            <div className="notice notice-error" role="alert">
              <p>{outcome.body.message}</p>
              <p className="mt-2"><button className="btn btn-danger" onClick={() => upload(true)}>Replace that range with this file</button></p>
            </div>
          )}
          {outcome?.kind === 'duplicate' && <p className="notice" role="status">{outcome.body.message}</p>}
          {outcome?.kind === 'error' && <p className="notice notice-error" role="alert">{outcome.body.message}</p>}
        </section>
      )}

      <section aria-labelledby="hist-h" className="flex flex-col gap-3">
        <h2 id="hist-h">Meters and import history</h2>
        {data.isPending && <p className="text-muted" aria-busy="true">Loading…</p>}
        {data.isError && <p className="notice notice-error" role="alert">{(data.error as Error).message}</p>}
        {data.data && data.data.imports.length === 0 && <p className="card p-4 text-muted">No meter data yet. {canUpload ? 'Upload the site’s interval export above: the last year of 15- or 30-minute data is ideal.' : 'An Energy manager or Consultant uploads it.'}</p>}
        {data.data && data.data.meters.length > 0 && (
          <p className="text-sm">Meters: {data.data.meters.map((m) => `${m.name}${m.intervalMinutes ? ` (${m.intervalMinutes}-minute)` : ''}`).join(', ')}</p>
        )}
        {data.data && data.data.imports.length > 0 && (
          <div className="overflow-x-auto rounded border border-rule">
            <table className="ledger text-sm">
              <thead><tr><th scope="col">Uploaded</th><th scope="col">File</th><th scope="col">Outcome</th><th scope="col" className="text-right">Intervals</th><th scope="col">Covers</th><th scope="col"><span className="sr-only">Report</span></th></tr></thead>
              <tbody>{data.data.imports.map((i) => (
                <tr key={i.id}>
                  <td className="whitespace-nowrap">{new Date(i.createdAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}</td>
                  <td>{i.fileName}</td>
                  <td><span className={`tag ${i.status === 'imported' ? 'text-saving' : i.status === 'rejected' || i.status === 'interrupted' ? 'text-cost' : 'text-muted'}`}>{i.status}</span>{i.totalProblems > 0 && ` ${num(i.totalProblems)} problems`}</td>
                  <td className="figure">{num(i.intervals)}</td>
                  <td>{i.firstStart ? `${i.firstStart.slice(0, 10)} to ${i.lastStart?.slice(0, 10)}` : '—'}</td>
                  <td><button className="btn btn-quiet text-xs" onClick={() => setSelected(selected === i.id ? null : i.id)} aria-expanded={selected === i.id}>{selected === i.id ? 'Hide' : i.status === 'imported' ? 'Quality report' : 'Problems'}</button></td>
                </tr>
              ))}</tbody>
            </table>
          </div>
        )}
        {selected && detail.data && (detail.data.import.status === 'imported' ? <QualityReport quality={detail.data.import.quality as never} /> : <ProblemsTable problems={detail.data.import.problems ?? []} total={detail.data.import.totalProblems} />)}
      </section>
    </div>
  );
}

export default function MeterDataPanel(props: { siteId: string; siteZone: string; canUpload: boolean }) {
  return <QueryRoot><Panel {...props} /></QueryRoot>;
}
