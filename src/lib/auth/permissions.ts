/**
 * The one permission table. Every page and endpoint asks `can(role, permission)` through the
 * guard module; nothing else decides who may do what. Finance reads and changes nothing.
 */
export const ROLES = ['owner', 'energy_manager', 'consultant', 'finance'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  energy_manager: 'Energy manager',
  consultant: 'Consultant',
  finance: 'Finance',
};

export const PERMISSIONS = {
  'site:view': 'See sites, meter data, bills, tariffs, findings and plans',
  'site:create': 'Add sites to the workspace',
  'site:edit': 'Rename sites and change their details',
  'site:delete': 'Delete a site and everything recorded for it',
  'meter:upload': 'Upload meter data (interval exports)',
  'bill:upload': 'Upload utility bills and their billed figures',
  'tariff:edit': "Edit a site's tariff rules",
  'plan:create': 'Create and change correction plans',
  'report:issue': 'Issue a Savings report',
  'audit:buy': 'Buy Site audits through checkout',
  'economics:view': 'See the payback table (capex, savings, payback, NPV, IRR)',
  'members:manage': 'Invite members, change roles, remove members',
  'audit-log:view': 'Read the audit log of the workspace',
} as const;
export type Permission = keyof typeof PERMISSIONS;

const ALL = Object.keys(PERMISSIONS) as Permission[];

const TABLE: Record<Role, readonly Permission[]> = {
  owner: ALL,
  energy_manager: ['site:view', 'site:create', 'site:edit', 'meter:upload', 'bill:upload', 'tariff:edit', 'plan:create', 'economics:view'],
  consultant: ['site:view', 'site:create', 'site:edit', 'meter:upload', 'bill:upload', 'tariff:edit', 'plan:create', 'report:issue', 'audit:buy', 'economics:view'],
  finance: ['site:view', 'economics:view'],
};

/** True when a role string names one of our roles. */
export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** Whether `role` grants `permission`. Unknown roles are granted nothing. */
export function can(role: string | null | undefined, permission: Permission): boolean {
  return isRole(role) && TABLE[role].includes(permission);
}

/** The permissions of a role, in table order (sent to the browser to shape the UI only). */
export function permissionsOf(role: string | null | undefined): Permission[] {
  return isRole(role) ? ALL.filter((p) => TABLE[role].includes(p)) : [];
}
