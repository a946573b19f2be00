import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { siteInWorkspace } from '@/lib/api/site-scope';
import { getDb } from '@/lib/db/client';
import { deleteBill, getBill } from '@/lib/db/bills';
import { deleteRecorded } from '@/lib/db/audit-log';

export const prerender = false;
const Params = z.object({ billId: z.string().min(1).max(64) });

export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'bill:upload');
  const site = await siteInWorkspace(ctx.params, workspace.id);
  const { billId } = readParams(ctx.params, Params);
  const db = getDb();
  const b = await getBill(db, workspace.id, site.id, billId);
  if (!b) throw notFound('Bill');
  const deleted = await deleteRecorded(db, workspace.id, user.id, (tx) => deleteBill(tx, workspace.id, site.id, billId), { action: 'bill.deleted', subjectType: 'bill', subjectId: billId, detail: { siteId: site.id, periodStart: b.periodStart, periodEnd: b.periodEnd } });
  if (!deleted) throw notFound('Bill');
  return new Response(null, { status: 204 });
});
