import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot';
import { api, ApiClientError } from '../api';
import { EXAMPLE_TARIFFS } from '@/lib/demo/tariffs';
import { RULE_TYPES } from '@/lib/domain/tariff/rule-registry';

type TariffRecord = { id: string; name: string; effectiveFrom: string; definition: { currency: string; demandWindowMinutes?: number; rules: ({ id: string; type: string; name?: string } & Record<string, unknown>)[] } };

const label = (type: string) => RULE_TYPES.find((t) => t.type === type)?.label ?? type;

/** Tariff versions with their rules; editors start from an invented example or edit the JSON. */
function Panel({ siteId, currency, canEdit }: { siteId: string; currency: string; canEdit: boolean }) {
  const qc = useQueryClient();
  const q = useQuery({ queryKey: ['tariffs', siteId], queryFn: () => api<{ tariffs: TariffRecord[] }>(`/api/sites/${siteId}/tariffs`) });
  const [editing, setEditing] = useState<{ id: string | null; text: string } | null>(null);
  const [error, setError] = useState<{ message: string; fields?: Record<string, string> } | null>(null);
  const [example, setExample] = useState(EXAMPLE_TARIFFS.find((e) => e.tariff.currency === currency)?.key ?? EXAMPLE_TARIFFS[0]!.key);
  const save = useMutation({
    mutationFn: ({ id, body }: { id: string | null; body: unknown }) => api(id ? `/api/sites/${siteId}/tariffs/${id}` : `/api/sites/${siteId}/tariffs`, { method: id ? 'PUT' : 'POST', body }),
    onSuccess: () => { setEditing(null); setError(null); qc.invalidateQueries({ queryKey: ['tariffs', siteId] }); },
    onError: (e) => setError(e instanceof ApiClientError ? { message: e.message, fields: e.fields } : { message: 'Could not save.' }),
  });
  const remove = useMutation({ mutationFn: (id: string) => api(`/api/sites/${siteId}/tariffs/${id}`, { method: 'DELETE' }), onSuccess: () => qc.invalidateQueries({ queryKey: ['tariffs', siteId] }) });

  function submit() {
    if (!editing) return;
    try {
      save.mutate({ id: editing.id, body: JSON.parse(editing.text) });
    } catch (e) {
      setError({ message: `The text is not valid JSON: ${(e as Error).message}` });
    }
  }
  function startFromExample() {
    const ex = EXAMPLE_TARIFFS.find((e) => e.key === example)!;
    setEditing({ id: null, text: JSON.stringify({ ...ex.tariff, currency }, null, 2) });
  }

  if (q.isPending) return <p className="text-muted" aria-busy="true">Loading the tariff…</p>;
  if (q.isError) return <p className="notice notice-error" role="alert">{(q.error as Error).message}</p>;
  return (
    <div className="flex flex-col gap-5">
      {q.data.tariffs.length === 0 && <p className="card p-4 text-muted">No tariff yet: without its power-factor rules no charge can be computed. {canEdit ? 'Start from one of the examples below and change the rates to those of the site’s tariff sheet.' : ''}</p>}
      {q.data.tariffs.map((t) => (
        <section key={t.id} className="card p-4" aria-label={`${t.name} from ${t.effectiveFrom}`}>
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2>{t.name} <span className="font-normal text-muted">· in force from {t.effectiveFrom} · {t.definition.currency}{t.definition.demandWindowMinutes ? ` · ${t.definition.demandWindowMinutes}-minute demand` : ''}</span></h2>
            {canEdit && <div className="flex gap-2"><button className="btn btn-quiet text-sm" onClick={() => setEditing({ id: t.id, text: JSON.stringify({ ...t.definition, effectiveFrom: t.effectiveFrom }, null, 2) })}>Edit</button><button className="btn btn-danger text-sm" onClick={() => window.confirm('Delete this tariff version?') && remove.mutate(t.id)}>Delete</button></div>}
          </div>
          <ol className="mt-2 list-decimal pl-6 text-sm">
            {t.definition.rules.map((r) => <li key={r.id}><span className="font-medium">{r.name ?? label(r.type)}</span> <span className="text-muted">({label(r.type)})</span></li>)}
          </ol>
        </section>
      ))}
      {canEdit && !editing && (
        <div className="flex flex-wrap items-end gap-2">
          <div className="field"><label htmlFor="ex">Start a new version from</label><select id="ex" value={example} onChange={(e) => setExample(e.target.value)} className="rounded border border-rule bg-surface px-2 py-1">{EXAMPLE_TARIFFS.map((e) => <option key={e.key} value={e.key}>{e.title}</option>)}</select></div>
          <button className="btn btn-primary" onClick={startFromExample}>New version</button>
        </div>
      )}
      {editing && (
        <section className="card flex flex-col gap-2 p-4" aria-label="Edit tariff version">
          <label htmlFor="tariff-json" className="text-sm font-medium">Tariff version (JSON). Rates are in {currency}; set effectiveFrom to the first day it applies.</label>
          <textarea id="tariff-json" className="h-96 rounded border border-rule p-2 font-mono text-xs" value={editing.text} onChange={(e) => setEditing({ ...editing, text: e.target.value })} spellCheck={false} />
          {error && <div className="notice notice-error" role="alert"><p>{error.message}</p>{error.fields && <ul className="mt-1 list-disc pl-5 text-sm">{Object.entries(error.fields).map(([k, v]) => <li key={k}><span className="font-mono">{k}</span>: {v}</li>)}</ul>}</div>}
          <div className="flex gap-2"><button className="btn btn-primary" onClick={submit} disabled={save.isPending}>Save version</button><button className="btn btn-quiet" onClick={() => { setEditing(null); setError(null); }}>Cancel</button></div>
        </section>
      )}
    </div>
  );
}

export default function TariffPanel(props: { siteId: string; currency: string; canEdit: boolean }) {
  return <QueryRoot><Panel {...props} /></QueryRoot>;
}
