import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { getReport, missingReport } from '@/lib/reports/service';
import { renderReportPdf } from '@/lib/reports/pdf';
import type { ReportSnapshot } from '@/lib/reports/snapshot';
import { sanitizeFileName } from '@/lib/files/names';

export const prerender = false;

/** The issued report as a PDF, generated on the server from its snapshot. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { reportId } = readParams(ctx.params, z.object({ reportId: z.string().min(1).max(64) }));
  const r = await getReport(getDb(), workspace.id, site.id, reportId);
  if (!r) throw missingReport();
  const pdf = await renderReportPdf(r.snapshot as unknown as ReportSnapshot);
  const name = sanitizeFileName(`Savings report ${site.name} ${r.issuedAt.toISOString().slice(0, 10)}.pdf`).replace(/[^\x20-\x7e]/g, '_');
  return new Response(new Uint8Array(pdf), { headers: { 'content-type': 'application/pdf', 'content-length': String(pdf.length), 'content-disposition': `${ctx.url.searchParams.get('download') === '1' ? 'attachment' : 'inline'}; filename="${name}"`, 'cache-control': 'private, no-store' } });
});
