/**
 * The payment webhook: verify the signature over the raw body with the SDK, then apply the
 * event exactly once (the event id is the key of payment_event, written in the same
 * transaction as the grant, so a replay or a concurrent second delivery grants nothing).
 */
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { ApiError } from '../api/errors';
import { getConfig } from '../config';
import type { Db } from '../db/client';
import { paymentEvent } from '../db/schema';
import { applyExpiredSession, applyPaidSession, type Applied, type Outcome } from './fulfil';
import { sendReceipt } from './receipt-mail';
import { getStripe, WEBHOOK_TOLERANCE_SECONDS } from './stripe';

export type WebhookResult = { received: true; eventId: string; type: string; outcome: Outcome | 'duplicate'; purchaseId: string | null };

/** Verifies and parses an event; 400 for a missing, forged or stale signature. */
export function verifyEvent(rawBody: string, signature: string | null): Stripe.Event {
  if (!signature) throw new ApiError(400, 'signature_missing', 'The Stripe-Signature header is missing.');
  try {
    return getStripe().webhooks.constructEvent(rawBody, signature, getConfig().STRIPE_WEBHOOK_SECRET, WEBHOOK_TOLERANCE_SECONDS);
  } catch (e) {
    const stale = /timestamp outside the tolerance zone/i.test((e as Error).message);
    throw new ApiError(400, stale ? 'signature_stale' : 'signature_invalid', stale ? `The signature is older than ${WEBHOOK_TOLERANCE_SECONDS} seconds.` : 'The signature does not match the body.');
  }
}

export async function handleEvent(db: Db, event: Stripe.Event): Promise<WebhookResult> {
  const applied = await db.transaction(async (tx): Promise<Applied | 'duplicate'> => {
    const fresh = await tx.insert(paymentEvent).values({ id: event.id, type: event.type, outcome: 'processing' }).onConflictDoNothing().returning({ id: paymentEvent.id });
    if (fresh.length === 0) return 'duplicate';
    let result: Applied;
    if (event.type === 'checkout.session.completed' || event.type === 'checkout.session.async_payment_succeeded') result = await applyPaidSession(tx, event.data.object, 'webhook');
    else if (event.type === 'checkout.session.expired') result = await applyExpiredSession(tx, event.data.object);
    else result = { outcome: 'ignored', purchase: null };
    await tx
      .update(paymentEvent)
      .set({ outcome: result.outcome, organizationId: result.purchase?.organizationId ?? null, purchaseId: result.purchase?.id ?? null, detail: result.detail ?? null })
      .where(eq(paymentEvent.id, event.id));
    return result;
  });
  if (applied === 'duplicate') return { received: true, eventId: event.id, type: event.type, outcome: 'duplicate', purchaseId: null };
  if (applied.outcome === 'granted' && applied.purchase) sendReceipt(applied.purchase, applied.workspaceName ?? '');
  if (applied.outcome !== 'granted' && applied.outcome !== 'expired' && applied.outcome !== 'ignored') console.warn(`[payments] event ${event.id} (${event.type}) not applied: ${applied.outcome}`, applied.detail ?? '');
  return { received: true, eventId: event.id, type: event.type, outcome: applied.outcome, purchaseId: applied.purchase?.id ?? null };
}
