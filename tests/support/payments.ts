/**
 * Test helpers for purchases: the payment fake's hosted page and control routes over HTTP,
 * the real SDK (pointed at the fake) for signing and reading sessions, and the SQLite file.
 */
import { inject } from 'vitest';
import Stripe from 'stripe';
import { openDb } from '../../src/lib/db/client';
import { TEST_PAYMENT_KEYS } from './payment-keys';
import type { Client } from './http';

export const fakeUrl = () => inject('paymentFakeUrl');

export function sdk(): Stripe {
  const u = new URL(fakeUrl());
  return new Stripe(TEST_PAYMENT_KEYS.secretKey, { host: u.hostname, port: Number(u.port), protocol: 'http', maxNetworkRetries: 0, telemetry: false });
}

/** Submits the fake's card form as a browser would; returns the status and redirect target. */
export async function payOnHostedPage(checkoutUrl: string, card = '4242 4242 4242 4242') {
  const res = await fetch(`${checkoutUrl}/pay`, { method: 'POST', body: new URLSearchParams({ card_number: card, expiry: '11/31', cvc: '314' }), redirect: 'manual' });
  return { status: res.status, location: res.headers.get('location'), html: await res.text() };
}

export type FakeEvent = { id: string; type: string; sessionId: string; payload: string; deliveries: { at: string; signature: string; status: number | null; error: string | null }[] };

export async function fakeEvents(): Promise<FakeEvent[]> {
  const r = await fetch(`${fakeUrl()}/_fake/events`);
  return ((await r.json()) as { data: FakeEvent[] }).data;
}

/** Waits until the fake has delivered an event of `type` for the session and the app answered 2xx. */
export async function deliveredEvent(sessionId: string, type: string, timeoutMs = 20_000): Promise<FakeEvent> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const ev = (await fakeEvents()).find((e) => e.sessionId === sessionId && e.type === type && e.deliveries.some((d) => d.status === 200));
    if (ev) return ev;
    if (Date.now() > deadline) throw new Error(`no delivered ${type} for ${sessionId} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Posts a webhook body to the app with no Origin and no cookie, as the provider does. */
export async function postWebhook(payload: string, signature: string | null) {
  const res = await fetch(`${inject('baseUrl')}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json', ...(signature ? { 'stripe-signature': signature } : {}) }, body: payload });
  const text = await res.text();
  return { status: res.status, json: text ? JSON.parse(text) : null };
}

/** A signed event with the given id, type and session object (signed with the SDK's helper). */
export function signedEvent(id: string, type: string, session: Record<string, unknown>, opts: { secret?: string; timestamp?: number } = {}) {
  const payload = JSON.stringify({ id, object: 'event', api_version: '2025-10-29.clover', created: Math.floor(Date.now() / 1000), type, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, data: { object: session } });
  const signature = sdk().webhooks.generateTestHeaderString({ payload, secret: opts.secret ?? TEST_PAYMENT_KEYS.webhookSecret, ...(opts.timestamp ? { timestamp: opts.timestamp } : {}) });
  return { payload, signature };
}

/** Opens the test run's SQLite file (the same file the server uses). */
export function testDb() {
  return openDb(inject('databaseUrl'));
}

/** Creates Draft sites in the client's active workspace; returns their ids. */
export async function draftSites(c: Client, names: string[]): Promise<string[]> {
  const ids: string[] = [];
  for (const name of names) {
    const r = await c.post('/api/sites', { name, timeZone: 'Europe/Dublin', currency: 'EUR' });
    if (r.status !== 201) throw new Error(`site creation failed: ${r.status} ${JSON.stringify(r.json)}`);
    ids.push(r.json.site.id);
  }
  return ids;
}

export async function auditStates(c: Client, ids: string[]): Promise<string[]> {
  return Promise.all(ids.map(async (id) => (await c.get(`/api/sites/${id}`)).json.site.auditState as string));
}

/** The purchase as listed (the list does not refresh from the provider, so it shows what the webhook did). */
export async function listedPurchase(c: Client, id: string) {
  return ((await c.get('/api/purchases')).json.purchases as { id: string; status: string; receiptNumber: string | null; amountTotal: number }[]).find((p) => p.id === id);
}
