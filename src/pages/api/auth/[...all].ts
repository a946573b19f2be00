import type { APIRoute } from 'astro';
import { auth } from '@/lib/auth/auth';

export const prerender = false;

/** better-auth's own routes: sign-up, sign-in, verification, reset, organizations. */
export const ALL: APIRoute = (ctx) => auth.handler(ctx.request);
