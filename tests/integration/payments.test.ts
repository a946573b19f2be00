import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHmac } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { as, Client, DEMO } from '../support/http';
import { ownerOfNewWorkspace } from '../support/accounts';
import { waitForMail } from '../support/mailbox';
import { TEST_PAYMENT_KEYS } from '../support/payment-keys';
import { auditEvent, paymentEvent, purchase } from '../../src/lib/db/schema';
import { auditStates, deliveredEvent, draftSites, fakeUrl, listedPurchase, payOnHostedPage, postWebhook, sdk, signedEvent, testDb } from '../support/payments';

const db = testDb();
let buyer: Awaited<ReturnType<typeof ownerOfNewWorkspace>>;

beforeAll(async () => {
  await db.ready;
  buyer = await ownerOfNewWorkspace('payer');
});
afterAll(() => db.db.$client.close());

async function buy(c: Client, siteIds: string[]) {
  const r = await c.post('/api/purchases', { siteIds });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json as { purchase: { id: string; status: string; amountTotal: number; currency: string }; checkoutUrl: string };
}
const sessionIdOf = async (purchaseId: string) => (await db.db.query.purchase.findFirst({ where: eq(purchase.id, purchaseId) }))!.checkoutSessionId!;
const eventRow = (id: string) => db.db.query.paymentEvent.findFirst({ where: eq(paymentEvent.id, id) });
const paidEvents = (purchaseId: string) => db.db.select().from(auditEvent).where(and(eq(auditEvent.subjectId, purchaseId), eq(auditEvent.action, 'purchase.paid')));
/** The session as the provider holds it, shaped as a paid one (for events the fake would never send). */
async function paidShape(sessionId: string) {
  const s = await sdk().checkout.sessions.retrieve(sessionId);
  return { ...s, status: 'complete', payment_status: 'paid', payment_intent: 'pi_test_handmade' } as unknown as Record<string, unknown>;
}

describe('paying on the hosted page', () => {
  it('creates one line item per site, pays with the test card, and the signed webhook grants both sites once with a receipt', async () => {
    const ids = await draftSites(buyer.client, ['Quarry Lane Mill', 'Saltmarsh Bottling']);
    const { purchase: p, checkoutUrl } = await buy(buyer.client, ids);
    expect(p).toMatchObject({ status: 'pending', amountTotal: 58_000, currency: 'USD' });
    expect(checkoutUrl.startsWith(`${fakeUrl()}/checkout/cs_test_`)).toBe(true);

    // What the provider holds: two Site audit lines, our ids in the metadata, our return URLs.
    const session = await sdk().checkout.sessions.retrieve(await sessionIdOf(p.id), { expand: ['line_items'] });
    expect(session.line_items!.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ['Site audit: Quarry Lane Mill', 1, 29_000],
      ['Site audit: Saltmarsh Bottling', 1, 29_000],
    ]);
    expect(session.metadata).toEqual({ organization_id: buyer.workspaceId, purchase_id: p.id, site_ids: ids.join(',') });
    expect(session.customer_email).toBe(buyer.email);
    expect(session.success_url).toContain(`/purchases?checkout=paid&purchase=${p.id}`);

    const paid = await payOnHostedPage(checkoutUrl);
    expect(paid.status).toBe(303);
    expect(paid.location).toBe(`${buyer.client.base}/purchases?checkout=paid&purchase=${p.id}&session=${session.id}`);

    const ev = await deliveredEvent(session.id, 'checkout.session.completed');
    await expect.poll(async () => (await listedPurchase(buyer.client, p.id))?.status).toBe('paid');
    expect(await auditStates(buyer.client, ids)).toEqual(['audited', 'audited']);
    expect((await eventRow(ev.id))?.outcome).toBe('granted');
    const listed = await listedPurchase(buyer.client, p.id);
    expect(listed?.receiptNumber).toMatch(/^VLR-\d{8}-[A-Z2-9]{6}$/);
    expect(await paidEvents(p.id)).toHaveLength(1);

    const mail = await waitForMail(buyer.email, new RegExp(`receipt ${listed!.receiptNumber}`));
    expect(mail.text).toContain('Site audit, Quarry Lane Mill: US$290.00');
    expect(mail.text).toContain('Total paid: US$580.00');
    expect(mail.text).toContain(`${buyer.client.base}/purchases?receipt=${p.id}`);

    // The signature is the provider's scheme: v1 = HMAC-SHA256(secret, t + "." + payload), hex.
    const delivery = ev.deliveries.find((d) => d.status === 200)!;
    const [, t, v1] = delivery.signature.match(/^t=(\d+),v1=([0-9a-f]{64})$/)!;
    expect(createHmac('sha256', TEST_PAYMENT_KEYS.webhookSecret).update(`${t}.${ev.payload}`).digest('hex')).toBe(v1);
    expect(sdk().webhooks.generateTestHeaderString({ payload: ev.payload, secret: TEST_PAYMENT_KEYS.webhookSecret, timestamp: Number(t) })).toBe(delivery.signature);
    expect(sdk().webhooks.constructEvent(ev.payload, delivery.signature, TEST_PAYMENT_KEYS.webhookSecret, Math.floor(Date.now() / 1000) - Number(t) + 60).id).toBe(ev.id);

    // Replays: the same event again (freshly signed, as a retry is) and the fake's own re-delivery.
    const again = await postWebhook(ev.payload, sdk().webhooks.generateTestHeaderString({ payload: ev.payload, secret: TEST_PAYMENT_KEYS.webhookSecret }));
    expect(again).toMatchObject({ status: 200, json: { outcome: 'duplicate', eventId: ev.id } });
    const resent = await (await fetch(`${fakeUrl()}/_fake/events/${ev.id}/resend`, { method: 'POST' })).json();
    expect(resent.delivery.status).toBe(200);
    // A different event about the same paid session grants nothing either.
    const second = signedEvent('evt_test_secondcopy01', 'checkout.session.completed', JSON.parse(ev.payload).data.object);
    expect(await postWebhook(second.payload, second.signature)).toMatchObject({ status: 200, json: { outcome: 'already_paid', purchaseId: p.id } });
    expect(await paidEvents(p.id)).toHaveLength(1);
    expect((await listedPurchase(buyer.client, p.id))?.receiptNumber).toBe(listed!.receiptNumber);
  });

  it('a declined card shows the decline on the hosted page and changes nothing', async () => {
    const ids = await draftSites(buyer.client, ['Declined Works']);
    const { purchase: p, checkoutUrl } = await buy(buyer.client, ids);
    const declined = await payOnHostedPage(checkoutUrl, '4000 0000 0000 0002');
    expect(declined.status).toBe(402);
    expect(declined.html).toContain('Your card was declined.');
    expect((await sdk().checkout.sessions.retrieve(await sessionIdOf(p.id))).status).toBe('open');
    expect((await buyer.client.get(`/api/purchases/${p.id}`)).json.purchase.status).toBe('pending');
    expect(await auditStates(buyer.client, ids)).toEqual(['draft']);
  });
});

describe('the webhook refuses what it cannot trust', () => {
  let pending: { id: string; sessionId: string; siteIds: string[] };
  beforeAll(async () => {
    const siteIds = await draftSites(buyer.client, ['Forgery Target Plant']);
    const { purchase: p } = await buy(buyer.client, siteIds);
    pending = { id: p.id, sessionId: await sessionIdOf(p.id), siteIds };
  });

  it('answers 400 to a missing, forged or altered signature and grants nothing', async () => {
    const ev = signedEvent('evt_test_forged00001', 'checkout.session.completed', await paidShape(pending.sessionId), { secret: 'whsec_notTheRealOne123' });
    expect(await postWebhook(ev.payload, ev.signature)).toMatchObject({ status: 400, json: { error: { code: 'signature_invalid' } } });
    expect(await postWebhook(ev.payload, null)).toMatchObject({ status: 400, json: { error: { code: 'signature_missing' } } });
    const honest = signedEvent('evt_test_altered0001', 'checkout.session.completed', await paidShape(pending.sessionId));
    expect((await postWebhook(honest.payload.replace('"livemode":false', '"livemode":true'), honest.signature)).status).toBe(400);
    expect((await postWebhook(honest.payload, 't=1700000000,v1=' + '0'.repeat(64))).status).toBe(400);
    expect(await eventRow('evt_test_forged00001')).toBeUndefined();
    expect(await eventRow('evt_test_altered0001')).toBeUndefined();
    expect(await auditStates(buyer.client, pending.siteIds)).toEqual(['draft']);
    expect((await listedPurchase(buyer.client, pending.id))?.status).toBe('pending');
  });

  it('answers 400 to a correctly signed event older than 300 seconds', async () => {
    const ev = signedEvent('evt_test_stale000001', 'checkout.session.completed', await paidShape(pending.sessionId), { timestamp: Math.floor(Date.now() / 1000) - 301 });
    expect(await postWebhook(ev.payload, ev.signature)).toMatchObject({ status: 400, json: { error: { code: 'signature_stale' } } });
    expect(await eventRow('evt_test_stale000001')).toBeUndefined();
    expect(await auditStates(buyer.client, pending.siteIds)).toEqual(['draft']);
  });

  it('records an event for a purchase it does not know, and grants nothing', async () => {
    const shape = { ...(await paidShape(pending.sessionId)), metadata: { organization_id: buyer.workspaceId, purchase_id: 'pur_doesNotExist00', site_ids: pending.siteIds.join(',') }, client_reference_id: null };
    const ev = signedEvent('evt_test_unknownpur1', 'checkout.session.completed', shape);
    expect(await postWebhook(ev.payload, ev.signature)).toMatchObject({ status: 200, json: { outcome: 'unknown_purchase', purchaseId: null } });
    expect((await eventRow('evt_test_unknownpur1'))?.outcome).toBe('unknown_purchase');
    expect(await auditStates(buyer.client, pending.siteIds)).toEqual(['draft']);
  });

  it('refuses a payment whose amount differs from the purchase', async () => {
    const siteIds = await draftSites(buyer.client, ['Mismatch Kilns']);
    const { purchase: p, checkoutUrl } = await buy(buyer.client, siteIds);
    // Our record now expects another amount than the checkout charges.
    await db.db.update(purchase).set({ amountTotal: 12_345 }).where(eq(purchase.id, p.id));
    expect((await payOnHostedPage(checkoutUrl)).status).toBe(303);
    const ev = await deliveredEvent(await sessionIdOf(p.id), 'checkout.session.completed');
    expect((await eventRow(ev.id))?.outcome).toBe('amount_mismatch');
    expect((await eventRow(ev.id))?.detail).toMatchObject({ paid: 29_000, expected: 12_345 });
    expect((await listedPurchase(buyer.client, p.id))?.status).toBe('pending');
    expect(await auditStates(buyer.client, siteIds)).toEqual(['draft']);
    expect(await paidEvents(p.id)).toHaveLength(0);
  });

  it('refuses a payment for a site that is no longer in the workspace', async () => {
    const siteIds = await draftSites(buyer.client, ['Kept Site', 'Deleted Site']);
    const { purchase: p, checkoutUrl } = await buy(buyer.client, siteIds);
    expect((await buyer.client.del(`/api/sites/${siteIds[1]}`)).status).toBe(204);
    await payOnHostedPage(checkoutUrl);
    const ev = await deliveredEvent(await sessionIdOf(p.id), 'checkout.session.completed');
    expect(await eventRow(ev.id)).toMatchObject({ outcome: 'unknown_site', detail: { missingSiteIds: [siteIds[1]] } });
    expect(await auditStates(buyer.client, [siteIds[0]!])).toEqual(['draft']);
    expect((await listedPurchase(buyer.client, p.id))?.status).toBe('pending');
  });

  it('a cancelled purchase closes its checkout, and a later payment event for it grants nothing', async () => {
    const siteIds = await draftSites(buyer.client, ['Cancelled Works']);
    const { purchase: p, checkoutUrl } = await buy(buyer.client, siteIds);
    const cancelled = await buyer.client.post(`/api/purchases/${p.id}/cancel`);
    expect(cancelled.status).toBe(200);
    expect(cancelled.json.purchase).toMatchObject({ status: 'cancelled', checkoutUrl: null });
    const sessionId = await sessionIdOf(p.id);
    expect((await sdk().checkout.sessions.retrieve(sessionId)).status).toBe('expired');
    expect((await fetch(checkoutUrl)).status).toBe(410);
    expect((await payOnHostedPage(checkoutUrl)).status).toBe(410);
    const expiredEv = await deliveredEvent(sessionId, 'checkout.session.expired');
    expect((await eventRow(expiredEv.id))?.outcome).toBe('ignored');

    const late = signedEvent('evt_test_aftercancel', 'checkout.session.completed', await paidShape(sessionId));
    expect(await postWebhook(late.payload, late.signature)).toMatchObject({ status: 200, json: { outcome: 'purchase_closed' } });
    expect((await listedPurchase(buyer.client, p.id))?.status).toBe('cancelled');
    expect(await auditStates(buyer.client, siteIds)).toEqual(['draft']);
  });

  it('a checkout that expires at the provider turns its purchase Expired through the webhook', async () => {
    const siteIds = await draftSites(buyer.client, ['Expiring Works']);
    const { purchase: p } = await buy(buyer.client, siteIds);
    const sessionId = await sessionIdOf(p.id);
    await sdk().checkout.sessions.expire(sessionId);
    const ev = await deliveredEvent(sessionId, 'checkout.session.expired');
    expect((await eventRow(ev.id))?.outcome).toBe('expired');
    expect((await listedPurchase(buyer.client, p.id))?.status).toBe('expired');
    expect(await auditStates(buyer.client, siteIds)).toEqual(['draft']);
    // Its sites can be bought again.
    expect((await buyer.client.post('/api/purchases', { siteIds })).status).toBe(201);
  });
});

describe('starting a purchase', () => {
  it('refuses sites already Audited, sites in an open checkout, and bad bodies', async () => {
    const owner = await as(DEMO.owner);
    const sites = (await owner.get('/api/sites')).json.sites as { id: string; name: string; auditState: string }[];
    const brackwater = sites.find((s) => s.name === 'Brackwater Kiln Works')!;
    expect(brackwater.auditState).toBe('audited');
    const r = await owner.post('/api/purchases', { siteIds: [brackwater.id] });
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe('already_audited');
    expect(r.json.error.message).toContain('Brackwater Kiln Works is already Audited');

    const [open] = await draftSites(buyer.client, ['Open Checkout Works']);
    await buy(buyer.client, [open!]);
    const twice = await buyer.client.post('/api/purchases', { siteIds: [open] });
    expect(twice.status).toBe(409);
    expect(twice.json.error.code).toBe('checkout_open');

    expect((await buyer.client.post('/api/purchases', { siteIds: [] })).status).toBe(400);
    expect((await buyer.client.post('/api/purchases', { siteIds: [open, open] })).status).toBe(400);
    const extra = await buyer.client.post('/api/purchases', { siteIds: [open], coupon: 'FREE' });
    expect(extra.status).toBe(400);
    expect(extra.json.error.fields).toHaveProperty('coupon');
  });
});

describe('who may buy and who may look', () => {
  let northgateSiteId: string;
  beforeAll(async () => {
    const owner = await as(DEMO.owner);
    northgateSiteId = ((await owner.get('/api/sites')).json.sites as { id: string; name: string }[]).find((s) => s.name === 'Tarn Valley Glaze Plant')!.id;
  });

  it('Energy manager and Finance get 403 on POST /api/purchases but read the history with its receipt', async () => {
    for (const email of [DEMO.energy, DEMO.finance]) {
      const c = await as(email);
      const r = await c.post('/api/purchases', { siteIds: [northgateSiteId] });
      expect(r.status, email).toBe(403);
      expect(r.json.error.code).toBe('forbidden');
      const list = await c.get('/api/purchases');
      expect(list.status).toBe(200);
      expect(list.json.purchases.find((p: { receiptNumber: string | null }) => p.receiptNumber === 'VLR-20260112-KLN4WB')).toMatchObject({ status: 'paid', sites: [{ name: 'Brackwater Kiln Works' }] });
      expect((await c.post(`/api/purchases/pur_demoBrackwater01/cancel`)).status).toBe(403);
    }
  });

  it('another workspace gets 404 for these sites and purchases; anonymous gets 401', async () => {
    const r = await buyer.client.post('/api/purchases', { siteIds: [northgateSiteId] });
    expect(r.status).toBe(404);
    expect(r.json.error.code).toBe('not_found');
    expect((await buyer.client.get('/api/purchases/pur_demoBrackwater01')).status).toBe(404);
    expect((await buyer.client.get('/api/purchases')).json.purchases.some((p: { id: string }) => p.id === 'pur_demoBrackwater01')).toBe(false);
    expect((await new Client().get('/api/purchases')).status).toBe(401);
    expect((await new Client().post('/api/purchases', { siteIds: [northgateSiteId] })).status).toBe(401);
  });
});
