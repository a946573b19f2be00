import { describe, expect, it } from 'vitest';
import { PERMISSIONS, ROLES, can, isRole, permissionsOf, type Permission } from '../../../src/lib/auth/permissions';

// The permission table is our own product decision (no external source); these rows pin it.
const EXPECTED: [Permission, owner: boolean, energy: boolean, consultant: boolean, finance: boolean][] = [
  ['site:view', true, true, true, true],
  ['site:create', true, true, true, false],
  ['site:edit', true, true, true, false],
  ['site:delete', true, false, false, false],
  ['meter:upload', true, true, true, false],
  ['bill:upload', true, true, true, false],
  ['tariff:edit', true, true, true, false],
  ['plan:create', true, true, true, false],
  ['report:issue', true, false, true, false],
  ['audit:buy', true, false, true, false],
  ['economics:view', true, true, true, true],
  ['members:manage', true, false, false, false],
  ['audit-log:view', true, false, false, false],
];

describe('permission table', () => {
  it('has a row here for every permission', () => {
    expect(EXPECTED.map((r) => r[0]).sort()).toEqual(Object.keys(PERMISSIONS).sort());
  });

  it.each(EXPECTED)('%s: owner %s, energy manager %s, consultant %s, finance %s', (perm, ...grants) => {
    ROLES.forEach((role, i) => expect(can(role, perm), `${role} / ${perm}`).toBe(grants[i]));
  });

  it('Finance can change nothing: every permission it holds is a read', () => {
    expect(permissionsOf('finance')).toEqual(['site:view', 'economics:view']);
  });

  it.each([null, undefined, '', 'admin', 'member', 'OWNER'])('grants nothing to the unknown role %j', (role) => {
    expect(isRole(role)).toBe(false);
    expect(permissionsOf(role)).toEqual([]);
    expect(can(role, 'site:view')).toBe(false);
  });
});
