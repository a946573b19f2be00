/**
 * Every request: origin check on state-changing calls, session and active workspace into
 * Astro.locals, security headers on the way out.
 */
import { defineMiddleware } from 'astro:middleware';
import { auth } from './lib/auth/auth';
import { getConfig } from './lib/config';
import { getDb } from './lib/db/client';
import { resolveWorkspace } from './lib/db/workspaces';
import { errorResponse, ApiError } from './lib/api/errors';
import { markStaleImportsInterrupted } from './lib/db/meter-imports';
import { sweepTemp } from './lib/files/store';
import { changesIdentity, forgetAll, recall, remember, sessionKey } from './lib/auth/session-cache';

const cfg = getConfig();
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

const SECURITY_HEADERS: Record<string, string> = {
  'x-content-type-options': 'nosniff',
  'x-frame-options': 'DENY',
  'referrer-policy': 'same-origin',
  'cross-origin-opener-policy': 'same-origin',
  'permissions-policy': 'camera=(), microphone=(), geolocation=()',
  'content-security-policy': [
    "default-src 'self'",
    "script-src 'self' 'unsafe-inline'",
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "frame-ancestors 'none'",
    "form-action 'self'",
    "base-uri 'self'",
    "object-src 'none'",
  ].join('; '),
  // Browsers only honour HSTS over https; sent when the public URL is https (a year, subdomains too).
  ...(cfg.baseUrl.startsWith('https://') ? { 'strict-transport-security': 'max-age=31536000; includeSubDomains' } : {}),
};

/** A state-changing request must come from our own pages (or a non-browser client sending no cookie). */
function originAllowed(request: Request): boolean {
  const origin = request.headers.get('origin');
  if (origin) return origin === cfg.baseUrl;
  // No Origin header: only acceptable without a session cookie (scripts, webhooks, curl).
  return !(request.headers.get('cookie') ?? '').includes('varledger');
}

// Once per process: imports a stopped server left half-way are marked interrupted (their data was never written),
// and its upload temp files are removed.
// With a shared libSQL server another instance may be mid-import, so only imports idle for 10 minutes count.
let recovered: Promise<unknown> | null = null;

export const onRequest = defineMiddleware(async (context, next) => {
  recovered ??= Promise.all([
    markStaleImportsInterrupted(getDb(), cfg.DATABASE_URL.startsWith('file:') ? 0 : 10 * 60_000).catch((e) => console.error('[imports] recovery failed', e)),
    // Upload temp files a killed server left; 15 minutes old at least, so another instance's upload in progress is kept.
    sweepTemp(15 * 60_000).catch((e) => console.error('[files] temp sweep failed', e)),
  ]);
  await recovered;
  context.locals.user = null;
  context.locals.session = null;
  context.locals.workspace = null;
  if (context.isPrerendered) return next();

  const { request } = context;
  const path = context.url.pathname;
  // better-auth checks its own routes too; a sign-in posted from another site's page (login CSRF) is refused here first.
  const foreignAuthPost = path.startsWith('/api/auth/') && !!request.headers.get('origin') && request.headers.get('origin') !== cfg.baseUrl;
  if (!SAFE.has(request.method) && (foreignAuthPost || (!path.startsWith('/api/auth/') && !originAllowed(request)))) {
    return errorResponse(new ApiError(403, 'bad_origin', 'This request did not come from a Varledger page. Reload the page and try again.'));
  }

  const identityChange = changesIdentity(request.method, path);
  if (identityChange) forgetAll();
  const key = sessionKey(request.headers.get('cookie'));
  const known = key && !identityChange ? recall(key) : null;
  if (known) {
    context.locals.user = known.user;
    context.locals.session = known.session;
    context.locals.workspace = known.workspace;
  } else if (key) {
    const found = await auth.api.getSession({ headers: request.headers });
    if (found) {
      context.locals.user = found.user;
      context.locals.session = found.session;
      context.locals.workspace = await resolveWorkspace(getDb(), found.user.id, found.session.activeOrganizationId);
      if (!identityChange) remember(key, { user: found.user, session: found.session, workspace: context.locals.workspace });
    }
  }

  const response = await next();
  if (identityChange) forgetAll();
  for (const [k, v] of Object.entries(SECURITY_HEADERS)) if (!response.headers.has(k)) response.headers.set(k, v);
  if (path.startsWith('/api/')) response.headers.set('cache-control', 'no-store');
  return response;
});
