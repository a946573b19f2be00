import { z } from 'zod';
import { endpoint, readParams } from '@/lib/api/handler';
import { ApiError, json, notFound } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requireSession } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { getInvitationDetail } from '@/lib/db/invitations';
import { recordEvent } from '@/lib/db/audit-log';

export const prerender = false;
const Params = z.object({ invitationId: z.string().min(1).max(64) });

/** Accepts an invitation addressed to the signed-in person and switches to that workspace. */
export const POST = endpoint(async (ctx) => {
  const { user } = requireSession(ctx);
  const { invitationId } = readParams(ctx.params, Params);
  const found = await getInvitationDetail(getDb(), invitationId);
  if (!found || found.inv.email.toLowerCase() !== user.email.toLowerCase()) throw notFound('Invitation');
  if (found.inv.status !== 'pending') throw new ApiError(409, 'not_pending', `This invitation is ${found.inv.status}. Ask an Owner of ${found.workspaceName} for a new one.`);
  if (found.inv.expiresAt.getTime() < Date.now()) throw new ApiError(410, 'expired', `This invitation expired. Ask an Owner of ${found.workspaceName} for a new one.`);
  await authCall(() => auth.api.acceptInvitation({ headers: ctx.request.headers, body: { invitationId } }));
  await authCall(() => auth.api.setActiveOrganization({ headers: ctx.request.headers, body: { organizationId: found.inv.organizationId } }));
  await recordEvent(getDb(), found.inv.organizationId, user.id, { action: 'member.joined', subjectType: 'invitation', subjectId: invitationId, detail: { role: found.inv.role } });
  return json({ workspace: { id: found.inv.organizationId, name: found.workspaceName, role: found.inv.role } });
});
