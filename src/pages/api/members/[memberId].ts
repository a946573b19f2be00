import { z } from 'zod';
import { endpoint, readJson, readParams } from '@/lib/api/handler';
import { ApiError, json, notFound } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requirePermission } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { findMember, listMembers } from '@/lib/db/workspaces';
import { recordEvent } from '@/lib/db/audit-log';
import { MemberRoleSchema } from '@/lib/schemas/workspace';

export const prerender = false;
const Params = z.object({ memberId: z.string().min(1).max(64) });

async function lastOwnerGuard(organizationId: string, memberId: string) {
  const members = await listMembers(getDb(), organizationId);
  const owners = members.filter((m) => m.role === 'owner');
  if (owners.length === 1 && owners[0]!.id === memberId) {
    throw new ApiError(409, 'last_owner', 'A workspace needs at least one Owner. Make someone else Owner first.');
  }
}

/** Changes a member's role (Owners only). */
export const PATCH = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'members:manage');
  const { memberId } = readParams(ctx.params, Params);
  const target = await findMember(getDb(), workspace.id, memberId);
  if (!target) throw notFound('Member');
  const { role } = await readJson(ctx.request, MemberRoleSchema);
  if (target.role === 'owner' && role !== 'owner') await lastOwnerGuard(workspace.id, memberId);
  await authCall(() => auth.api.updateMemberRole({ headers: ctx.request.headers, body: { memberId, role, organizationId: workspace.id } }));
  await recordEvent(getDb(), workspace.id, user.id, { action: 'member.role_changed', subjectType: 'member', subjectId: memberId, detail: { from: target.role, to: role } });
  return json({ member: { id: memberId, role } });
});

/** Removes a member from the workspace (Owners only). */
export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'members:manage');
  const { memberId } = readParams(ctx.params, Params);
  const target = await findMember(getDb(), workspace.id, memberId);
  if (!target) throw notFound('Member');
  if (target.role === 'owner') await lastOwnerGuard(workspace.id, memberId);
  await authCall(() => auth.api.removeMember({ headers: ctx.request.headers, body: { memberIdOrEmail: memberId, organizationId: workspace.id } }));
  await recordEvent(getDb(), workspace.id, user.id, { action: 'member.removed', subjectType: 'member', subjectId: memberId, detail: { userId: target.userId } });
  return new Response(null, { status: 204 });
});
