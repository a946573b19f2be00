import { endpoint, readParams } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { ActivityQuerySchema, listActivity } from '@/lib/activity/activity';

export const prerender = false;

/** The workspace's activity record, newest first (Owners only). */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'audit-log:view');
  const q = readParams(Object.fromEntries(ctx.url.searchParams), ActivityQuerySchema);
  return json(await listActivity(getDb(), workspace.id, q));
});
