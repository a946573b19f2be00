type Problem = { row: number | null; column: string | null; value: string | null; message: string; code: string };

/** The rows that block an import, as the server listed them (first 100). */
export function ProblemsTable({ problems, total }: { problems: Problem[]; total: number }) {
  return (
    <div className="flex flex-col gap-2">
      <p className="notice notice-error" role="alert">
        {total.toLocaleString('en-US')} problem{total === 1 ? '' : 's'} found. Nothing was imported: fix the file or the mapping and upload again.{total > problems.length && ` The first ${problems.length} are listed.`}
      </p>
      <div className="max-h-96 overflow-auto rounded border border-rule">
        <table className="ledger text-sm">
          <thead><tr><th scope="col" className="text-right">Row</th><th scope="col">Column</th><th scope="col">Value</th><th scope="col">What to change</th></tr></thead>
          <tbody>
            {problems.map((p, i) => (
              <tr key={i}>
                <td className="figure">{p.row === null ? '—' : p.row.toLocaleString('en-US')}</td>
                <td>{p.column ?? '—'}</td>
                <td className="font-mono text-xs">{p.value === null ? '—' : JSON.stringify(p.value)}</td>
                <td>{p.message}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
