import type { APIRoute } from 'astro';
import { auth } from '@/lib/auth/auth';
import { withClientIp } from '@/lib/auth/client-ip';
import { json } from '@/lib/api/errors';

export const prerender = false;

/**
 * better-auth's own routes: sign-up, sign-in, verification, reset, organizations (rate-limited
 * per client address). A failure on our side inside better-auth (the database locked past the
 * busy window, say) comes back from it as an empty 500; it is answered as 503 in our error shape
 * with a retry hint instead, since nothing was changed and trying again is the remedy.
 */
export const ALL: APIRoute = async (ctx) => {
  let address: string | undefined;
  try {
    address = ctx.clientAddress;
  } catch {
    address = undefined;
  }
  const res = await auth.handler(await withClientIp(ctx.request, address));
  if (res.status < 500) return res;
  console.error(`[auth] ${ctx.request.method} ${ctx.url.pathname} answered ${res.status}`);
  const message = 'The server is busy and could not complete this just now. Nothing was changed; try again in a moment.';
  // `message` at the top level as well, where better-auth's browser client looks for it.
  return json({ error: { code: 'busy', message }, message }, 503, { 'retry-after': '2' });
};
