import { endpoint } from '@/lib/api/handler';
import { ApiError, json } from '@/lib/api/errors';
import { getDb } from '@/lib/db/client';
import { handleEvent, verifyEvent } from '@/lib/payments/webhook';

export const prerender = false;

const MAX_BYTES = 512 * 1024;

/** Server-to-server: no session, no Origin; the signature over the raw body is the only proof. */
export const POST = endpoint(async (ctx) => {
  const raw = await ctx.request.text();
  if (raw.length > MAX_BYTES) throw new ApiError(413, 'too_large', 'The event is larger than 512 KB.');
  const event = verifyEvent(raw, ctx.request.headers.get('stripe-signature'));
  return json(await handleEvent(getDb(), event));
});
