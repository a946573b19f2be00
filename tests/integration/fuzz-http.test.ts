/**
 * A seeded fast-check run through the real server: generated bodies (valid examples broken a
 * little, any JSON, text that is not JSON) at every JSON endpoint of ROUTES, generated query
 * strings at every route with a query, and signed webhook events. No answer may be a 5xx; a 4xx
 * is our JSON error shape, and a 400 invalid_input names at least one field. Runs as the Owner of
 * a fresh workspace with its own site (meter data and a tariff), so whatever a generated body
 * happens to create stays there. Fixed seeds; the number of requests is printed.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ROUTES } from '../../src/lib/api/openapi';
import type { RouteDoc } from '../../src/lib/api/route-doc';
import { Client } from '../support/http';
import { ownerOfNewWorkspace } from '../support/accounts';
import { uploadFile } from '../support/upload';
import { sdk } from '../support/payments';
import { TEST_PAYMENT_KEYS } from '../support/payment-keys';
import { meterCsv, routeKey, SIGNED_BODY_ROUTES, VALID_BODIES, validMeterMapping, validTariff } from '../unit/fuzz/examples';
import { edgeValue, mutated } from '../unit/fuzz/mutate';
import { shapeOf } from '../unit/fuzz/schema-probe';
import { fromSchema } from '../unit/fuzz/from-schema';

const BODY_RUNS = 30;
const QUERY_RUNS = 15;
const WEBHOOK_RUNS = 40;
let requests = 0;
const routesHit = new Set<string>();
/** Answers by route and status, printed at the end (how much reached the engine rather than validation). */
const statuses: Record<string, Record<number, number>> = {};
let current = '';

let c: Client;
let ids: Record<string, string>;
const urlOf = (r: RouteDoc, query = '') => r.path.replace(/\{(\w+)\}/g, (_m, k: string) => ids[k] ?? `${k}_placeholder`) + query;

type Res = Awaited<ReturnType<Client['request']>>;
function answerIsSound(r: Res, sent: string) {
  const tally = (statuses[current] ??= {});
  tally[r.status] = (tally[r.status] ?? 0) + 1;
  const what = `${r.status} for ${sent.slice(0, 400)} -> ${JSON.stringify(r.json)?.slice(0, 400)}`;
  expect(r.status, what).toBeLessThan(500);
  if (r.status >= 400) {
    expect(r.res.headers.get('content-type') ?? '', what).toContain('application/json');
    expect(typeof r.json?.error?.code, what).toBe('string');
    expect(typeof r.json?.error?.message, what).toBe('string');
    if (r.json.error.code === 'invalid_input') expect(Object.keys(r.json.error.fields ?? {}).length, what).toBeGreaterThan(0);
  }
}

async function run<T>(name: string, arb: fc.Arbitrary<T>, runs: number, prop: (v: T) => Promise<void>) {
  let seed = 11;
  for (const ch of name) seed = (seed * 31 + ch.charCodeAt(0)) | 0;
  current = name;
  const out = await fc.check(fc.asyncProperty(arb, prop), { seed, numRuns: runs, endOnFailure: true });
  requests += out.numRuns;
  routesHit.add(name);
  if (out.failed) throw new Error(`${name}: seed ${seed}: ${fc.stringify(out.counterexample).slice(0, 1500)}\n${out.errorInstance instanceof Error ? out.errorInstance.message : String(out.errorInstance)}`);
}

/** A body as text: a value generated from the schema (mostly valid), a valid example broken a little, any JSON value, or text that is not JSON. */
const bodyText = (valid: () => Record<string, unknown>, schema: RouteDoc['body']) =>
  fc.oneof(
    { weight: 4, arbitrary: fromSchema(schema!).map((v) => JSON.stringify(v) ?? 'null') },
    { weight: 4, arbitrary: mutated(valid).map((v) => JSON.stringify(v) ?? 'null') },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v)) },
    { weight: 1, arbitrary: fc.string({ maxLength: 200 }) },
  );

const JSON_ROUTES = ROUTES.filter((r) => r.body && VALID_BODIES[routeKey(r)]);
const QUERY_ROUTES = ROUTES.filter((r) => r.query && r.method === 'get');
const queryValue = fc.oneof(edgeValue.map(String), fc.string({ maxLength: 12 }), fc.constantFrom('2025-03-01', '2025-03-03', '2026-01-01', 'month', 'billing', 'fixed', 'switched', 'csv', 'xlsx', '0.95', '100', '-1'));

beforeAll(async () => {
  const owner = await ownerOfNewWorkspace('fuzz-http');
  c = owner.client;
  const site = await c.post('/api/sites', { name: 'Fuzz site', timeZone: 'Europe/London', currency: 'USD', serviceVoltageV: 415, transformerKva: 1000, transformerImpedancePct: 5.5 });
  expect(site.status, JSON.stringify(site.json)).toBe(201);
  const siteId = site.json.site.id as string;
  const up = await uploadFile(c, `/api/sites/${siteId}/meter-data`, { name: 'fuzz.csv', content: meterCsv(5) }, { mapping: JSON.stringify(validMeterMapping()) });
  expect(up.status, JSON.stringify(up.json)).toBe(201);
  const tariff = await c.post(`/api/sites/${siteId}/tariffs`, validTariff());
  expect(tariff.status, JSON.stringify(tariff.json)).toBe(201);
  const plan = await c.post(`/api/sites/${siteId}/plans`, VALID_BODIES['POST /api/sites/{siteId}/plans']!());
  expect(plan.status, JSON.stringify(plan.json)).toBe(201);
  const me = (await c.get('/api/me')).json;
  const members = (await c.get('/api/members')).json.members as { id: string; userId: string }[];
  ids = { workspaceId: owner.workspaceId, siteId, tariffId: tariff.json.tariff.id, planId: plan.json.plan.id, memberId: members.find((m) => m.userId === me.user.id)!.id };
});

describe('generated bodies at every JSON endpoint', () => {
  it.each(JSON_ROUTES.map((r) => [routeKey(r), r] as const))('%s', async (key, r) => {
    await run(key, bodyText(VALID_BODIES[key]!, r.body), BODY_RUNS, async (text) => {
      const res = await c.request(r.method.toUpperCase(), urlOf(r), text, { 'content-type': 'application/json' });
      answerIsSound(res, text);
      // A workspace a generated body created (or switched to) becomes the active one: go back to ours.
      if (res.status < 300 && r.path.startsWith('/api/workspaces')) expect((await c.put('/api/workspaces/active', { workspaceId: ids.workspaceId })).status).toBe(200);
    });
  }, 120_000);
});

describe('generated query strings', () => {
  it.each(QUERY_ROUTES.map((r) => [routeKey(r), r] as const))('%s', async (key, r) => {
    const keys = Object.keys(shapeOf(r.query!));
    const query = fc.dictionary(fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...keys) }, { weight: 1, arbitrary: fc.string({ maxLength: 6 }) }), queryValue, { maxKeys: 5 });
    await run(key, query, QUERY_RUNS, async (q) => {
      const qs = `?${new URLSearchParams(q)}`;
      answerIsSound(await c.get(urlOf(r, qs)), qs);
    });
  }, 120_000);
});

describe('generated webhook events, correctly signed', () => {
  const r = ROUTES.find((x) => SIGNED_BODY_ROUTES.has(routeKey(x)))!;
  it(routeKey(r), async () => {
    let n = 0;
    const session = { id: 'cs_test_fuzz', object: 'checkout.session', status: 'complete', payment_status: 'paid', amount_total: 29_000, currency: 'usd', metadata: { purchaseId: 'pur_fuzz', organizationId: 'org_fuzz' }, client_reference_id: 'pur_fuzz' };
    const event = () => ({ id: 'evt_fuzz', object: 'event', type: 'checkout.session.completed', created: 1_767_225_600, livemode: false, data: { object: structuredClone(session) } });
    const body = fc.oneof({ weight: 4, arbitrary: mutated(event) }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) });
    await run(routeKey(r), body, WEBHOOK_RUNS, async (v) => {
      // Event ids of this run only, so that no other test's event is taken as a replay.
      const payload = JSON.stringify(v && typeof v === 'object' && !Array.isArray(v) && (v as { id?: unknown }).id === 'evt_fuzz' ? { ...v, id: `evt_fuzz_${++n}` } : v);
      const signature = sdk().webhooks.generateTestHeaderString({ payload, secret: TEST_PAYMENT_KEYS.webhookSecret });
      answerIsSound(await new Client().request('POST', r.path, payload, { 'content-type': 'application/json', origin: '', 'stripe-signature': signature }), payload);
    });
  }, 120_000);
});

describe('the run', () => {
  it('reached every JSON endpoint and query route', () => {
    console.log(`fuzz-http: ${requests} generated requests over ${routesHit.size} routes`);
    console.log(Object.entries(statuses).map(([k, v]) => `  ${k}: ${Object.entries(v).map(([s, n]) => `${s}×${n}`).join(' ')}`).join('\n'));
    expect(routesHit.size).toBe(JSON_ROUTES.length + QUERY_ROUTES.length + 1);
  });
});
