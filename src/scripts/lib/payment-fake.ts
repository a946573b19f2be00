/**
 * The local payment fake: a small HTTP server that answers the payment provider's Checkout
 * API the way the official SDK expects (form-encoded requests, Bearer secret key, JSON
 * answers and error shapes), serves a hosted checkout page with test cards, and delivers
 * signed webhook events to the app with retries. State is in memory: it is a dev and test tool.
 *
 *   POST /v1/checkout/sessions              create (mode=payment, line_items[n][price_data]...)
 *   GET  /v1/checkout/sessions/{id}         retrieve (expand[]=line_items supported)
 *   POST /v1/checkout/sessions/{id}/expire  expire an open session
 *   GET  /checkout/{id}                     hosted page; POST .../pay, POST .../cancel
 *   GET  /_fake/sessions, GET /_fake/events, POST /_fake/events/{id}/resend   FAKE-ONLY control
 */
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { decodeForm } from './payment-fake-parts/form-decode';
import { checkoutPage, closedPage } from './payment-fake-parts/checkout-page';
import { fakeId, ParamError, publicSession, sessionFromForm, type FakeSession } from './payment-fake-parts/sessions';
import { signPayload } from './payment-fake-parts/signature';

export type PaymentFakeOptions = { port: number; host?: string; secretKey: string; webhookSecret: string; webhookUrl: string; quiet?: boolean };
export type Delivery = { at: string; signature: string; status: number | null; error: string | null };
export type FakeEvent = { id: string; type: string; sessionId: string; payload: string; deliveries: Delivery[] };
export type PaymentFake = { url: string; port: number; stop: () => Promise<void> };

const API_VERSION = '2025-10-29.clover';
/** Seconds between delivery attempts after the first (the app may be starting or down). */
const RETRY_DELAYS_MS = [500, 1000, 2000, 4000, 8000];

export async function startPaymentFake(opts: PaymentFakeOptions): Promise<PaymentFake> {
  const host = opts.host ?? '127.0.0.1';
  const sessions = new Map<string, FakeSession>();
  const events: FakeEvent[] = [];
  const idempotent = new Map<string, { status: number; body: unknown }>();
  const timers = new Set<NodeJS.Timeout>();
  let base = `http://${host}:${opts.port}`;
  const log = (m: string) => opts.quiet || console.log(`[payment-fake] ${m}`);

  const sleep = (ms: number) => new Promise<void>((r) => { const t = setTimeout(() => { timers.delete(t); r(); }, ms); timers.add(t); });

  async function deliverOnce(ev: FakeEvent): Promise<Delivery> {
    // Every attempt is signed afresh with the current time, as the provider does.
    const d: Delivery = { at: new Date().toISOString(), signature: signPayload(ev.payload, opts.webhookSecret), status: null, error: null };
    ev.deliveries.push(d);
    try {
      const res = await fetch(opts.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': d.signature, 'user-agent': 'Varledger-payment-fake/1.0' }, body: ev.payload, signal: AbortSignal.timeout(10_000) });
      d.status = res.status;
      await res.arrayBuffer();
    } catch (e) {
      d.error = (e as Error).message;
    }
    return d;
  }

  async function deliver(ev: FakeEvent) {
    for (let i = 0; ; i++) {
      const d = await deliverOnce(ev);
      if (d.status !== null && d.status >= 200 && d.status < 300) return log(`${ev.type} ${ev.id} delivered (${d.status})`);
      if (i >= RETRY_DELAYS_MS.length) return log(`${ev.type} ${ev.id} given up after ${i + 1} attempts (${d.status ?? d.error})`);
      await sleep(RETRY_DELAYS_MS[i]!);
    }
  }

  function emit(type: string, s: FakeSession) {
    const ev: FakeEvent = { id: fakeId('evt'), type, sessionId: s.id, payload: '', deliveries: [] };
    ev.payload = JSON.stringify({ id: ev.id, object: 'event', api_version: API_VERSION, created: Math.floor(Date.now() / 1000), data: { object: publicSession(s) }, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, type }, null, 2);
    events.push(ev);
    void deliver(ev);
  }

  /** Open sessions past their expiry become expired on the next look, with the event sent. */
  function current(id: string): FakeSession | undefined {
    const s = sessions.get(id);
    if (s && s.status === 'open' && s.expires_at <= Math.floor(Date.now() / 1000)) {
      s.status = 'expired';
      emit('checkout.session.expired', s);
    }
    return s;
  }

  const send = (res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}) => {
    res.writeHead(status, { 'content-type': 'application/json', 'request-id': `req_${randomBytes(8).toString('hex')}`, ...headers });
    res.end(JSON.stringify(body));
  };
  const apiError = (res: ServerResponse, status: number, message: string, extra: Record<string, string> = {}) => send(res, status, { error: { type: 'invalid_request_error', message, ...extra } });
  const missing = (res: ServerResponse, what: string) => apiError(res, 404, what, { code: 'resource_missing' });
  const html = (res: ServerResponse, status: number, body: string) => { res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' }); res.end(body); };
  const redirect = (res: ServerResponse, to: string) => { res.writeHead(303, { location: to }); res.end(); };

  function authorised(req: IncomingMessage): 'ok' | 'missing' | 'wrong' {
    const m = (req.headers.authorization ?? '').match(/^Bearer (\S+)$/);
    if (!m) return 'missing';
    const given = Buffer.from(m[1]!);
    const want = Buffer.from(opts.secretKey);
    return m[1]!.startsWith('sk_test_') && given.length === want.length && timingSafeEqual(given, want) ? 'ok' : 'wrong';
  }

  async function readBody(req: IncomingMessage): Promise<string> {
    const chunks: Buffer[] = [];
    let size = 0;
    for await (const c of req) {
      size += (c as Buffer).length;
      if (size > 1024 * 1024) throw new Error('body too large');
      chunks.push(c as Buffer);
    }
    return Buffer.concat(chunks).toString('utf8');
  }

  async function api(req: IncomingMessage, res: ServerResponse, url: URL) {
    const auth = authorised(req);
    if (auth === 'missing') return apiError(res, 401, 'You did not provide an API key. Send it as a Bearer token in the Authorization header.');
    if (auth === 'wrong') return apiError(res, 401, 'Invalid API key provided (the fake accepts only its configured sk_test_ key).');
    const key = req.method === 'POST' ? (req.headers['idempotency-key'] as string | undefined) : undefined;
    if (key && idempotent.has(key)) {
      const hit = idempotent.get(key)!;
      return send(res, hit.status, hit.body, { 'idempotent-replayed': 'true' });
    }
    const answer = (status: number, body: unknown) => {
      if (key) idempotent.set(key, { status, body });
      send(res, status, body);
    };
    const parts = url.pathname.split('/').filter(Boolean); // v1 checkout sessions {id} [expire]
    if (parts[1] !== 'checkout' || parts[2] !== 'sessions') return missing(res, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
    if (req.method === 'POST' && parts.length === 3) {
      try {
        const s = sessionFromForm(decodeForm(await readBody(req)), base);
        sessions.set(s.id, s);
        log(`session ${s.id} created: ${s.amount_total} ${s.currency}`);
        return answer(200, publicSession(s));
      } catch (e) {
        if (e instanceof ParamError) return apiError(res, 400, e.message, { param: e.param, code: e.code });
        throw e;
      }
    }
    const s = parts[3] ? current(parts[3]) : undefined;
    if (req.method === 'GET' && parts.length === 4) {
      if (!s) return missing(res, `No such checkout.session: '${parts[3]}'`);
      return answer(200, publicSession(s, [...url.searchParams].some(([k, v]) => /^expand\[\d*\]$/.test(k) && v === 'line_items')));
    }
    if (req.method === 'POST' && parts.length === 5 && parts[4] === 'expire') {
      if (!s) return missing(res, `No such checkout.session: '${parts[3]}'`);
      if (s.status !== 'open') return apiError(res, 400, `Only Checkout Sessions with status "open" can be expired; this one is "${s.status}".`, { code: 'checkout_session_not_open' });
      s.status = 'expired';
      emit('checkout.session.expired', s);
      return answer(200, publicSession(s));
    }
    return missing(res, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
  }

  async function hosted(req: IncomingMessage, res: ServerResponse, url: URL) {
    const [, id, action] = url.pathname.split('/').filter(Boolean);
    const s = id ? current(id) : undefined;
    if (!s) return html(res, 404, '<!doctype html><title>Not found</title><p>No such checkout.</p>');
    if (req.method === 'GET' && !action) return html(res, s.status === 'open' ? 200 : 410, s.status === 'open' ? checkoutPage(s) : closedPage(s));
    if (req.method !== 'POST') return html(res, 405, '<!doctype html><p>Method not allowed.</p>');
    if (action === 'cancel') {
      // The session stays open, as with the real provider: leaving the page does not expire it.
      return s.cancel_url ? redirect(res, s.cancel_url) : html(res, 200, closedPage(s));
    }
    if (action !== 'pay') return html(res, 404, '<!doctype html><p>Not found.</p>');
    if (s.status !== 'open') return html(res, 410, closedPage(s));
    const form = new URLSearchParams(await readBody(req));
    const card = (form.get('card_number') ?? '').replace(/[\s-]/g, '');
    const expiry = (form.get('expiry') ?? '').replace(/\s/g, '');
    const cvc = form.get('cvc') ?? '';
    const m = expiry.match(/^(\d{2})\/(\d{2})$/);
    const expired = !m || Number(m[1]) < 1 || Number(m[1]) > 12 || new Date(2000 + Number(m[2]), Number(m[1])) < new Date();
    if (card === '4000000000000002') return html(res, 402, checkoutPage(s, 'Your card was declined. Try another card.'));
    if (card !== '4242424242424242') return html(res, 400, checkoutPage(s, 'This card number is not one of the test cards. Use 4242 4242 4242 4242.'));
    if (expired) return html(res, 400, checkoutPage(s, 'Enter an expiry date in the future as MM/YY.'));
    if (!/^\d{3,4}$/.test(cvc)) return html(res, 400, checkoutPage(s, 'Enter the three-digit security code (CVC).'));
    s.status = 'complete';
    s.payment_status = 'paid';
    s.payment_intent = fakeId('pi');
    s.customer_details = { email: s.customer_email };
    log(`session ${s.id} paid`);
    emit('checkout.session.completed', s);
    return redirect(res, s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
  }

  async function control(req: IncomingMessage, res: ServerResponse, url: URL) {
    const parts = url.pathname.split('/').filter(Boolean);
    if (req.method === 'GET' && parts[1] === 'sessions') return send(res, 200, { fake: true, data: [...sessions.values()].map((s) => publicSession(s, true)) });
    if (req.method === 'GET' && parts[1] === 'events') return send(res, 200, { fake: true, data: events });
    if (req.method === 'POST' && parts[1] === 'events' && parts[3] === 'resend') {
      const ev = events.find((e) => e.id === parts[2]);
      if (!ev) return missing(res, `No such event: '${parts[2]}'`);
      return send(res, 200, { fake: true, delivery: await deliverOnce(ev) });
    }
    return missing(res, 'Unknown fake control route.');
  }

  const server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', base);
    const route = url.pathname.startsWith('/v1/') ? api : url.pathname.startsWith('/checkout/') ? hosted : url.pathname.startsWith('/_fake/') ? control : null;
    if (!route) return missing(res, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
    route(req, res, url).catch((e) => {
      console.error('[payment-fake] request failed', e);
      if (!res.headersSent) send(res, 500, { error: { type: 'api_error', message: 'The payment fake failed on this request.' } });
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, host, () => resolve());
  });
  const port = (server.address() as { port: number }).port;
  base = `http://${host}:${port}`;
  return {
    url: base,
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        for (const t of timers) clearTimeout(t);
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
