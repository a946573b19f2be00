/** Schemas for workspaces, members and invitations (shared by forms and endpoints). */
import { z } from 'zod';
import { ROLES } from '../auth/permissions';

export const RoleSchema = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` }).meta({ id: 'Role', description: 'owner, energy_manager, consultant or finance' });

export const WorkspaceCreateSchema = z
  .strictObject({ name: z.string().trim().min(2, 'Give the workspace a name of at least 2 characters.').max(80, 'Keep the name under 80 characters.').meta({ example: 'Northgate Ceramics' }) })
  .meta({ id: 'WorkspaceCreate' });

export const WorkspaceSwitchSchema = z.strictObject({ workspaceId: z.string().min(1, 'Say which workspace to switch to.') }).meta({ id: 'WorkspaceSwitch' });

export const WorkspaceSchema = z.object({ id: z.string(), name: z.string(), slug: z.string(), role: z.string() }).meta({ id: 'Workspace' });

export const InviteSchema = z
  .strictObject({ email: z.email('Enter a valid e-mail address.').trim().toLowerCase(), role: RoleSchema })
  .meta({ id: 'InvitationCreate' });

export const MemberRoleSchema = z.strictObject({ role: RoleSchema }).meta({ id: 'MemberRoleChange' });

export const MemberSchema = z
  .object({ id: z.string(), userId: z.string(), name: z.string(), email: z.string(), role: z.string(), createdAt: z.string() })
  .meta({ id: 'Member' });

export const InvitationSchema = z
  .object({ id: z.string(), email: z.string(), role: z.string().nullable(), status: z.string(), expiresAt: z.string(), workspaceName: z.string().optional(), inviterName: z.string().optional() })
  .meta({ id: 'Invitation' });

export const MeSchema = z
  .object({
    user: z.object({ id: z.string(), name: z.string(), email: z.string(), emailVerified: z.boolean() }),
    workspace: WorkspaceSchema.nullable(),
    permissions: z.array(z.string()),
    workspaces: z.array(WorkspaceSchema),
  })
  .meta({ id: 'Me' });
