import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requirePermission } from '@/lib/auth/guards';
import { getDb } from '@/lib/db/client';
import { listMembers } from '@/lib/db/workspaces';

export const prerender = false;

/** The members of the active workspace; every member may see who else is in it. */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'site:view');
  const members = await listMembers(getDb(), workspace.id);
  return json({ members: members.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })) });
});
