/** The Tariff screen: saved versions in date order, and the editor to add, copy or change one. */
import { useEffect, useRef, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot';
import { api } from '../api';
import { EXAMPLE_TARIFFS } from '@/lib/demo/tariffs';
import type { TariffDto } from '@/lib/db/tariffs';
import { TariffEditor, type EditTarget } from './TariffEditor';
import { VersionList } from './VersionList';

/** The first day of next month, as a suggested start for a new version; moved on if taken. */
function nextStart(taken: string[]): string {
  const d = new Date();
  let y = d.getUTCFullYear();
  let m = d.getUTCMonth() + 2;
  for (;;) {
    if (m > 12) {
      m = 1;
      y++;
    }
    const s = `${y}-${String(m).padStart(2, '0')}-01`;
    if (!taken.includes(s)) return s;
    m++;
  }
}

function Panel({ siteId, currency, canEdit }: { siteId: string; currency: string; canEdit: boolean }) {
  const qc = useQueryClient();
  const q = useQuery({ queryKey: ['tariffs', siteId], queryFn: () => api<{ tariffs: TariffDto[] }>(`/api/sites/${siteId}/tariffs`) });
  const [target, setTarget] = useState<EditTarget | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [example, setExample] = useState(EXAMPLE_TARIFFS[0]!.key);
  // After a save or delete the editor or row is gone: put focus on the message that says what happened.
  const noticeRef = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    if (notice) noticeRef.current?.focus();
  }, [notice]);
  const remove = useMutation({
    mutationFn: (t: TariffDto) => api(`/api/sites/${siteId}/tariffs/${t.id}`, { method: 'DELETE' }),
    onSuccess: (_d, t) => {
      setNotice(`Deleted the version “${t.name}” from ${t.effectiveFrom}.`);
      qc.invalidateQueries({ queryKey: ['tariffs', siteId] });
    },
  });

  const tariffs = q.data?.tariffs ?? [];
  const taken = tariffs.map((t) => t.effectiveFrom);
  const latest = tariffs.at(-1);
  const open = (t: EditTarget) => {
    setNotice(null);
    setTarget(t);
  };
  const fromExample = () => {
    const ex = EXAMPLE_TARIFFS.find((e) => e.key === example)!;
    open({ id: null, title: `New version from the example “${ex.title}”`, values: structuredClone({ ...ex.tariff, currency, effectiveFrom: nextStart(taken) }), compareTo: null });
  };
  const copy = (t: TariffDto) => open({ id: null, title: `New version copied from “${t.name}” (from ${t.effectiveFrom})`, values: structuredClone({ ...t.definition, effectiveFrom: nextStart(taken) }), compareTo: t.id });
  const edit = (t: TariffDto) => open({ id: t.id, title: `Edit “${t.name}” (from ${t.effectiveFrom})`, values: structuredClone({ ...t.definition, effectiveFrom: t.effectiveFrom }), compareTo: t.id });

  if (q.isPending) return <div className="h-48 animate-pulse rounded border border-rule bg-surface" aria-busy="true" aria-label="Loading the tariff" />;
  if (q.isError) return <p className="notice notice-error" role="alert">Could not load the tariff: {(q.error as Error).message}</p>;

  if (target) {
    return (
      <TariffEditor
        key={`${target.id ?? 'new'}-${target.title}`}
        siteId={siteId}
        target={target}
        onCancel={() => setTarget(null)}
        onDone={(s) => {
          setTarget(null);
          setNotice(`Saved “${s.name}”, in force from ${s.effectiveFrom}.`);
          qc.invalidateQueries({ queryKey: ['tariffs', siteId] });
        }}
      />
    );
  }

  return (
    <div className="flex flex-col gap-4">
      {notice && <p className="notice notice-ok" role="status" tabIndex={-1} ref={noticeRef}>{notice}</p>}
      {canEdit && (
        <section className="card flex flex-col gap-3 p-4" aria-labelledby="start-heading">
          <h2 id="start-heading">Start a new version</h2>
          <div className="flex flex-wrap items-end gap-3">
            <div className="field">
              <label htmlFor="example">From an example tariff</label>
              <select id="example" value={example} onChange={(e) => setExample(e.target.value)} aria-describedby="example-hint">
                {EXAMPLE_TARIFFS.map((e) => <option key={e.key} value={e.key}>{e.title}</option>)}
              </select>
            </div>
            <button type="button" className="btn btn-primary" onClick={fromExample}>New version from this example</button>
            {latest && <button type="button" className="btn btn-quiet" onClick={() => copy(latest)}>Copy the current version</button>}
          </div>
          <p id="example-hint" className="text-[0.8125rem] text-muted">{EXAMPLE_TARIFFS.find((e) => e.key === example)?.summary} Examples are invented starting points: change the figures to those of the site’s tariff sheet. Rates switch to {currency}.</p>
        </section>
      )}
      {remove.isError && <p className="notice notice-error" role="alert">Could not delete: {(remove.error as Error).message}</p>}
      <VersionList tariffs={tariffs} canEdit={canEdit} onEdit={edit} onCopy={copy} onDelete={(t) => remove.mutate(t)} deleting={remove.isPending ? remove.variables?.id ?? null : null} />
    </div>
  );
}

export default function TariffPanel(props: { siteId: string; currency: string; canEdit: boolean }) {
  return (
    <QueryRoot>
      <Panel {...props} />
    </QueryRoot>
  );
}
