import { useMemo, useState } from 'react';
import { flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState, type VisibilityState } from '@tanstack/react-table';
import type { PortfolioRow } from '@/lib/portfolio/summary';
import { AUDIT_STATE_LABELS } from '@/lib/schemas/site';
import { money, pct } from '@/lib/format';
import { toCsv } from '@/lib/csv-export';
import { PhaseDial } from './charts/PhaseDial';
import { SortableHead } from './table/SortableHead';

const STATE_CLASS = { draft: 'text-muted', audited: 'text-active', reported: 'text-saving' } as const;
const years = (y: number | null) => (y === null ? 'not paid back' : `${y.toFixed(1)} yr`);

/** The workspace's sites with their PF figures: sortable, filterable, choose columns, export CSV, totals per currency. */
export function PortfolioTable({ rows, actions }: { rows: PortfolioRow[]; actions?: (r: PortfolioRow) => React.ReactNode }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'annualPfCost', desc: true }]);
  const [filter, setFilter] = useState('');
  const [visibility, setVisibility] = useState<VisibilityState>({ utility: false, timeZone: false });
  const columns = useMemo<ColumnDef<PortfolioRow>[]>(
    () => [
      { id: 'site', header: 'Site', accessorFn: (r) => r.site.name, cell: ({ row }) => <a href={`/sites/${row.original.site.id}`}>{row.original.site.name}</a> },
      { id: 'utility', header: 'Utility', accessorFn: (r) => r.site.utility },
      { id: 'timeZone', header: 'Time zone', accessorFn: (r) => r.site.timeZone },
      { id: 'annualPfCost', header: 'PF cost, last 12 months', accessorFn: (r) => r.annualPfCost ?? -1, sortDescFirst: true, meta: { num: true },
        cell: ({ row: { original: r } }) => (r.annualPfCost === null ? <span className="text-muted">{r.months === 0 ? 'no meter data' : 'no tariff'}</span> : <span className="text-cost">{money(r.annualPfCost, r.currency, 0)}{r.annualised && <span className="unit" title={`Scaled from ${r.months} months`}>est.</span>}</span>) },
      { id: 'worstPf', header: 'Worst month PF', accessorFn: (r) => r.worstMonth?.pf ?? 2, meta: { num: true },
        cell: ({ row: { original: r } }) => (r.worstMonth?.pf == null ? <span className="text-muted">—</span> : (
          <span className="inline-flex items-center gap-2"><PhaseDial pf={r.worstMonth.pf} thresholdPf={r.thresholdPf} size={34} /><span>{r.worstMonth.pf.toFixed(3)}<span className="unit">lag · {r.worstMonth.label}</span>{r.worstMonth.pf < r.thresholdPf && <span className="unit text-cost">below {r.thresholdPf.toFixed(2)}</span>}</span></span>
        )) },
      { id: 'coverage', header: 'Data coverage', accessorFn: (r) => r.coverage ?? -1, meta: { num: true }, cell: ({ row: { original: r } }) => (r.coverage === null ? <span className="text-muted">none</span> : <span className={r.coverage < 0.99 ? 'text-cost' : ''}>{pct(r.coverage)}<span className="unit">{r.months} mo</span></span>) },
      { id: 'payback', header: 'Best plan payback', accessorFn: (r) => r.bestPlan?.paybackYears ?? 999, meta: { num: true }, cell: ({ row: { original: r } }) => (r.bestPlan ? <span title={r.bestPlan.name}>{years(r.bestPlan.paybackYears)}</span> : <span className="text-muted">no plan</span>) },
      { id: 'auditState', header: 'Audit state', accessorFn: (r) => r.site.auditState, cell: ({ row: { original: r } }) => <span className={`tag ${STATE_CLASS[r.site.auditState as keyof typeof STATE_CLASS]}`}>{AUDIT_STATE_LABELS[r.site.auditState as keyof typeof AUDIT_STATE_LABELS]}</span> },
      ...(actions ? [{ id: 'actions', header: () => <span className="sr-only">Actions</span>, enableSorting: false, enableHiding: false, cell: ({ row }: { row: { original: PortfolioRow } }) => actions(row.original) } as ColumnDef<PortfolioRow>] : []),
    ],
    [actions],
  );
  const table = useReactTable({ data: rows, columns, state: { sorting, globalFilter: filter, columnVisibility: visibility }, onSortingChange: setSorting, onGlobalFilterChange: setFilter, onColumnVisibilityChange: setVisibility, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel(), getFilteredRowModel: getFilteredRowModel(), globalFilterFn: (row, _c, v) => `${row.original.site.name} ${row.original.site.utility} ${row.original.site.auditState}`.toLowerCase().includes(String(v).toLowerCase()) });

  const shown = table.getRowModel().rows.map((r) => r.original);
  const totals = new Map<string, number>();
  for (const r of shown) if (r.annualPfCost !== null) totals.set(r.currency, (totals.get(r.currency) ?? 0) + r.annualPfCost);

  function exportCsv() {
    const csv = toCsv(
      ['Site', 'Utility', 'Time zone', 'Currency', 'PF cost last 12 months', 'Months of data', 'Worst month', 'Worst month PF (lag)', 'Tariff threshold PF', 'Data coverage (0-1)', 'Best plan', 'Best plan payback (years)', 'Audit state'],
      shown.map((r) => [r.site.name, r.site.utility, r.site.timeZone, r.currency, r.annualPfCost === null ? '' : Math.round(r.annualPfCost * 100) / 100, r.months, r.worstMonth?.label ?? '', r.worstMonth?.pf?.toFixed(3) ?? '', r.thresholdPf, r.coverage?.toFixed(4) ?? '', r.bestPlan?.name ?? '', r.bestPlan?.paybackYears?.toFixed(2) ?? '', AUDIT_STATE_LABELS[r.site.auditState as keyof typeof AUDIT_STATE_LABELS]]),
    );
    const a = document.createElement('a');
    a.href = URL.createObjectURL(new Blob([csv], { type: 'text/csv' }));
    a.download = 'portfolio.csv';
    a.click();
    URL.revokeObjectURL(a.href);
  }

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-3">
        <div className="field"><label htmlFor="pf-filter">Filter sites</label><input id="pf-filter" value={filter} onChange={(e) => setFilter(e.target.value)} placeholder="name, utility or state" /></div>
        <details className="relative text-sm">
          <summary className="btn btn-quiet cursor-pointer list-none">Columns</summary>
          <div className="absolute z-10 mt-1 flex w-56 flex-col gap-1 rounded border border-rule bg-surface p-2">
            {table.getAllLeafColumns().filter((c) => c.getCanHide()).map((c) => (
              <label key={c.id} className="flex items-center gap-2"><input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} />{typeof c.columnDef.header === 'string' ? c.columnDef.header : c.id}</label>
            ))}
          </div>
        </details>
        <button className="btn btn-quiet text-sm" onClick={exportCsv}>Export CSV</button>
      </div>
      <div className="overflow-x-auto rounded border border-rule">
        <table className="ledger text-sm">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={(cell.column.columnDef.meta as { num?: boolean } | undefined)?.num ? 'figure' : ''}>{flexRender(cell.column.columnDef.cell, cell.getContext())}</td>
                ))}
              </tr>
            ))}
            {table.getRowModel().rows.length === 0 && <tr><td colSpan={table.getVisibleLeafColumns().length} className="text-muted">No site matches “{filter}”.</td></tr>}
          </tbody>
          <tfoot>
            <tr>
              <th scope="row">Total ({shown.length} site{shown.length === 1 ? '' : 's'})</th>
              {table.getVisibleLeafColumns().slice(1).map((c) => (
                <td key={c.id} className="figure">{c.id === 'annualPfCost' ? ([...totals].map(([cur, v]) => <div key={cur} className="text-cost">{money(v, cur, 0)}</div>)) : null}</td>
              ))}
            </tr>
          </tfoot>
        </table>
      </div>
      <p className="text-xs text-muted">PF cost: the PF-related charges of the site’s tariff over the last twelve months of interval data (“est.” when fewer months are scaled to a year). Worst month PF: the lowest monthly average PF from energy totals; the dial’s dashed arc marks angles past the tariff threshold.</p>
    </div>
  );
}
