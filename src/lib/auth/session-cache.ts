/**
 * A short-lived, in-process memory of who a session cookie belongs to, so a busy page or
 * endpoint does not ask better-auth and the database on every request (about 1.7 ms each).
 *
 * Safe because: only sessions better-auth found valid are kept; an entry lives 10 s at most and
 * never past the session's own expiry; and every request that can change who someone is or where
 * they belong (any POST to better-auth's routes: sign-in, sign-out, password reset; workspace,
 * member and invitation changes) empties the whole memory before and after it runs. Another
 * server instance on the same database sees such a change within the 10 s.
 */
import type { WorkspaceContext } from '../db/workspaces';

type Found = { user: NonNullable<App.Locals['user']>; session: NonNullable<App.Locals['session']>; workspace: WorkspaceContext | null };
type Entry = Found & { until: number };

const TTL_MS = 10_000;
const MAX_ENTRIES = 5_000;
const memory = new Map<string, Entry>();

const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?varledger\.session_token=([^;]+)/;

/** The session cookie's value, or null without one. */
export function sessionKey(cookieHeader: string | null): string | null {
  const m = cookieHeader?.match(SESSION_COOKIE);
  return m ? m[1]! : null;
}

export function recall(key: string, now = Date.now()): Found | null {
  const e = memory.get(key);
  if (!e) return null;
  if (e.until <= now || new Date(e.session.expiresAt).getTime() <= now) {
    memory.delete(key);
    return null;
  }
  return e;
}

export function remember(key: string, found: Found, now = Date.now()): void {
  memory.delete(key);
  memory.set(key, { ...found, until: now + TTL_MS });
  if (memory.size > MAX_ENTRIES) memory.delete(memory.keys().next().value!);
}

export function forgetAll(): void {
  memory.clear();
}

/** Requests after which a remembered identity or membership may be wrong. */
export function changesIdentity(method: string, path: string): boolean {
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS') return false;
  return path.startsWith('/api/auth/') || path.startsWith('/api/workspaces') || path.startsWith('/api/members') || path.startsWith('/api/invitations');
}
