import { flexRender, type Table } from '@tanstack/react-table';

/**
 * The header of a TanStack table in our ledger style: numeric columns (meta.num) right-aligned,
 * sortable columns as buttons, the sort state in aria-sort and shown by an arrow.
 */
export function SortableHead<T>({ table }: { table: Table<T> }) {
  return (
    <thead>
      {table.getHeaderGroups().map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) => {
            const num = (h.column.columnDef.meta as { num?: boolean } | undefined)?.num;
            const sorted = h.column.getIsSorted();
            const label = flexRender(h.column.columnDef.header, h.getContext());
            return (
              <th key={h.id} scope="col" className={num ? 'text-right' : ''} aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                {h.column.getCanSort() ? (
                  <button type="button" className="inline-flex items-center gap-1 font-medium" onClick={h.column.getToggleSortingHandler()}>
                    {label}
                    <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                  </button>
                ) : (
                  label
                )}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
