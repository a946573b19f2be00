import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { paybackTable } from '@/lib/payback/table';

export const prerender = false;

/** Every saved plan of the workspace with its economics, and totals per currency. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'economics:view');
  return json(await paybackTable(getDb(), workspace));
});
