/**
 * The guard module: every page and endpoint checks access here and nowhere else.
 * Endpoints throw ApiError (401 anonymous, 403 role, 409 no workspace); pages redirect.
 */
import type { APIContext, AstroGlobal } from 'astro';
import { ApiError, forbidden, unauthorized } from '../api/errors';
import type { WorkspaceContext } from '../db/workspaces';
import { can, PERMISSIONS, type Permission } from './permissions';

type Ctx = Pick<APIContext, 'locals'> | Pick<AstroGlobal, 'locals'>;

export type SignedIn = { user: NonNullable<App.Locals['user']>; session: NonNullable<App.Locals['session']> };
export type InWorkspace = SignedIn & { workspace: WorkspaceContext };

/** 401 unless signed in. */
export function requireSession(ctx: Ctx): SignedIn {
  const { user, session } = ctx.locals;
  if (!user || !session) throw unauthorized();
  return { user, session };
}

/** 401 unless signed in; 409 when the person has no workspace yet. */
export function requireWorkspace(ctx: Ctx): InWorkspace {
  const signed = requireSession(ctx);
  const workspace = ctx.locals.workspace;
  if (!workspace) throw new ApiError(409, 'no_workspace', 'Create a workspace or accept an invitation first.');
  return { ...signed, workspace };
}

/** 401/409 as above, then 403 unless the role in the active workspace grants `permission`. */
export function requirePermission(ctx: Ctx, permission: Permission): InWorkspace {
  const inWs = requireWorkspace(ctx);
  if (!can(inWs.workspace.role, permission)) throw forbidden(PERMISSIONS[permission].toLowerCase().replace(/^see /, 'see '));
  return inWs;
}

/** Whether the current person may do `permission` (for showing or hiding controls). */
export function allowed(ctx: Ctx, permission: Permission): boolean {
  return !!ctx.locals.workspace && can(ctx.locals.workspace.role, permission);
}

export type PageAccess = { redirect: string } | { ok: InWorkspace } | { signedInOnly: SignedIn };

/**
 * For pages: where to send the visitor when they may not see the page.
 * Anonymous -> sign-in (with return address); no workspace -> create one; no permission -> home.
 */
export function pageAccess(Astro: AstroGlobal, permission?: Permission): { redirect: string } | { ok: InWorkspace } {
  const { user, session, workspace } = Astro.locals;
  if (!user || !session) return { redirect: `/sign-in?next=${encodeURIComponent(Astro.url.pathname + Astro.url.search)}` };
  if (!workspace) return { redirect: '/workspaces/new' };
  if (permission && !can(workspace.role, permission)) return { redirect: '/?denied=1' };
  return { ok: { user, session, workspace } };
}
