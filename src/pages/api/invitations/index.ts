import { endpoint, readJson } from '@/lib/api/handler';
import { ApiError, json } from '@/lib/api/errors';
import { authCall } from '@/lib/api/auth-call';
import { requirePermission } from '@/lib/auth/guards';
import { auth } from '@/lib/auth/auth';
import { getDb } from '@/lib/db/client';
import { listMembers } from '@/lib/db/workspaces';
import { invitationDto, listPendingInvitations } from '@/lib/db/invitations';
import { recordEvent } from '@/lib/db/audit-log';
import { InviteSchema } from '@/lib/schemas/workspace';
import { deliveriesOf } from '@/lib/mail/outbox';

export const prerender = false;

/** Pending invitations of the active workspace (Owners only). */
export const GET = endpoint(async (ctx) => {
  const { workspace } = requirePermission(ctx, 'members:manage');
  const rows = await listPendingInvitations(getDb(), workspace.id);
  const mail = await deliveriesOf(getDb(), workspace.id, 'invitation', rows.map((r) => r.id));
  return json({ invitations: rows.map((r) => ({ ...invitationDto(r), mail: mail.get(r.id) ?? null })) });
});

/** Invites someone by e-mail with a role; the invitation mail goes through the SMTP sink. */
export const POST = endpoint(async (ctx) => {
  const { workspace, user } = requirePermission(ctx, 'members:manage');
  const { email, role } = await readJson(ctx.request, InviteSchema);
  const members = await listMembers(getDb(), workspace.id);
  if (members.some((m) => m.email.toLowerCase() === email)) {
    throw new ApiError(409, 'already_member', `${email} is already a member of this workspace.`, { email: 'Already a member.' });
  }
  const inv = await authCall(() =>
    auth.api.createInvitation({ headers: ctx.request.headers, body: { email, role, organizationId: workspace.id, resend: true } }),
  );
  await recordEvent(getDb(), workspace.id, user.id, { action: 'member.invited', subjectType: 'invitation', subjectId: inv.id, detail: { email, role } });
  // The invitation is saved either way; `mail` says whether its e-mail went out or is delayed (kept and retried).
  const mail = (await deliveriesOf(getDb(), workspace.id, 'invitation', [inv.id])).get(inv.id) ?? null;
  return json({ invitation: { id: inv.id, email: inv.email, role: inv.role, status: inv.status, expiresAt: new Date(inv.expiresAt).toISOString(), mail } }, 201);
});
