/**
 * better-auth's organization plugin needs its own role objects to authorise invitations and
 * member changes. They are derived from our permission table so there is one source of truth:
 * only roles holding `members:manage` get the plugin's organization-management statements.
 */
import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements, ownerAc } from 'better-auth/plugins/organization/access';
import { ROLES, can, type Role } from './permissions';

export const ac = createAccessControl(defaultStatements);

export const orgRoles = Object.fromEntries(
  ROLES.map((r) => [r, can(r, 'members:manage') ? ac.newRole(ownerAc.statements) : ac.newRole({})]),
) as Record<Role, ReturnType<typeof ac.newRole>>;
