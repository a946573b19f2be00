/**
 * The adapter around the payment provider's official SDK. Where its calls go (the local fake
 * or the real API) comes from configuration only; no other module constructs the client.
 */
import Stripe from 'stripe';
import { getConfig } from '../config';

let client: Stripe | undefined;

export function getStripe(): Stripe {
  if (!client) {
    const cfg = getConfig();
    const api = cfg.paymentApi;
    client = new Stripe(cfg.STRIPE_SECRET_KEY, { host: api.host, port: api.port, protocol: api.protocol, maxNetworkRetries: 2, timeout: 20_000, telemetry: false });
  }
  return client;
}

/** Webhook signatures older than this are refused (the provider's own default tolerance). */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

export type { Stripe };
