/** Site audit purchases and the payment provider's webhook. */
import { z } from 'zod';
import type { RouteDoc } from '../route-doc';
import { PriceSchema, PurchaseCreateSchema, PurchaseSchema } from '../../payments/schemas';

const purchaseParams = z.object({ purchaseId: z.string().meta({ description: 'Purchase id', example: 'pur_9Xc...' }) });
const WebhookResultSchema = z.object({
  received: z.literal(true),
  eventId: z.string(),
  type: z.string(),
  outcome: z.string().meta({ description: 'granted, duplicate, expired, ignored, or why nothing was granted: unknown_purchase, session_mismatch, not_paid, already_paid, purchase_closed, amount_mismatch, unknown_site' }),
  purchaseId: z.string().nullable(),
});

export const PURCHASE_ROUTES: RouteDoc[] = [
  { method: 'get', path: '/api/purchases', summary: "The workspace's Site audit purchases, newest first, and the price of one Site audit", tag: 'Purchases', permission: 'site:view', ok: { status: 200, schema: z.object({ purchases: z.array(PurchaseSchema), price: PriceSchema }), description: 'Purchases' }, errors: [401] },
  { method: 'post', path: '/api/purchases', summary: 'Start a checkout for one Site audit per Draft site; answers the hosted payment page URL', tag: 'Purchases', permission: 'audit:buy', body: PurchaseCreateSchema, ok: { status: 201, schema: z.object({ purchase: PurchaseSchema, checkoutUrl: z.string() }), description: 'Checkout started' }, errors: [400, 401, 403, 404, 409, 502] },
  { method: 'get', path: '/api/purchases/{purchaseId}', summary: 'Read a purchase; a pending one is first brought up to date from the payment provider', tag: 'Purchases', permission: 'site:view', params: purchaseParams, ok: { status: 200, schema: z.object({ purchase: PurchaseSchema }), description: 'Purchase' }, errors: [401, 404] },
  { method: 'post', path: '/api/purchases/{purchaseId}/cancel', summary: 'Cancel a pending purchase: closes its checkout so it cannot be paid later', tag: 'Purchases', permission: 'audit:buy', params: purchaseParams, ok: { status: 200, schema: z.object({ purchase: PurchaseSchema }), description: 'Cancelled, or its state when already paid or expired' }, errors: [401, 403, 404] },
  { method: 'post', path: '/api/payments/webhook', summary: "The payment provider's webhook (checkout.session.completed / expired), verified by the Stripe-Signature header over the raw body; applied at most once per event id", tag: 'Purchases', permission: 'public (signed)', body: z.record(z.string(), z.unknown()).meta({ description: 'The provider event, exactly as sent' }), ok: { status: 200, schema: WebhookResultSchema, description: 'Event received' }, errors: [400, 413] },
];
