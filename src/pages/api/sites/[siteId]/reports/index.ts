import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { IssueReportSchema, issueReport, listReports, reportDto } from '@/lib/reports/service';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  return json({ reports: (await listReports(getDb(), workspace.id, site.id)).map((r) => reportDto(r)) });
});

/** Issues a Savings report for a saved plan: 402 until the Site audit is paid; sets the site Reported and tells Finance. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'report:issue');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const input = await readJson(ctx.request, IssueReportSchema);
  const { report, notified } = await issueReport(getDb(), { organizationId: workspace.id, workspaceName: workspace.name, user: { id: user.id, name: user.name, email: user.email }, site }, input);
  return json({ report: reportDto(report), notified }, 201);
});
