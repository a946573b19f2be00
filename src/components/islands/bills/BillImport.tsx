import { useState } from 'react';
import type { BillMappingInput } from '@/lib/import/bills/bill-schema';
import { ProblemsTable } from '../meter-data/ProblemsTable';
import { uploadWithProgress } from '../meter-data/upload';

type Field = keyof BillMappingInput['columns'];
const FIELDS: [Field, string, boolean][] = [
  ['periodStart', 'Period from', true], ['periodEnd', 'Period to', true], ['kwh', 'kWh', true], ['billedDemand', 'Billed demand', false],
  ['kvarh', 'kvarh', false], ['powerFactor', 'Power factor', false], ['pfCharge', 'PF charge', false], ['total', 'Total', false],
];
const guess: Record<Field, RegExp> = { periodStart: /from|start|begin/i, periodEnd: /\bto\b|end|until/i, kwh: /kwh/i, billedDemand: /demand|kva\b|\bkw\b/i, kvarh: /kvarh/i, powerFactor: /power factor|\bpf\b(?!.*charge)/i, pfCharge: /pf.*(charge|surcharge)|reactive.*charge/i, total: /total/i, currency: /currency/i };

/** Imports a bill-history CSV: columns chosen from its header row, then all rows or none. */
export function BillImport({ siteId, currency, onDone }: { siteId: string; currency: string; onDone: (msg: string) => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [headers, setHeaders] = useState<string[]>([]);
  const [m, setM] = useState<BillMappingInput>({ version: 1, delimiter: ',', decimalSeparator: '.', thousandsSeparator: 'none', dateFormat: 'iso', columns: { periodStart: '', periodEnd: '', kwh: '' }, currency });
  const [result, setResult] = useState<{ error?: any } | null>(null);
  const [busy, setBusy] = useState(false);

  async function choose(f: File) {
    setFile(f);
    setResult(null);
    const first = (await f.slice(0, 8192).text()).replace(/^\uFEFF/, '').split(/\r?\n/)[0] ?? '';
    const delimiter = ([';', '\t', '|', ','] as const).find((d) => first.split(d).length > 2) ?? ',';
    const hs = first.split(delimiter).map((h) => h.trim().replace(/^"|"$/g, ''));
    setHeaders(hs);
    const columns: Record<string, string> = {};
    for (const [k] of FIELDS) {
      const h = hs.find((x) => guess[k].test(x) && !Object.values(columns).includes(x));
      if (h) columns[k] = h;
    }
    setM({ ...m, delimiter, decimalSeparator: delimiter === ';' ? ',' : '.', columns: { periodStart: '', periodEnd: '', kwh: '', ...columns } });
  }

  async function submit() {
    if (!file) return;
    setBusy(true);
    const form = new FormData();
    const cols = Object.fromEntries(Object.entries(m.columns).filter(([, v]) => v !== '' && v !== undefined));
    form.append('mapping', JSON.stringify({ ...m, columns: cols }));
    form.append('file', file, file.name);
    const r = await uploadWithProgress(`/api/sites/${siteId}/bills/import`, form, () => undefined).catch((e) => ({ status: 0, body: { error: { message: (e as Error).message } } }));
    setBusy(false);
    if (r.status === 201) {
      setResult(null);
      setFile(null);
      onDone(`Imported ${r.body.bills.length} bills.${r.body.warnings.length ? ` ${r.body.warnings.map((w: { message: string }) => w.message).join(' ')}` : ''}`);
    } else setResult({ error: r.body?.error ?? { message: `The server answered ${r.status}.` } });
  }

  const sel = 'rounded border border-rule bg-surface px-2 py-1';
  return (
    <div className="flex flex-col gap-3">
      <div className="field"><label htmlFor="bill-file">Bill history (CSV, one row per bill)</label><input id="bill-file" type="file" accept=".csv,text/csv,text/plain" onChange={(e) => e.target.files?.[0] && choose(e.target.files[0])} /></div>
      {file && (
        <>
          <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
            <div className="field"><label htmlFor="bi-df">Date format</label><select id="bi-df" className={sel} value={m.dateFormat} onChange={(e) => setM({ ...m, dateFormat: e.target.value as BillMappingInput['dateFormat'] })}><option value="iso">2026-01-31</option><option value="dmy">31/01/2026 (day first)</option><option value="mdy">01/31/2026 (month first)</option></select></div>
            <div className="field"><label htmlFor="bi-dec">Decimal separator</label><select id="bi-dec" className={sel} value={m.decimalSeparator} onChange={(e) => setM({ ...m, decimalSeparator: e.target.value as '.' | ',' })}><option value=".">Point</option><option value=",">Comma</option></select></div>
            <div className="field"><label htmlFor="bi-th">Thousands separator</label><select id="bi-th" className={sel} value={m.thousandsSeparator} onChange={(e) => setM({ ...m, thousandsSeparator: e.target.value as BillMappingInput['thousandsSeparator'] })}><option value="none">None</option><option value=",">Comma 1,000</option><option value=".">Point 1.000</option><option value=" ">Space 1 000</option></select></div>
            <div className="field"><label htmlFor="bi-du">Billed demand unit</label><select id="bi-du" className={sel} value={m.billedDemandUnit ?? 'kW'} onChange={(e) => setM({ ...m, billedDemandUnit: e.target.value as 'kW' | 'kVA' })}><option>kW</option><option>kVA</option></select></div>
            {FIELDS.map(([k, label, required]) => (
              <div key={k} className="field"><label htmlFor={`bi-${k}`}>{label}{required ? '' : ' (optional)'}</label>
                <select id={`bi-${k}`} className={sel} value={(m.columns[k] as string) ?? ''} onChange={(e) => setM({ ...m, columns: { ...m.columns, [k]: e.target.value }, ...(k === 'billedDemand' && e.target.value && !m.billedDemandUnit ? { billedDemandUnit: 'kW' } : {}) })}>
                  <option value="">{required ? 'Choose…' : '(none)'}</option>{headers.map((h) => <option key={h} value={h}>{h}</option>)}
                </select></div>
            ))}
          </div>
          <p><button className="btn btn-primary" onClick={submit} disabled={busy}>{busy ? 'Importing…' : 'Import bills'}</button></p>
        </>
      )}
      {result?.error && (result.error.problems ? <ProblemsTable problems={result.error.problems} total={result.error.totalProblems} /> : <p className="notice notice-error" role="alert">{result.error.message}</p>)}
    </div>
  );
}
