import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { getConfig } from '@/lib/config';
import { billDto } from '@/lib/db/bills';
import { importBillCsv } from '@/lib/bills/service';

export const prerender = false;

/** Imports a bill-history CSV (multipart: `file`, `mapping` JSON): all rows or none. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'bill:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const r = await importBillCsv({ db: getDb(), organizationId: workspace.id, site, userId: user.id }, ctx.request, getConfig().BILL_DOCUMENT_MAX_BYTES);
  return json({ bills: r.bills.map(billDto), warnings: r.warnings }, 201);
});
