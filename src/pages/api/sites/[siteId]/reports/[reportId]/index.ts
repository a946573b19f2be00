import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { getReport, missingReport, reportDto } from '@/lib/reports/service';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { reportId } = readParams(ctx.params, z.object({ reportId: z.string().min(1).max(64) }));
  const r = await getReport(getDb(), workspace.id, site.id, reportId);
  if (!r) throw missingReport();
  return json({ report: reportDto(r, true) });
});
