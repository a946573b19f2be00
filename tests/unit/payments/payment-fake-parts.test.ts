import { describe, expect, it } from 'vitest';
import { createHmac } from 'node:crypto';
import Stripe from 'stripe';
import { decodeForm } from '../../../src/scripts/lib/payment-fake-parts/form-decode';
import { signPayload } from '../../../src/scripts/lib/payment-fake-parts/signature';
import { ParamError, sessionFromForm } from '../../../src/scripts/lib/payment-fake-parts/sessions';
import { formatMinor } from '../../../src/lib/payments/money';

const body = [
  'mode=payment',
  'success_url=http%3A%2F%2Fapp%2Fok%3Fs%3D%7BCHECKOUT_SESSION_ID%7D',
  'line_items[0][quantity]=1',
  'line_items[0][price_data][currency]=usd',
  'line_items[0][price_data][unit_amount]=29000',
  'line_items[0][price_data][product_data][name]=Site%20audit%3A%20A',
  'line_items[1][quantity]=2',
  'line_items[1][price_data][currency]=usd',
  'line_items[1][price_data][unit_amount]=100',
  'line_items[1][price_data][product_data][name]=Site%20audit%3A%20B',
  'metadata[purchase_id]=pur_1',
  'metadata[site_ids]=a%2Cb',
].join('&');

describe('the fake decodes the SDK form encoding', () => {
  it('nests bracketed keys and turns 0..n-1 keys into arrays', () => {
    const f = decodeForm(body);
    expect(f.metadata).toEqual({ purchase_id: 'pur_1', site_ids: 'a,b' });
    expect(f.line_items).toEqual([
      { quantity: '1', price_data: { currency: 'usd', unit_amount: '29000', product_data: { name: 'Site audit: A' } } },
      { quantity: '2', price_data: { currency: 'usd', unit_amount: '100', product_data: { name: 'Site audit: B' } } },
    ]);
  });

  it('builds a session with the total of its lines, and names a missing parameter', () => {
    const s = sessionFromForm(decodeForm(body), 'http://fake', 1_800_000_000);
    expect([s.amount_total, s.currency, s.status, s.payment_status, s.expires_at]).toEqual([29_200, 'usd', 'open', 'unpaid', 1_800_000_000 + 86_400]);
    expect(s.url).toBe(`http://fake/checkout/${s.id}`);
    const noName = body.replace('line_items[1][price_data][product_data][name]=Site%20audit%3A%20B', '');
    expect(() => sessionFromForm(decodeForm(noName), 'http://fake')).toThrow(ParamError);
    try {
      sessionFromForm(decodeForm(noName), 'http://fake');
    } catch (e) {
      expect((e as ParamError).param).toBe('line_items[1][price_data][product_data][name]');
    }
  });
});

describe('the fake signs webhooks as the provider does', () => {
  const payload = '{"id":"evt_test_1","type":"checkout.session.completed"}';
  const secret = 'whsec_unitSecret42';

  it('v1 is HMAC-SHA256 of "t.payload" in hex, identical to the SDK test header', () => {
    const header = signPayload(payload, secret, 1_800_000_123);
    const expected = createHmac('sha256', secret).update(`1800000123.${payload}`).digest('hex');
    expect(header).toBe(`t=1800000123,v1=${expected}`);
    const stripe = new Stripe('sk_test_unit', { telemetry: false });
    expect(stripe.webhooks.generateTestHeaderString({ payload, secret, timestamp: 1_800_000_123 })).toBe(header);
  });

  it('the SDK accepts a fresh header and refuses another secret or another body', () => {
    const stripe = new Stripe('sk_test_unit', { telemetry: false });
    const header = signPayload(payload, secret);
    expect(stripe.webhooks.constructEvent(payload, header, secret).id).toBe('evt_test_1');
    expect(() => stripe.webhooks.constructEvent(payload, header, 'whsec_other')).toThrow();
    expect(() => stripe.webhooks.constructEvent(payload.replace('1', '2'), header, secret)).toThrow();
  });
});

describe('minor units', () => {
  it.each([
    [29_000, 'USD', 'US$290.00'],
    [58_000, 'gbp', '£580.00'],
    [29_000, 'JPY', 'JP¥29,000'],
  ])('%d %s -> %s', (amount, currency, text) => {
    expect(formatMinor(amount, currency)).toBe(text);
  });
});
