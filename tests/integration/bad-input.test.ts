/**
 * Bad input at every documented route, through the real server: malformed JSON, a value that is
 * not an object, each field of the wrong type or missing, unknown fields at every level, an
 * oversize body, the wrong Content-Type, out-of-range figures, broken multipart mappings and
 * query parameters. Every answer must be a 4xx JSON error; where a field is to blame, its path
 * must be named in `error.fields`. Driven by ROUTES, so a new route with a body needs a row here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { ROUTES } from '../../src/lib/api/openapi';
import type { RouteDoc } from '../../src/lib/api/route-doc';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { sdk } from '../support/payments';
import { BillMappingSchema } from '../../src/lib/import/bills/bill-schema';
import { MeterMappingSchema } from '../../src/lib/import/mapping-schema';
import { TEST_PAYMENT_KEYS } from '../support/payment-keys';
import { atPath, meterCsv, nestedObjectPaths, routeKey, SIGNED_BODY_ROUTES, VALID_BODIES, VALID_MULTIPART, validMeterMapping, validPlan, validTariff, wrongType } from '../unit/fuzz/examples';
import { badQueryValues, shapeOf } from '../unit/fuzz/schema-probe';

const UNKNOWN = 'zzNotAField';
/** Body limits of readJson (256 KB) and of the routes that set their own. */
const BODY_LIMIT: Record<string, number> = { 'POST /api/sites/{siteId}/meter-data/preview': 1024 * 1024, 'POST /api/payments/webhook': 512 * 1024 };
const DEFAULT_LIMIT = 256 * 1024;
/** Query fields whose documented schema is looser than the one the endpoint applies. */
const QUERY_OVERRIDES: Record<string, Record<string, { value: string; why: string }[]>> = {
  'POST /api/sites/{siteId}/meter-data': { importId: [{ value: 'not-an-import-id', why: 'not imp_...' }, { value: `imp_${'x'.repeat(60)}`, why: 'too long' }] },
};
/** Where an unknown field inside a value is the endpoint's answer, not a 400 (the mapping step lists a mapping's problems). */
const ANSWERED_AS_PROBLEMS: Record<string, string> = { 'POST /api/sites/{siteId}/meter-data/preview': 'mapping' };

type Ctx = { c: Client; ids: Record<string, string> };
let ctx: Ctx;
type Res = Awaited<ReturnType<Client['request']>>;
type Case = { route: string; name: string; run: (x: Ctx) => Promise<void> };

const urlOf = (r: RouteDoc, ids: Record<string, string>, query = '') => r.path.replace(/\{(\w+)\}/g, (_m, k: string) => ids[k] ?? `${k}_placeholder`) + query;

/** A 4xx JSON error of the given status (and code), naming `field` in `error.fields` when given. */
function expectError(r: Res, status: number, opts: { code?: string; field?: string; fieldPrefix?: string } = {}) {
  const what = JSON.stringify(r.json)?.slice(0, 600);
  expect(r.status, what).toBe(status);
  expect(r.res.headers.get('content-type') ?? '', what).toContain('application/json');
  expect(typeof r.json?.error?.code, what).toBe('string');
  expect(typeof r.json?.error?.message, what).toBe('string');
  if (opts.code) expect(r.json.error.code, what).toBe(opts.code);
  const fields = Object.keys(r.json.error.fields ?? {});
  if (opts.field) expect(fields, what).toContain(opts.field);
  if (opts.fieldPrefix) expect(fields.some((f) => f === opts.fieldPrefix || f.startsWith(`${opts.fieldPrefix}.`)), what).toBe(true);
}

const send = (x: Ctx, r: RouteDoc, body: string, type = 'application/json', query = '') => x.c.request(r.method.toUpperCase(), urlOf(r, x.ids, query), body, { 'content-type': type });

function requiredKeys(schema: z.ZodType): string[] {
  return Object.entries(shapeOf(schema))
    .filter(([, s]) => !s.safeParse(undefined).success)
    .map(([k]) => k);
}

function jsonBodyCases(r: RouteDoc): Case[] {
  const key = routeKey(r);
  const make = VALID_BODIES[key];
  if (!make) return [];
  const cases: Case[] = [];
  const add = (name: string, run: Case['run']) => cases.push({ route: key, name, run });
  const valid = make();
  const postJson = (x: Ctx, v: unknown) => send(x, r, JSON.stringify(v));

  for (const [label, text] of [['truncated', '{"name": '], ['trailing comma', '{"a": 1,}'], ['single quotes', "{'a': 1}"], ['empty', '']] as const) {
    add(`malformed JSON (${label}) -> 400 invalid_json`, async (x) => expectError(await send(x, r, text), 400, { code: 'invalid_json' }));
  }
  for (const [label, text] of [['array', '[]'], ['null', 'null'], ['string', '"text"'], ['number', '42'], ['boolean', 'true']] as const) {
    add(`a JSON ${label} instead of an object -> 400 naming the body`, async (x) => expectError(await send(x, r, text), 400, { code: 'invalid_input', field: 'body' }));
  }
  for (const k of requiredKeys(r.body!)) {
    add(`required "${k}" missing -> 400 naming it`, async (x) => {
      const v = structuredClone(valid);
      delete v[k];
      expectError(await postJson(x, v), 400, { code: 'invalid_input', field: k });
    });
  }
  for (const k of Object.keys(valid)) {
    add(`"${k}" of the wrong type -> 400 naming it`, async (x) => expectError(await postJson(x, { ...valid, [k]: wrongType(valid[k]) }), 400, { code: 'invalid_input', field: k }));
  }
  for (const path of nestedObjectPaths(valid)) {
    const at = [...path, UNKNOWN].join('.');
    const opaque = ANSWERED_AS_PROBLEMS[key];
    if (opaque && path[0] === opaque && path.length > 0) {
      add(`unknown field ${at} -> listed as a mapping problem naming it`, async (x) => {
        const res = await postJson(x, atPath(valid, path, (o) => ({ ...o, [UNKNOWN]: 1 })));
        expect(res.status, JSON.stringify(res.json)).toBe(200);
        expect(res.json.parsed.problems.map((p: { column: string }) => p.column)).toContain(path.slice(1).concat(UNKNOWN).join('.'));
      });
      continue;
    }
    add(`unknown field ${at || UNKNOWN} -> 400 naming it`, async (x) => expectError(await postJson(x, atPath(valid, path, (o) => ({ ...o, [UNKNOWN]: 1 }))), 400, { code: 'invalid_input', field: at }));
  }
  const limit = BODY_LIMIT[key] ?? DEFAULT_LIMIT;
  add(`a body over ${limit / 1024} KB -> 413`, async (x) => expectError(await send(x, r, JSON.stringify({ ...valid, name: 'x'.repeat(limit + 10) })), 413, { code: 'too_large' }));
  for (const type of ['text/plain', 'application/x-www-form-urlencoded']) {
    add(`Content-Type ${type} -> 415`, async (x) => expectError(await send(x, r, JSON.stringify(valid), type), 415, { code: 'unsupported_media_type' }));
  }
  return cases;
}

function multipartCases(r: RouteDoc): Case[] {
  const key = routeKey(r);
  const spec = VALID_MULTIPART[key];
  if (!spec) return [];
  const cases: Case[] = [];
  const add = (name: string, run: Case['run']) => cases.push({ route: key, name, run });
  const up = (x: Ctx, fields: Record<string, string>, file = spec.file()) => uploadFile(x.c, urlOf(r, x.ids), file, fields);
  add('no file -> 400 naming file', async (x) => {
    const form = new FormData();
    if (spec.mapping) form.append('mapping', JSON.stringify(spec.mapping()));
    expectError(await x.c.request('POST', urlOf(r, x.ids), form), 400, { field: 'file' });
  });
  add('JSON instead of multipart -> 415', async (x) => expectError(await send(x, r, JSON.stringify({ file: 'x' })), 415, { code: 'unsupported_media_type' }));
  add('an unknown form field -> 400 naming it', async (x) => expectError(await up(x, { ...(spec.mapping ? { mapping: JSON.stringify(spec.mapping()) } : {}), overwriteEverything: 'true' }), 400, { field: 'overwriteEverything' }));
  add('a second file in another field -> 400 naming it', async (x) => {
    const form = new FormData();
    if (spec.mapping) form.append('mapping', JSON.stringify(spec.mapping()));
    const f = spec.file();
    form.append('attachment', new Blob([f.content], { type: 'application/octet-stream' }), 'extra.bin');
    form.append('file', new Blob([f.content], { type: 'text/csv' }), f.name);
    expectError(await x.c.request('POST', urlOf(r, x.ids), form), 400, { field: 'attachment' });
  });
  if (key.endsWith('/meter-data')) {
    add('replace other than true/false -> 400 naming replace', async (x) => expectError(await up(x, { mapping: JSON.stringify(spec.mapping!()), replace: 'yes' }), 400, { field: 'replace' }));
  }
  if (!spec.mapping) {
    add('a text file where a PDF, PNG or JPEG belongs -> 415', async (x) => expectError(await up(x, {}, { name: 'bill.pdf', content: 'just text, whatever the name says' }), 415));
    return cases;
  }
  const mapping = spec.mapping();
  add('mapping missing -> 400 naming mapping', async (x) => expectError(await up(x, {}), 400, { field: 'mapping' }));
  for (const [label, text] of [['truncated', '{"version": 1,'], ['not JSON', 'delimiter=,'], ['empty', '']] as const) {
    add(`mapping malformed (${label}) -> 400 naming mapping`, async (x) => expectError(await up(x, { mapping: text }), 400, { field: 'mapping' }));
  }
  for (const text of ['[]', 'null', '"text"']) {
    add(`mapping ${text} -> 400 naming mapping`, async (x) => expectError(await up(x, { mapping: text }), 400, { fieldPrefix: 'mapping' }));
  }
  const mappingSchema: z.ZodType = key.includes('bills') ? BillMappingSchema : MeterMappingSchema;
  for (const k of Object.keys(mapping)) {
    add(`mapping.${k} of the wrong type -> 400 naming it`, async (x) => expectError(await up(x, { mapping: JSON.stringify({ ...mapping, [k]: wrongType(mapping[k]) }) }), 400, { field: `mapping.${k}` }));
  }
  add('every required mapping field is named when missing', async (x) => {
    for (const k of requiredKeys(mappingSchema)) {
      const m = structuredClone(mapping);
      delete m[k];
      expectError(await up(x, { mapping: JSON.stringify(m) }), 400, { field: `mapping.${k}` });
    }
  });
  for (const path of nestedObjectPaths(mapping)) {
    const at = ['mapping', ...path, UNKNOWN].join('.');
    add(`unknown field ${at} -> 400 naming it`, async (x) => expectError(await up(x, { mapping: JSON.stringify(atPath(mapping, path, (o) => ({ ...o, [UNKNOWN]: true }))) }), 400, { field: at }));
  }
  return cases;
}

function queryCases(r: RouteDoc): Case[] {
  if (!r.query) return [];
  const key = routeKey(r);
  const cases: Case[] = [];
  const add = (name: string, run: Case['run']) => cases.push({ route: key, name, run });
  const ask = (x: Ctx, q: string) => {
    const body = VALID_BODIES[key];
    return body ? send(x, r, JSON.stringify(body()), 'application/json', q) : x.c.request(r.method.toUpperCase(), urlOf(r, x.ids, q));
  };
  add(`unknown parameter ?${UNKNOWN}=1 -> 400 naming it`, async (x) => expectError(await ask(x, `?${UNKNOWN}=1`), 400, { code: 'invalid_input', field: UNKNOWN }));
  for (const [k, s] of Object.entries(shapeOf(r.query))) {
    for (const bad of QUERY_OVERRIDES[key]?.[k] ?? badQueryValues(s)) {
      add(`?${k}= ${bad.why} -> 400 naming ${k}`, async (x) => expectError(await ask(x, `?${k}=${encodeURIComponent(bad.value)}`), 400, { code: 'invalid_input', field: k }));
    }
  }
  return cases;
}

function signedCases(r: RouteDoc): Case[] {
  const key = routeKey(r);
  if (!SIGNED_BODY_ROUTES.has(key)) return [];
  const sign = (payload: string) => sdk().webhooks.generateTestHeaderString({ payload, secret: TEST_PAYMENT_KEYS.webhookSecret });
  const cases: Case[] = [];
  const add = (name: string, run: Case['run']) => cases.push({ route: key, name, run });
  // As the provider posts: no session cookie, no Origin.
  const post = (payload: string, signature: string | null) => new Client().request('POST', urlOf(r, {}), payload, { 'content-type': 'application/json', origin: '', ...(signature ? { 'stripe-signature': signature } : {}) });
  add('unsigned -> 400 signature_missing', async () => expectError(await post('{"id":"evt_x"}', null), 400, { code: 'signature_missing' }));
  add('forged signature -> 400 signature_invalid', async () => expectError(await post('{"id":"evt_x"}', 't=1,v1=00'), 400, { code: 'signature_invalid' }));
  add('over 512 KB -> 413', async () => expectError(await post(`{"pad":"${'x'.repeat(513 * 1024)}"}`, 't=1,v1=00'), 413));
  for (const [label, text] of [['malformed JSON', '{"id": '], ['array', '[]'], ['null', 'null'], ['string', '"text"'], ['no id', '{"object":"event","type":"checkout.session.completed","data":{"object":{}}}'], ['data not an object', '{"id":"evt_bad_input_1","object":"event","type":"checkout.session.completed","data":"x"}'], ['id of the wrong type', '{"id":42,"object":"event","type":"checkout.session.expired","data":{"object":{}}}']] as const) {
    add(`signed ${label} -> 400`, async () => expectError(await post(text, sign(text)), 400));
  }
  return cases;
}

/** The out-of-range figures the hardening issue names, each refused with its field path. */
function outOfRangeCases(): Case[] {
  const route = (m: string, p: string) => ROUTES.find((r) => r.method === m && r.path === p)!;
  const tariffRoutes = [route('post', '/api/sites/{siteId}/tariffs'), route('put', '/api/sites/{siteId}/tariffs/{tariffId}'), route('post', '/api/sites/{siteId}/tariffs/preview')];
  const planRoutes = [route('post', '/api/sites/{siteId}/plans/evaluate'), route('post', '/api/sites/{siteId}/plans'), route('put', '/api/sites/{siteId}/plans/{planId}')];
  const t = validTariff;
  const withRule = (i: number, patch: Record<string, unknown>) => {
    const v = t();
    v.rules[i] = { ...v.rules[i], ...patch } as (typeof v.rules)[number];
    return v;
  };
  const tariffBad: [string, unknown, string][] = [
    ['target PF 1.2 (above 1)', withRule(0, { targetPf: 1.2 }), 'rules.0.targetPf'],
    ['target PF 90 (percent, not a fraction)', withRule(0, { targetPf: 90 }), 'rules.0.targetPf'],
    ['target PF 0', withRule(0, { targetPf: 0 }), 'rules.0.targetPf'],
    ['threshold PF 1.05', withRule(2, { thresholdPf: 1.05 }), 'rules.2.thresholdPf'],
    ['allowance PF 1.1', withRule(1, { allowance: { basis: 'pf', pf: 1.1 } }), 'rules.1.allowance.pf'],
    ['band PF 1.3', withRule(1, { pricing: { kind: 'pf-bands', bands: [{ pfBelow: 1.3, ratePerKvarh: 0.02 }] } }), 'rules.1.pricing.bands.0.pfBelow'],
    ['credit above PF 1.01', withRule(2, { credit: { abovePf: 1.01, pctPerStep: 0.5, maxPct: 5 } }), 'rules.2.credit.abovePf'],
    ['negative demand rate', withRule(0, { demandRatePerKw: -12 }), 'rules.0.demandRatePerKw'],
    ['a demand rate of 1e9 per kW', withRule(0, { demandRatePerKw: 1e9 }), 'rules.0.demandRatePerKw'],
    ['ratchet fraction 1.5', withRule(3, { ratchet: { fraction: 1.5 } }), 'rules.3.ratchet.fraction'],
    ['a time of 25:00', withRule(0, { window: { timeRanges: [{ from: '25:00', to: '19:00' }] } }), 'rules.0.window.timeRanges.0.from'],
    ['weekday 8', withRule(0, { window: { weekdays: [8] } }), 'rules.0.window.weekdays.0'],
    ['an impossible start date', { ...t(), effectiveFrom: '2025-02-30' }, 'effectiveFrom'],
    ['an impossible holiday', { ...t(), holidays: ['2025-13-01'] }, 'holidays.0'],
    ['51 rules', { ...t(), rules: Array.from({ length: 51 }, (_, i) => ({ type: 'leading-kvarh', id: `l${i}`, ratePerKvarh: 0.01 })) }, 'rules'],
    ['an allowance PF of 0.001 (k runs to infinity)', withRule(1, { allowance: { basis: 'pf', pf: 0.001 } }), 'rules.1.allowance.pf'],
    ['a PF step of 0.0001', withRule(2, { stepPf: 0.0001 }), 'rules.2.stepPf'],
    ['a 50-minute demand window (does not divide a day)', { ...t(), demandWindowMinutes: 50 }, 'demandWindowMinutes'],
    ['a 5-minute demand window on the site’s 15-minute data', { ...t(), demandWindowMinutes: 5 }, 'demandWindowMinutes'],
  ];
  const p = validPlan;
  const planBad: [string, unknown, string][] = [
    ['a negative Fixed bank size', { ...p(), bank: { kind: 'fixed', kvar: -150 } }, 'bank.kvar'],
    ['a zero Fixed bank size', { ...p(), bank: { kind: 'fixed', kvar: 0 } }, 'bank.kvar'],
    ['a negative total kvar', { ...p(), bank: { ...p().bank, totalKvar: -300 } }, 'bank.totalKvar'],
    ['a negative step', { ...p(), bank: { kind: 'switched', stepsKvar: [50, -50], targetPf: 0.95 } }, 'bank.stepsKvar.1'],
    ['controller target PF 1.2', { ...p(), bank: { ...p().bank, targetPf: 1.2 } }, 'bank.targetPf'],
    ['a discount rate of 500 % (5)', { ...p(), finance: { discountRate: 5, lifeYears: 15 } }, 'finance.discountRate'],
    ['a discount rate of 500 (percent written as a number)', { ...p(), finance: { discountRate: 500, lifeYears: 15 } }, 'finance.discountRate'],
    ['a negative discount rate', { ...p(), finance: { discountRate: -0.1, lifeYears: 15 } }, 'finance.discountRate'],
    ['a life of 0 years', { ...p(), finance: { discountRate: 0.08, lifeYears: 0 } }, 'finance.lifeYears'],
    ['a negative cost per kvar', { ...p(), costs: { ...p().costs, perKvar: -1 } }, 'costs.perKvar'],
    ['O&M of 500 % of capex', { ...p(), costs: { ...p().costs, omPctOfCapex: 500 } }, 'costs.omPctOfCapex'],
    ['a 0.05 kvar bank (below any capacitor)', { ...p(), bank: { kind: 'fixed', kvar: 0.05 } }, 'bank.kvar'],
    ['a rated voltage of 5 V', { ...p(), bank: { kind: 'fixed', kvar: 150, ratedVoltageV: 5 } }, 'bank.ratedVoltageV'],
  ];
  const cases: Case[] = [];
  for (const r of tariffRoutes) for (const [name, body, field] of tariffBad) cases.push({ route: routeKey(r), name: `${name} -> 400 naming ${field}`, run: async (x) => expectError(await send(x, r, JSON.stringify(body)), 400, { code: 'invalid_input', field }) });
  for (const r of planRoutes) for (const [name, body, field] of planBad) cases.push({ route: routeKey(r), name: `${name} -> 400 naming ${field}`, run: async (x) => expectError(await send(x, r, JSON.stringify(body)), 400, { code: 'invalid_input', field }) });
  const bills = route('post', '/api/sites/{siteId}/bills');
  const bill = VALID_BODIES[routeKey(bills)]!;
  for (const [name, patch, field] of [['PF 1.3', { powerFactor: 1.3 }, 'powerFactor'], ['PF 86 (percent)', { powerFactor: 86 }, 'powerFactor'], ['negative kWh', { kwh: -5 }, 'kwh'], ['negative kvarh', { kvarh: -5 }, 'kvarh'], ['an impossible date', { periodStart: '2025-02-29' }, 'periodStart']] as const) {
    cases.push({ route: routeKey(bills), name: `bill with ${name} -> 400 naming ${field}`, run: async (x) => expectError(await send(x, bills, JSON.stringify({ ...bill(), ...patch })), 400, { code: 'invalid_input', field }) });
  }
  const site = route('post', '/api/sites');
  for (const [name, patch, field] of [['transformer impedance 500 %', { transformerImpedancePct: 500 }, 'transformerImpedancePct'], ['a negative service voltage', { serviceVoltageV: -480 }, 'serviceVoltageV'], ['an unknown time zone', { timeZone: 'Mars/Olympus' }, 'timeZone'], ['a service voltage of 5 V', { serviceVoltageV: 5 }, 'serviceVoltageV']] as const) {
    cases.push({ route: routeKey(site), name: `site with ${name} -> 400 naming ${field}`, run: async (x) => expectError(await send(x, site, JSON.stringify({ ...VALID_BODIES[routeKey(site)]!(), ...patch })), 400, { code: 'invalid_input', field }) });
  }
  const sizing = route('get', '/api/sites/{siteId}/plans/sizing');
  for (const [q, field] of [['discountRate=5', 'discountRate'], ['discountRate=500', 'discountRate'], ['maxKvar=-50', 'maxKvar'], ['targetPf=1.2', 'targetPf']] as const) {
    cases.push({ route: routeKey(sizing), name: `sizing ?${q} -> 400 naming ${field}`, run: async (x) => expectError(await x.c.get(urlOf(sizing, x.ids, `?${q}`)), 400, { code: 'invalid_input', field }) });
  }
  const intervals = route('get', '/api/sites/{siteId}/intervals');
  for (const [q, field] of [['bankKvar=-50', 'bankKvar'], ['targetPf=1.5', 'targetPf']] as const) {
    cases.push({ route: routeKey(intervals), name: `intervals ?${q} -> 400 naming ${field}`, run: async (x) => expectError(await x.c.get(urlOf(intervals, x.ids, `?${q}`)), 400, { code: 'invalid_input', field }) });
  }
  return cases;
}

const CASES: Case[] = [...ROUTES.flatMap((r) => [...jsonBodyCases(r), ...multipartCases(r), ...queryCases(r), ...signedCases(r)]), ...outOfRangeCases()];
const ROUTES_COVERED = new Set(CASES.map((c) => c.route));

describe('the bad-input table covers the routes', () => {
  it('every route with a JSON body, a multipart body or a query has its row', () => {
    const missing = ROUTES.filter((r) => (r.body && !VALID_BODIES[routeKey(r)] && !SIGNED_BODY_ROUTES.has(routeKey(r))) || (r.multipart && !VALID_MULTIPART[routeKey(r)])).map(routeKey);
    expect(missing, 'add a valid example to tests/unit/fuzz/examples.ts').toEqual([]);
    for (const r of ROUTES.filter((r) => r.body || r.multipart || r.query)) expect(ROUTES_COVERED.has(routeKey(r)), routeKey(r)).toBe(true);
  });
  it('every valid example passes its own schema (so each case breaks one thing only)', () => {
    for (const r of ROUTES) {
      const make = VALID_BODIES[routeKey(r)];
      if (!make) continue;
      const parsed = r.body!.safeParse(make());
      expect(parsed.success, `${routeKey(r)}: ${JSON.stringify(parsed.error?.issues)}`).toBe(true);
    }
  });
});

beforeAll(async () => {
  const c = await as(DEMO.owner);
  const made = await c.post('/api/sites', { name: `Bad input check ${Date.now().toString(36)}`, timeZone: 'UTC', currency: 'USD' });
  expect(made.status, JSON.stringify(made.json)).toBe(201);
  const siteId = made.json.site.id as string;
  const up = await uploadFile(c, `/api/sites/${siteId}/meter-data`, { name: 'bad-input.csv', content: meterCsv(3) }, { mapping: JSON.stringify(validMeterMapping()) });
  expect(up.status, JSON.stringify(up.json)).toBe(201);
  const tariff = await c.post(`/api/sites/${siteId}/tariffs`, validTariff());
  expect(tariff.status, JSON.stringify(tariff.json)).toBe(201);
  const bill = await c.post(`/api/sites/${siteId}/bills`, VALID_BODIES['POST /api/sites/{siteId}/bills']!());
  expect(bill.status, JSON.stringify(bill.json)).toBe(201);
  const me = (await c.get('/api/me')).json;
  const members = (await c.get('/api/members')).json.members as { id: string; userId: string }[];
  ctx = { c, ids: { siteId, tariffId: tariff.json.tariff.id, billId: bill.json.bill.id, memberId: members.find((m) => m.userId === me.user.id)!.id } };
});

afterAll(async () => {
  if (ctx) expect((await ctx.c.del(`/api/sites/${ctx.ids.siteId}`)).status).toBe(204);
  console.log(`bad-input: ${CASES.length} cases over ${ROUTES_COVERED.size} routes`);
});

describe.each([...ROUTES_COVERED])('%s', (route) => {
  it.each(CASES.filter((c) => c.route === route).map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    await c.run(ctx);
  });
});

/** Valid input that used to answer 500, found by the fuzz runs; each is answered now. */
describe('regressions from the fuzz runs', () => {
  it('a rule id named like an Object.prototype member ("constructor", "valueOf") previews: 200, was a TypeError', async () => {
    const body = { ...validTariff(), rules: [{ type: 'leading-kvarh', id: 'constructor', ratePerKvarh: 0.05 }, { type: 'excess-kvar-demand', id: 'valueOf', allowance: { basis: 'ratio', kvarPerKw: 0.33 }, ratePerKvar: 8 }] };
    const r = await ctx.c.post(`/api/sites/${ctx.ids.siteId}/tariffs/preview`, body);
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    expect(r.json.preview.byRule.map((x: { ruleId: string }) => x.ruleId)).toEqual(['constructor', 'valueOf']);
  });
  it('a site supplied above 100 kV with a bank given only its rated voltage: 400 naming bank.serviceVoltageV, was a ZodError about a field not sent', async () => {
    const site = `/api/sites/${ctx.ids.siteId}`;
    expect((await ctx.c.patch(site, { serviceVoltageV: 230_000, transformerKva: 1500, transformerImpedancePct: 5.75 })).status).toBe(200);
    try {
      const r = await ctx.c.post(`${site}/plans/evaluate`, { ...validPlan(), bank: { kind: 'fixed', kvar: 150, ratedVoltageV: 480 } });
      expectError(r, 400, { code: 'invalid_input', field: 'bank.serviceVoltageV' });
      const ok = await ctx.c.post(`${site}/plans/evaluate`, { ...validPlan(), bank: { kind: 'fixed', kvar: 150, ratedVoltageV: 480, serviceVoltageV: 480 } });
      expect(ok.status, JSON.stringify(ok.json)).toBe(200);
    } finally {
      await ctx.c.patch(site, { serviceVoltageV: null });
    }
  });
  it('a bank that rounds to 0 kvar at its service voltage is evaluated (no resonance screen), was a RangeError', async () => {
    const site = `/api/sites/${ctx.ids.siteId}`;
    expect((await ctx.c.patch(site, { transformerKva: 1500, transformerImpedancePct: 5.75 })).status).toBe(200);
    const r = await ctx.c.post(`${site}/plans/evaluate`, { ...validPlan(), bank: { kind: 'fixed', kvar: 0.1, ratedVoltageV: 100_000, serviceVoltageV: 100 } });
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    expect(r.json.evaluation.screening.resonance).toBeNull();
  });
});
