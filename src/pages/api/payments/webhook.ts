import { endpoint } from '@/lib/api/handler';
import { z } from 'zod';
import { ApiError, fromZod, json } from '@/lib/api/errors';
import { getDb } from '@/lib/db/client';
import { handleEvent, verifyEvent } from '@/lib/payments/webhook';

export const prerender = false;

const MAX_BYTES = 512 * 1024;

/**
 * The envelope handleEvent reads. A correctly signed body is still checked: JSON that is not an
 * event (an array, null, no id, data not an object) is a 400 naming the field, not a crash. Open
 * objects: the provider adds fields over time and they are not ours to refuse.
 */
const EventEnvelope = z.looseObject({
  id: z.string().min(1).max(255),
  type: z.string().min(1).max(255),
  data: z.looseObject({ object: z.looseObject({}) }),
});

/** Server-to-server: no session, no Origin; the signature over the raw body is the only proof. */
export const POST = endpoint(async (ctx) => {
  const raw = await ctx.request.text();
  if (raw.length > MAX_BYTES) throw new ApiError(413, 'too_large', 'The event is larger than 512 KB.');
  const event = verifyEvent(raw, ctx.request.headers.get('stripe-signature'));
  const envelope = EventEnvelope.safeParse(event);
  if (!envelope.success) throw fromZod(envelope.error);
  return json(await handleEvent(getDb(), event));
});
