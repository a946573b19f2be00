import { endpoint, readJson } from '@/lib/api/handler';
import { json } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requireSession } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { listWorkspaces } from '@/lib/db/workspaces';
import { recordEvent } from '@/lib/db/audit-log';
import { WorkspaceCreateSchema } from '@/lib/schemas/workspace';
import { randomBytes } from 'node:crypto';

export const prerender = false;

export const GET = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  return json({ workspaces: await listWorkspaces(getDb(), user.id) });
});

/** Creates a workspace with the caller as its Owner and makes it the active one. */
export const POST = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  const { name } = await readJson(ctx.request, WorkspaceCreateSchema);
  const slug = `${name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'workspace'}-${randomBytes(3).toString('hex')}`;
  const org = await authCall(() => auth.api.createOrganization({ headers: ctx.request.headers, body: { name, slug } }));
  if (!org) throw new Error('workspace creation returned nothing');
  await authCall(() => auth.api.setActiveOrganization({ headers: ctx.request.headers, body: { organizationId: org.id } }));
  await recordEvent(getDb(), org.id, user.id, { action: 'workspace.created', subjectType: 'workspace', subjectId: org.id, detail: { name } });
  return json({ workspace: { id: org.id, name: org.name, slug: org.slug, role: 'owner' } }, 201);
});
