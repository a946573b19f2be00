import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { json, notFound } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requirePermission, requireSession } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { getInvitationDetail, invitationDto } from '@/lib/db/invitations';
import { recordEvent } from '@/lib/db/audit-log';

export const prerender = false;
const Params = z.object({ invitationId: z.string().min(1).max(64) });

/** The invitation as its invitee sees it: only the invited address may read it. */
export const GET = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  const { invitationId } = readParams(ctx.params, Params);
  const found = await getInvitationDetail(getDb(), invitationId);
  if (!found || found.inv.email.toLowerCase() !== user.email.toLowerCase()) throw notFound('Invitation');
  return json({ invitation: invitationDto(found.inv, { workspaceName: found.workspaceName, inviterName: found.inviterName }) });
});

/** Cancels a pending invitation (Owners of its workspace only). */
export const DELETE = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'members:manage');
  const { invitationId } = readParams(ctx.params, Params);
  const found = await getInvitationDetail(getDb(), invitationId);
  if (!found || found.inv.organizationId !== workspace.id) throw notFound('Invitation');
  await authCall(() => auth.api.cancelInvitation({ headers: ctx.request.headers, body: { invitationId } }));
  await recordEvent(getDb(), workspace.id, user.id, { action: 'member.invitation_cancelled', subjectType: 'invitation', subjectId: invitationId });
  return new Response(null, { status: 204 });
});
