import { endpoint, readJson } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requireSession } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { listWorkspaces } from '@/lib/db/workspaces';
import { WorkspaceSwitchSchema } from '@/lib/schemas/workspace';

export const prerender = false;

/** Switches the session's active workspace (only to one the person belongs to). */
export const PUT = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  const { workspaceId } = await readJson(ctx.request, WorkspaceSwitchSchema);
  const mine = await listWorkspaces(getDb(), user.id);
  const target = mine.find((w) => w.id === workspaceId);
  if (!target) throw notFound('Workspace');
  await authCall(() => auth.api.setActiveOrganization({ headers: ctx.request.headers, body: { organizationId: workspaceId } }));
  return json({ workspace: target });
});
