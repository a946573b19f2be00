/** Sizing search: candidate banks on the site's own data, sortable, best NPV and shortest payback marked with a sign. */
import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { api } from '../api';
import { money, num, pct, pf } from '@/lib/format';
import { planTypeLabel, years, type SizingResult } from './types';
import { SortableHead } from '../table/SortableHead';

type Row = SizingResult['rows'][number];
export type SizingChoice = { row: Row; assumptions: SizingResult['assumptions']; targetPf: number };

const DEFAULTS = { targetPf: '0.95', fixedPerKvar: '35', switchedPerKvar: '70', fixedInstallation: '4000', omPctOfCapex: '1', discountRate: '0.08', lifeYears: '15', maxKvar: '' };
type Inputs = typeof DEFAULTS;
const LABELS: Record<keyof Inputs, [string, string]> = {
  targetPf: ['Target PF', ''],
  fixedPerKvar: ['Fixed bank cost', ''],
  switchedPerKvar: ['Switched bank cost', ''],
  fixedInstallation: ['Fixed installation', ''],
  omPctOfCapex: ['O&M', '% of capex'],
  discountRate: ['Discount rate', 'fraction'],
  lifeYears: ['Life', 'years'],
  maxKvar: ['Largest size (optional)', 'kvar'],
};

export function SizingTable({ siteId, currency, onUse }: { siteId: string; currency: string; onUse: ((c: SizingChoice) => void) | null }) {
  const [draft, setDraft] = useState<Inputs>(DEFAULTS);
  const [asked, setAsked] = useState<Inputs | null>(null);
  const [sorting, setSorting] = useState<SortingState>([]);
  const qs = asked ? new URLSearchParams(Object.entries(asked).filter(([, v]) => v !== '')).toString() : '';
  const q = useQuery({ queryKey: ['sizing', siteId, qs], queryFn: () => api<{ sizing: SizingResult }>(`/api/sites/${siteId}/plans/sizing?${qs}`), enabled: asked !== null });
  const data = q.data?.sizing;
  const cur = data?.currency ?? currency;
  const unitOf = (k: keyof Inputs) => (k === 'fixedPerKvar' || k === 'switchedPerKvar' ? `${currency}/kvar` : k === 'fixedInstallation' ? currency : LABELS[k][1]);

  const columns = useMemo<ColumnDef<Row>[]>(
    () => [
      { id: 'type', header: 'Type', accessorFn: (r) => planTypeLabel(r.kind, r.steps), cell: (c) => c.getValue<string>() },
      { id: 'kvar', header: 'Size', accessorKey: 'kvar', meta: { num: true }, cell: (c) => <>{num(c.row.original.kvar)}<span className="unit">kvar</span></> },
      { id: 'annualSaving', header: 'Saving a year', accessorKey: 'annualSaving', meta: { num: true }, cell: (c) => <span className="text-saving">{money(c.row.original.annualSaving, cur, 0)}</span> },
      { id: 'capex', header: 'Capex', accessorKey: 'capex', meta: { num: true }, cell: (c) => money(c.row.original.capex, cur, 0) },
      { id: 'paybackYears', header: 'Payback', accessorFn: (r) => r.paybackYears ?? Number.POSITIVE_INFINITY, meta: { num: true }, cell: (c) => (c.row.original.paybackYears === null ? 'not paid back' : <>{years(c.row.original.paybackYears)}<span className="unit">years</span></>) },
      { id: 'npv', header: 'NPV', accessorKey: 'npv', meta: { num: true }, cell: (c) => <span className={c.row.original.npv < 0 ? 'text-cost' : ''}>{money(c.row.original.npv, cur, 0)}</span> },
      { id: 'irr', header: 'IRR', accessorFn: (r) => r.irr ?? -Infinity, meta: { num: true }, cell: (c) => pct(c.row.original.irr) },
      { id: 'leadingHours', header: 'Leading', accessorKey: 'leadingHours', meta: { num: true }, cell: (c) => <span className={c.row.original.leadingHours > 0 ? 'text-leading-ink' : ''}>{num(c.row.original.leadingHours)}<span className="unit">h</span></span> },
      {
        id: 'marks',
        header: 'Marks',
        enableSorting: false,
        cell: (c) => (
          <span className="flex flex-col gap-0.5">
            {c.row.original.bestNpv && <span className="tag text-saving">★ Best NPV</span>}
            {c.row.original.shortestPayback && <span className="tag text-active">◆ Shortest payback</span>}
          </span>
        ),
      },
      ...(onUse && data
        ? [{ id: 'use', header: () => <span className="sr-only">Action</span>, enableSorting: false, cell: (c: { row: { original: Row } }) => <button type="button" className="btn btn-quiet text-xs" onClick={() => onUse({ row: c.row.original, assumptions: data.assumptions, targetPf: data.targetPf })} aria-label={`Use this size: ${planTypeLabel(c.row.original.kind, c.row.original.steps)}, ${c.row.original.kvar} kvar`}>Use this size</button> } as ColumnDef<Row>]
        : []),
    ],
    [cur, onUse, data],
  );
  const table = useReactTable({ data: data?.rows ?? [], columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });

  return (
    <section aria-labelledby="sizing-h" className="card p-3">
      <h2 id="sizing-h">Sizing search</h2>
      <p className="mb-2 text-sm text-muted">Fixed banks and Switched banks of 4, 6 and 8 equal steps, each simulated on this site’s intervals under its tariff.</p>
      <form className="grid grid-cols-2 gap-2 sm:grid-cols-4" onSubmit={(e) => { e.preventDefault(); setAsked(draft); }}>
        {(Object.keys(DEFAULTS) as (keyof Inputs)[]).map((k) => (
          <div className="field" key={k}>
            <label htmlFor={`sz-${k}`}>{LABELS[k][0]}{unitOf(k) && <span className="unit">{unitOf(k)}</span>}</label>
            <input id={`sz-${k}`} type="number" step="any" className="figure" value={draft[k]} onChange={(e) => setDraft({ ...draft, [k]: e.target.value })} />
          </div>
        ))}
        <div className="col-span-2 flex items-end sm:col-span-4">
          <button className="btn btn-primary" type="submit" disabled={q.isFetching}>{q.isFetching ? 'Searching…' : 'Run sizing search'}</button>
        </div>
      </form>
      {q.isError && <p className="notice notice-error mt-2" role="alert">{(q.error as Error).message}</p>}
      {data && (
        <div className="mt-3 flex flex-col gap-2">
          {data.textbook && (
            <p className="notice text-sm" data-testid="textbook">
              <span className="font-medium">Textbook estimate, Qc = P (tan φ1 − tan φ2):</span> <span className="figure inline">{num(data.textbook.kvar, 1)}</span><span className="unit">kvar</span> to reach {pf(data.targetPf)} — {data.textbook.explanation}
            </p>
          )}
          <p className="text-sm">Present PF charges: <span className="figure inline text-cost">{money(data.baselineAnnualPfCharge, cur, 0)}</span><span className="unit">a year</span> under {data.tariffName}. {data.rows.length} candidates; ★ marks the best NPV, ◆ the shortest payback.</p>
          {data.notes.map((n) => <p key={n} className="text-sm text-muted">{n}</p>)}
          <div className="max-h-[28rem] overflow-auto rounded border border-rule">
            <table className="ledger text-sm" aria-label="Sizing candidates">
              <SortableHead table={table} />
              <tbody>
                {table.getRowModel().rows.map((r) => (
                  <tr key={r.id} data-best-npv={r.original.bestNpv || undefined} data-shortest-payback={r.original.shortestPayback || undefined}>
                    {r.getVisibleCells().map((c) => {
                      const isNum = (c.column.columnDef.meta as { num?: boolean } | undefined)?.num;
                      return <td key={c.id} className={isNum ? 'figure' : ''}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>;
                    })}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      )}
    </section>
  );
}
