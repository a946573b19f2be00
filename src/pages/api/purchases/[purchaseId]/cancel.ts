import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { cancelPurchase } from '@/lib/payments/checkout';
import { toPurchaseDto } from '@/lib/payments/purchases';

export const prerender = false;

export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'audit:buy');
  const { purchaseId } = readParams(ctx.params, z.object({ purchaseId: z.string().min(1).max(64) }));
  return json({ purchase: toPurchaseDto(await cancelPurchase(getDb(), workspace.id, user.id, purchaseId)) });
});
