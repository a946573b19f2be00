/** Invitation queries (rows are written by better-auth's organization plugin). */
import { and, desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { invitation, organization, user } from './schema';

export async function listPendingInvitations(db: Db, organizationId: string) {
  return db
    .select()
    .from(invitation)
    .where(and(eq(invitation.organizationId, organizationId), eq(invitation.status, 'pending')))
    .orderBy(desc(invitation.createdAt));
}

/** One invitation with its workspace and inviter names, or null. */
export async function getInvitationDetail(db: Db, invitationId: string) {
  const [row] = await db
    .select({ inv: invitation, workspaceName: organization.name, inviterName: user.name })
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .innerJoin(user, eq(user.id, invitation.inviterId))
    .where(eq(invitation.id, invitationId));
  return row ?? null;
}

export function invitationDto(inv: typeof invitation.$inferSelect, extra: { workspaceName?: string; inviterName?: string } = {}) {
  return { id: inv.id, email: inv.email, role: inv.role, status: inv.status, expiresAt: inv.expiresAt.toISOString(), ...extra };
}
