import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SiteDto } from '@/lib/schemas/site';
import type { PortfolioRow } from '@/lib/portfolio/summary';
import { PortfolioTable } from './PortfolioTable';
import { QueryRoot } from './QueryRoot';
import { SiteForm, type readSiteForm } from './SiteForm';
import { api, ApiClientError } from './api';

type Perms = { create: boolean; edit: boolean; remove: boolean };
type FormValues = ReturnType<typeof readSiteForm>;

function Sites({ perms, workspaceName }: { perms: Perms; workspaceName: string }) {
  const qc = useQueryClient();
  const sites = useQuery({ queryKey: ['sites'], queryFn: () => api<{ sites: SiteDto[] }>('/api/sites') });
  const portfolio = useQuery({ queryKey: ['portfolio'], queryFn: () => api<{ rows: PortfolioRow[] }>('/api/portfolio') });
  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<string | null>(null);
  const [serverErrors, setServerErrors] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState<string | null>(null);

  const onError = (e: unknown) => setServerErrors(e instanceof ApiClientError ? { ...e.fields, form: e.message } : { form: 'Could not save. Try again.' });
  const create = useMutation({
    mutationFn: (v: FormValues) => api<{ site: SiteDto }>('/api/sites', { method: 'POST', body: v }),
    onSuccess: ({ site }) => { setAdding(false); setServerErrors({}); setNotice(`Site "${site.name}" added. Next: upload its interval-meter export.`); qc.invalidateQueries({ queryKey: ['sites'] }); qc.invalidateQueries({ queryKey: ['portfolio'] }); },
    onError,
  });
  const update = useMutation({
    mutationFn: ({ id, v }: { id: string; v: FormValues }) => api<{ site: SiteDto }>(`/api/sites/${id}`, { method: 'PATCH', body: v }),
    onSuccess: ({ site }) => { setEditing(null); setServerErrors({}); setNotice(`Saved "${site.name}".`); qc.invalidateQueries({ queryKey: ['sites'] }); qc.invalidateQueries({ queryKey: ['portfolio'] }); },
    onError,
  });
  const remove = useMutation({
    mutationFn: (s: SiteDto) => api(`/api/sites/${s.id}`, { method: 'DELETE' }).then(() => s),
    onSuccess: (s) => { setNotice(`Deleted "${s.name}".`); qc.invalidateQueries({ queryKey: ['sites'] }); qc.invalidateQueries({ queryKey: ['portfolio'] }); },
    onError: (e) => setNotice(e instanceof ApiClientError ? e.message : 'Could not delete the site.'),
  });

  if (sites.isPending) return <p className="text-muted" aria-busy="true">Loading sites…</p>;
  if (sites.isError) return <p className="notice notice-error" role="alert">Could not load the sites: {(sites.error as Error).message} <button className="btn btn-quiet ml-2" onClick={() => sites.refetch()}>Retry</button></p>;
  const list = sites.data.sites;
  const editingSite = list.find((s) => s.id === editing);

  return (
    <div className="flex flex-col gap-4">
      {notice && <p className="notice notice-ok" role="status">{notice}</p>}
      <div className="flex items-center justify-between">
        <h2>Sites <span className="text-muted font-normal">({list.length})</span></h2>
        {perms.create && !adding && <button className="btn btn-primary" onClick={() => { setAdding(true); setEditing(null); setServerErrors({}); }}>Add site</button>}
      </div>
      {adding && (
        <section className="card p-4" aria-label="Add a site">
          <h2 className="mb-3">Add a site</h2>
          <SiteForm submitLabel="Add site" busy={create.isPending} serverErrors={serverErrors} onSubmit={(v) => create.mutate(v)} onCancel={() => setAdding(false)} />
        </section>
      )}
      {editingSite && (
        <section className="card p-4" aria-label={`Edit ${editingSite.name}`}>
          <h2 className="mb-3">Edit {editingSite.name}</h2>
          <SiteForm key={editingSite.id} initial={editingSite} submitLabel="Save changes" busy={update.isPending} serverErrors={serverErrors} onSubmit={(v) => update.mutate({ id: editingSite.id, v })} onCancel={() => setEditing(null)} />
        </section>
      )}
      {list.length === 0 ? (
        <div className="card p-6">
          <p className="font-medium">{workspaceName} has no sites yet.</p>
          <p className="mt-1 text-muted">
            {perms.create
              ? 'Start by adding a site (name, time zone, utility, service voltage and transformer). Then upload its interval-meter export (kW and kvarh per 15, 30 or 60 minutes) and enter its tariff’s power-factor rules.'
              : 'An Owner, Energy manager or Consultant of this workspace adds sites; they will appear here.'}
          </p>
        </div>
      ) : portfolio.isPending ? (
        <div className="rounded border border-rule bg-surface" style={{ minHeight: `${6 + list.length * 3.2}rem` }} aria-busy="true" aria-label="Computing the portfolio figures" />
      ) : portfolio.isError ? (
        <p className="notice notice-error" role="alert">Could not compute the portfolio: {(portfolio.error as Error).message} <button className="btn btn-quiet ml-2" onClick={() => portfolio.refetch()}>Retry</button></p>
      ) : (
        <PortfolioTable
          rows={portfolio.data.rows}
          actions={perms.edit || perms.remove ? (r) => {
            const s = list.find((x) => x.id === r.site.id);
            if (!s) return null;
            return (
              <span className="whitespace-nowrap">
                {perms.edit && <button className="btn btn-quiet mr-2 text-xs" onClick={() => { setEditing(s.id); setAdding(false); setServerErrors({}); }} aria-label={`Edit ${s.name}`}>Edit</button>}
                {perms.remove && <button className="btn btn-danger text-xs" aria-label={`Delete ${s.name}`} disabled={remove.isPending} onClick={() => { if (window.confirm(`Delete "${s.name}" and everything recorded for it? This cannot be undone.`)) remove.mutate(s); }}>Delete</button>}
              </span>
            );
          } : undefined}
        />
      )}
    </div>
  );
}

export default function SitesPanel(props: { perms: Perms; workspaceName: string }) {
  return <QueryRoot><Sites {...props} /></QueryRoot>;
}
