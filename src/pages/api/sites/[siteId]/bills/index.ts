import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { billDto, listBills } from '@/lib/db/bills';
import { addBill } from '@/lib/bills/service';
import { BillDeterminantsSchema } from '@/lib/import/bills/bill-schema';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  return json({ bills: (await listBills(getDb(), workspace.id, site.id)).map(billDto) });
});

/** Enters one bill's billed determinants (the bill form). */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'bill:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const b = await readJson(ctx.request, BillDeterminantsSchema);
  const row = await addBill({ db: getDb(), organizationId: workspace.id, site, userId: user.id }, b);
  return json({ bill: billDto(row) }, 201);
});
