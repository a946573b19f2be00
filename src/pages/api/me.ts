import { endpoint } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { requireSession } from '@/lib/auth/guards';
import { permissionsOf } from '@/lib/auth/permissions';
import { getDb } from '@/lib/db/client';
import { listWorkspaces } from '@/lib/db/workspaces';

export const prerender = false;

/** Who is signed in, the active workspace, their permissions there, and all their workspaces. */
export const GET = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  const ws = ctx.locals.workspace;
  return json({
    user: { id: user.id, name: user.name, email: user.email, emailVerified: user.emailVerified },
    workspace: ws ? { id: ws.id, name: ws.name, slug: ws.slug, role: ws.role } : null,
    permissions: permissionsOf(ws?.role),
    workspaces: await listWorkspaces(getDb(), user.id),
  });
});
