import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getConfig } from '@/lib/config';
import { getDb } from '@/lib/db/client';
import { startPurchase } from '@/lib/payments/checkout';
import { listPurchases, toPurchaseDto } from '@/lib/payments/purchases';
import { PurchaseCreateSchema } from '@/lib/payments/schemas';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const cfg = getConfig();
  const rows = await listPurchases(getDb(), workspace.id);
  return json({ purchases: rows.map(toPurchaseDto), price: { unitAmount: cfg.SITE_AUDIT_PRICE, currency: cfg.SITE_AUDIT_CURRENCY } });
});

export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'audit:buy');
  const { siteIds } = await readJson(ctx.request, PurchaseCreateSchema);
  const row = await startPurchase(getDb(), { organizationId: workspace.id, userId: user.id, email: user.email, name: user.name }, siteIds);
  return json({ purchase: toPurchaseDto(row), checkoutUrl: row.checkoutUrl }, 201);
});
