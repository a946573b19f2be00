/** The site's saved plans: open one into the builder; rename and delete for those who may change plans. */
import { useState } from 'react';
import { money, num } from '@/lib/format';
import { planTypeLabel, years, type PlanDto } from './types';

type Props = {
  plans: PlanDto[];
  openId: string | null;
  canEdit: boolean;
  onOpen: (p: PlanDto) => void;
  onRename: (p: PlanDto, name: string) => Promise<void>;
  onDelete: (p: PlanDto) => Promise<void>;
};

export function SavedPlans({ plans, openId, canEdit, onOpen, onRename, onDelete }: Props) {
  const [renaming, setRenaming] = useState<string | null>(null);
  const [name, setName] = useState('');
  const [confirm, setConfirm] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  return (
    <section aria-labelledby="saved-h" className="card p-3">
      <h2 id="saved-h" className="mb-2">Saved plans</h2>
      {error && <p className="notice notice-error mb-2" role="alert">{error}</p>}
      {plans.length === 0 ? (
        <p className="text-sm text-muted">No saved plans on this site yet.{canEdit ? ' Build one below and save it.' : ' A Consultant or Energy manager builds them here.'}</p>
      ) : (
        <div className="overflow-x-auto rounded border border-rule">
          <table className="ledger text-sm" aria-label="Saved plans">
            <thead><tr><th scope="col">Plan</th><th scope="col">Type</th><th scope="col" className="text-right">Size</th><th scope="col" className="text-right">Capex</th><th scope="col" className="text-right">Saving a year</th><th scope="col" className="text-right">Payback</th><th scope="col" className="text-right">NPV</th><th scope="col"><span className="sr-only">Actions</span></th></tr></thead>
            <tbody>
              {plans.map((p) => {
                const s = p.summary;
                return (
                  <tr key={p.id} aria-current={p.id === openId ? 'true' : undefined} className={p.id === openId ? 'bg-paper' : ''}>
                    <th scope="row">
                      {renaming === p.id ? (
                        <form className="flex gap-1" onSubmit={async (e) => { e.preventDefault(); setError(null); try { await onRename(p, name); setRenaming(null); } catch (err) { setError((err as Error).message); } }}>
                          <label className="sr-only" htmlFor={`rename-${p.id}`}>New name for {p.name}</label>
                          <input id={`rename-${p.id}`} className="rounded border border-rule px-1" value={name} onChange={(e) => setName(e.target.value)} />
                          <button className="btn btn-primary text-xs" type="submit">Save name</button>
                          <button className="btn btn-quiet text-xs" type="button" onClick={() => setRenaming(null)}>Cancel</button>
                        </form>
                      ) : p.name}
                    </th>
                    <td>{s ? planTypeLabel(s.kind, s.steps, s.detuned) : '—'}</td>
                    <td className="figure">{s ? <>{num(s.kvar)}<span className="unit">kvar</span></> : '—'}</td>
                    <td className="figure">{s ? money(s.capex, s.currency, 0) : '—'}</td>
                    <td className="figure text-saving">{s ? money(s.annualSaving, s.currency, 0) : '—'}</td>
                    <td className="figure">{s ? (s.paybackYears === null ? 'not paid back' : <>{years(s.paybackYears)}<span className="unit">years</span></>) : '—'}</td>
                    <td className="figure">{s ? money(s.npv, s.currency, 0) : '—'}</td>
                    <td className="whitespace-nowrap">
                      <span className="flex gap-1">
                        <button type="button" className="btn btn-quiet text-xs" onClick={() => onOpen(p)} aria-label={`Open ${p.name}`}>Open</button>
                        {canEdit && renaming !== p.id && <button type="button" className="btn btn-quiet text-xs" onClick={() => { setRenaming(p.id); setName(p.name); }} aria-label={`Rename ${p.name}`}>Rename</button>}
                        {canEdit && (confirm === p.id ? (
                          <>
                            <button type="button" className="btn btn-danger text-xs" onClick={async () => { setError(null); try { await onDelete(p); } catch (err) { setError((err as Error).message); } setConfirm(null); }}>Delete for good</button>
                            <button type="button" className="btn btn-quiet text-xs" onClick={() => setConfirm(null)}>Keep</button>
                          </>
                        ) : <button type="button" className="btn btn-danger text-xs" onClick={() => setConfirm(p.id)} aria-label={`Delete ${p.name}`}>Delete</button>)}
                      </span>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
