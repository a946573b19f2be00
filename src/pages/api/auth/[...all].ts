import type { APIRoute } from 'astro';
import { auth } from '@/lib/auth/auth';
import { withClientIp } from '@/lib/auth/client-ip';

export const prerender = false;

/** better-auth's own routes: sign-up, sign-in, verification, reset, organizations (rate-limited per client address). */
export const ALL: APIRoute = async (ctx) => {
  let address: string | undefined;
  try {
    address = ctx.clientAddress;
  } catch {
    address = undefined;
  }
  return auth.handler(await withClientIp(ctx.request, address));
};
