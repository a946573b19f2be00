/** Queries about workspaces (better-auth organizations) and their members. */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { member, organization, user } from './schema';

export type WorkspaceContext = { id: string; name: string; slug: string; role: string; memberId: string };

/** The workspace a request acts in: the session's active one if still a member, else the first. */
export async function resolveWorkspace(db: Db, userId: string, activeOrganizationId: string | null | undefined): Promise<WorkspaceContext | null> {
  const rows = await db
    .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role, memberId: member.id })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(eq(member.userId, userId))
    .orderBy(asc(member.createdAt));
  return rows.find((r) => r.id === activeOrganizationId) ?? rows[0] ?? null;
}

/** Every workspace a person belongs to, with their role in each (for the switcher). */
export async function listWorkspaces(db: Db, userId: string) {
  return db
    .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(eq(member.userId, userId))
    .orderBy(asc(organization.name));
}

/** Members of one workspace with their names and e-mail addresses. */
export async function listMembers(db: Db, organizationId: string) {
  return db
    .select({ id: member.id, userId: user.id, name: user.name, email: user.email, role: member.role, createdAt: member.createdAt })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, organizationId))
    .orderBy(asc(user.name));
}

export async function findMember(db: Db, organizationId: string, memberId: string) {
  return db.query.member.findFirst({ where: and(eq(member.organizationId, organizationId), eq(member.id, memberId)) });
}
