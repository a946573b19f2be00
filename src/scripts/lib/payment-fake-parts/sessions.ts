/** In-memory checkout sessions of the payment fake, built from the decoded create request. */
import { randomBytes } from 'node:crypto';
import { str, type FormValue } from './form-decode';

export type FakeLineItem = { name: string; unit_amount: number; quantity: number; currency: string };
export type FakeSession = {
  id: string;
  object: 'checkout.session';
  mode: string;
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_subtotal: number;
  amount_total: number;
  currency: string;
  customer_email: string | null;
  customer_details: { email: string | null } | null;
  client_reference_id: string | null;
  metadata: Record<string, string>;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  payment_intent: string | null;
  created: number;
  expires_at: number;
  livemode: false;
  line_items: FakeLineItem[];
};

export const fakeId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;

export class ParamError extends Error {
  constructor(readonly param: string, message: string, readonly code = 'parameter_invalid') {
    super(message);
  }
}

const int = (v: FormValue | undefined, param: string, min: number): number => {
  const s = str(v);
  if (s === undefined) throw new ParamError(param, `Missing required param: ${param}.`, 'parameter_missing');
  if (!/^\d+$/.test(s) || Number(s) < min) throw new ParamError(param, `Invalid integer: ${s}`);
  return Number(s);
};

/** Validates the create parameters the way the provider would for a one-off payment. */
export function sessionFromForm(form: Record<string, FormValue>, hostedBase: string, now = Math.floor(Date.now() / 1000)): FakeSession {
  const mode = str(form.mode);
  if (!mode) throw new ParamError('mode', 'Missing required param: mode.', 'parameter_missing');
  if (mode !== 'payment') throw new ParamError('mode', 'This fake supports mode=payment only.');
  const success = str(form.success_url);
  if (!success) throw new ParamError('success_url', 'Missing required param: success_url.', 'parameter_missing');
  const raw = form.line_items;
  if (!Array.isArray(raw) || raw.length === 0) throw new ParamError('line_items', 'Missing required param: line_items.', 'parameter_missing');
  const items = raw.map((li, i): FakeLineItem => {
    const p = `line_items[${i}]`;
    if (typeof li !== 'object' || Array.isArray(li)) throw new ParamError(p, `Invalid object: ${p}`);
    const pd = li.price_data;
    if (typeof pd !== 'object' || Array.isArray(pd)) throw new ParamError(`${p}[price_data]`, `Missing required param: ${p}[price_data].`, 'parameter_missing');
    const currency = str(pd.currency)?.toLowerCase();
    if (!currency || !/^[a-z]{3}$/.test(currency)) throw new ParamError(`${p}[price_data][currency]`, `Invalid currency: ${str(pd.currency) ?? ''}`);
    const product = pd.product_data;
    const name = typeof product === 'object' && !Array.isArray(product) ? str(product.name) : undefined;
    if (!name) throw new ParamError(`${p}[price_data][product_data][name]`, `Missing required param: ${p}[price_data][product_data][name].`, 'parameter_missing');
    return { name, currency, unit_amount: int(pd.unit_amount, `${p}[price_data][unit_amount]`, 0), quantity: int(li.quantity, `${p}[quantity]`, 1) };
  });
  const currency = items[0]!.currency;
  if (items.some((li) => li.currency !== currency)) throw new ParamError('line_items', 'All line items must share one currency.');
  const total = items.reduce((t, li) => t + li.unit_amount * li.quantity, 0);
  const expiresRaw = str(form.expires_at);
  const expires = expiresRaw === undefined ? now + 24 * 3600 : int(form.expires_at, 'expires_at', 0);
  if (expires < now + 30 * 60 || expires > now + 24 * 3600) throw new ParamError('expires_at', 'expires_at must be between 30 minutes and 24 hours from now.');
  const metadata: Record<string, string> = {};
  if (typeof form.metadata === 'object' && !Array.isArray(form.metadata)) for (const [k, v] of Object.entries(form.metadata)) if (typeof v === 'string') metadata[k] = v;
  const id = fakeId('cs');
  return {
    id,
    object: 'checkout.session',
    mode,
    status: 'open',
    payment_status: 'unpaid',
    amount_subtotal: total,
    amount_total: total,
    currency,
    customer_email: str(form.customer_email) ?? null,
    customer_details: null,
    client_reference_id: str(form.client_reference_id) ?? null,
    metadata,
    success_url: success,
    cancel_url: str(form.cancel_url) ?? null,
    url: `${hostedBase}/checkout/${id}`,
    payment_intent: null,
    created: now,
    expires_at: expires,
    livemode: false,
    line_items: items,
  };
}

/** The session as the API returns it: line items only when expanded, the URL only while open. */
export function publicSession(s: FakeSession, expandLineItems = false) {
  const { line_items, ...rest } = s;
  const out: Record<string, unknown> = { ...rest, url: s.status === 'open' ? s.url : null };
  if (expandLineItems) {
    out.line_items = {
      object: 'list',
      has_more: false,
      url: `/v1/checkout/sessions/${s.id}/line_items`,
      data: line_items.map((li, i) => ({ id: `li_${s.id.slice(8)}${i}`, object: 'item', description: li.name, quantity: li.quantity, currency: li.currency, amount_subtotal: li.unit_amount * li.quantity, amount_total: li.unit_amount * li.quantity, price: { object: 'price', unit_amount: li.unit_amount, currency: li.currency } })),
    };
  }
  return out;
}
