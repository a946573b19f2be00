import { endpoint, readParams } from '@/lib/api/handler';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { paybackTable } from '@/lib/payback/table';
import { ExportQuerySchema, exportFileName, paybackCsv, paybackXlsx } from '@/lib/payback/export';

export const prerender = false;

/** The payback table as a CSV or XLSX download. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'economics:view');
  const { format } = readParams(Object.fromEntries(ctx.url.searchParams), ExportQuerySchema);
  const table = await paybackTable(getDb(), workspace);
  const name = exportFileName(workspace.name, format);
  const disposition = `attachment; filename="${name}"`;
  if (format === 'csv') return new Response(paybackCsv(table), { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': disposition, 'cache-control': 'no-store' } });
  const body = await paybackXlsx(table);
  return new Response(new Uint8Array(body), { headers: { 'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'content-disposition': disposition, 'cache-control': 'no-store' } });
});
