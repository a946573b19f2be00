/** The Finance view: every saved plan's economics, sortable, totals per currency, CSV and XLSX downloads. */
import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { QueryRoot } from '../QueryRoot';
import { api } from '../api';
import { money, num, pct } from '@/lib/format';
import type { PaybackRow, PaybackTable as Table } from '@/lib/payback/table';
import { SortableHead } from '../table/SortableHead';

const yearsCell = (y: number | null) => (y === null ? <span className="text-cost">not paid back</span> : <>{y.toFixed(1)}<span className="unit">years</span></>);
const sortYears = (y: number | null) => y ?? Number.POSITIVE_INFINITY;

function View() {
  const q = useQuery({ queryKey: ['payback'], queryFn: () => api<Table>('/api/payback') });
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo<ColumnDef<PaybackRow>[]>(
    () => [
      { id: 'site', header: 'Site', accessorKey: 'siteName', cell: (c) => <a href={`/sites/${c.row.original.siteId}/correction`}>{c.row.original.siteName}</a> },
      { id: 'plan', header: 'Plan', accessorKey: 'planName' },
      { id: 'type', header: 'Type', accessorKey: 'type' },
      { id: 'kvar', header: 'Size', accessorKey: 'kvar', meta: { num: true }, cell: (c) => <>{num(c.row.original.kvar)}<span className="unit">kvar</span></> },
      { id: 'capex', header: 'Capex', accessorKey: 'capex', meta: { num: true }, cell: (c) => money(c.row.original.capex, c.row.original.currency, 0) },
      { id: 'annualSaving', header: 'Saving a year', accessorKey: 'annualSaving', meta: { num: true }, cell: (c) => <span className="text-saving">{money(c.row.original.annualSaving, c.row.original.currency, 0)}</span> },
      { id: 'om', header: 'O&M a year', accessorKey: 'omPerYear', meta: { num: true }, cell: (c) => money(c.row.original.omPerYear, c.row.original.currency, 0) },
      { id: 'payback', header: 'Payback', accessorFn: (r) => sortYears(r.paybackYears), meta: { num: true }, cell: (c) => yearsCell(c.row.original.paybackYears) },
      { id: 'npv', header: 'NPV', accessorKey: 'npv', meta: { num: true }, cell: (c) => <span className={c.row.original.npv < 0 ? 'text-cost' : ''}>{money(c.row.original.npv, c.row.original.currency, 0)}</span> },
      { id: 'irr', header: 'IRR', accessorFn: (r) => r.irr ?? -Infinity, meta: { num: true }, cell: (c) => (c.row.original.irr === null ? 'none' : pct(c.row.original.irr)) },
      { id: 'low', header: 'At 80 % savings', accessorFn: (r) => sortYears(r.paybackLow), meta: { num: true }, cell: (c) => <span className="flex flex-col">{yearsCell(c.row.original.paybackLow)}<span className="text-xs">{money(c.row.original.npvLow, c.row.original.currency, 0)} NPV</span></span> },
      { id: 'high', header: 'At 120 % savings', accessorFn: (r) => sortYears(r.paybackHigh), meta: { num: true }, cell: (c) => <span className="flex flex-col">{yearsCell(c.row.original.paybackHigh)}<span className="text-xs">{money(c.row.original.npvHigh, c.row.original.currency, 0)} NPV</span></span> },
      { id: 'currency', header: 'Currency', accessorKey: 'currency' },
    ],
    [],
  );
  const table = useReactTable({ data: q.data?.rows ?? [], columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });

  if (q.isPending) return <div className="h-48 animate-pulse rounded border border-rule bg-surface" aria-busy="true" aria-label="Loading the payback table" />;
  if (q.isError) return <p className="notice notice-error" role="alert">{(q.error as Error).message}</p>;
  if (q.data.rows.length === 0) return <p className="notice">No saved plans yet: a Consultant or Energy manager builds them on each site’s Correction page.</p>;
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-2">
        <a className="btn btn-quiet" href="/api/payback/export?format=xlsx" download>Download XLSX</a>
        <a className="btn btn-quiet" href="/api/payback/export?format=csv" download>Download CSV</a>
        <span className="text-sm text-muted">{q.data.rows.length} plans. Payback is simple payback on the tariff savings less O&M; the 80 % and 120 % columns vary those savings.</span>
      </div>
      <div className="overflow-x-auto rounded border border-rule">
        <table className="ledger text-sm" aria-label="Payback of saved plans">
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id}>
                {r.getVisibleCells().map((c) => {
                  const isNum = (c.column.columnDef.meta as { num?: boolean } | undefined)?.num;
                  return <td key={c.id} className={isNum ? 'figure' : ''}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>;
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <section aria-labelledby="totals-h">
        <h2 id="totals-h" className="mb-1">Totals by currency</h2>
        <div className="overflow-x-auto rounded border border-rule">
        <table className="ledger text-sm" aria-labelledby="totals-h">
          <thead><tr><th scope="col">Currency</th><th scope="col" className="text-right">Plans</th><th scope="col" className="text-right">Size</th><th scope="col" className="text-right">Capex</th><th scope="col" className="text-right">Saving a year</th><th scope="col" className="text-right">O&M a year</th><th scope="col" className="text-right">NPV</th></tr></thead>
          <tbody>
            {q.data.totals.map((t) => (
              <tr key={t.currency}>
                <th scope="row">{t.currency}</th>
                <td className="figure">{t.plans}</td>
                <td className="figure">{num(t.kvar)}<span className="unit">kvar</span></td>
                <td className="figure">{money(t.capex, t.currency, 0)}</td>
                <td className="figure text-saving">{money(t.annualSaving, t.currency, 0)}</td>
                <td className="figure">{money(t.omPerYear, t.currency, 0)}</td>
                <td className="figure">{money(t.npv, t.currency, 0)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
        <p className="mt-1 text-xs text-muted">Totals are never added across currencies. Plans are alternatives on a site, so a site’s plans are not meant to be summed as one programme.</p>
      </section>
    </div>
  );
}

export default function PaybackTable() {
  return <QueryRoot><View /></QueryRoot>;
}
