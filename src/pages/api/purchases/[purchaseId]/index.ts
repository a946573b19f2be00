import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { getPurchase, toPurchaseDto } from '@/lib/payments/purchases';
import { refreshPurchase } from '@/lib/payments/refresh';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const { purchaseId } = readParams(ctx.params, z.object({ purchaseId: z.string().min(1).max(64) }));
  const db = getDb();
  const row = await getPurchase(db, workspace.id, purchaseId);
  if (!row) throw notFound('Purchase');
  return json({ purchase: toPurchaseDto(await refreshPurchase(db, row)) });
});
