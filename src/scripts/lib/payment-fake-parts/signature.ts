/**
 * Webhook signing as the payment provider does it: `Stripe-Signature: t=<unix seconds>,v1=<hex>`
 * where v1 = HMAC-SHA256(webhook secret, `${t}.${payload}`). Written out here (not borrowed from
 * the SDK) so that the app's verification with the SDK checks an independent implementation.
 */
import { createHmac } from 'node:crypto';

export function signPayload(payload: string, secret: string, timestampSeconds = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac('sha256', secret).update(`${timestampSeconds}.${payload}`, 'utf8').digest('hex');
  return `t=${timestampSeconds},v1=${v1}`;
}
