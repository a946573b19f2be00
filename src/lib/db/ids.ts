import { randomBytes } from 'node:crypto';

/** Random, non-enumerable ids with a readable prefix, e.g. `site_Jx3...`. */
export function newId(prefix: string): string {
  return `${prefix}_${randomBytes(12).toString('base64url')}`;
}
