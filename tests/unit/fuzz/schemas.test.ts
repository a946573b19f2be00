/**
 * Generated input into every request schema of ROUTES (bodies, queries, the multipart mappings):
 * safeParse never throws, a refusal always names at least one field through fromZod, and what a
 * schema accepts it accepts again (defaults and trims are stable). Fixed seeds, so a failure
 * reproduces; the run count is printed.
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { z } from 'zod';
import { ROUTES } from '@/lib/api/openapi';
import { fromZod } from '@/lib/api/errors';
import { MeterMappingSchema } from '@/lib/import/mapping-schema';
import { BillMappingSchema } from '@/lib/import/bills/bill-schema';
import { routeKey, SIGNED_BODY_ROUTES, VALID_BODIES, validBillMapping, validMeterMapping } from './examples';
import { edgeValue, mutated } from './mutate';
import { shapeOf } from './schema-probe';
import { fromSchema } from './from-schema';

// FUZZ_RUNS and FUZZ_SEED explore further by hand; CI runs the fixed default.
const RUNS = Number(process.env.FUZZ_RUNS ?? 300);
const SEED = Number(process.env.FUZZ_SEED ?? 0);
let total = 0;
afterAll(() => console.log(`fuzz-schemas: ${total} runs over ${SCHEMAS.length} schemas`));

type Entry = { name: string; schema: z.ZodType; valid?: () => unknown; where: string };
const seen = new Set<z.ZodType>();
const SCHEMAS: Entry[] = [];
for (const r of ROUTES) {
  if (r.body && !SIGNED_BODY_ROUTES.has(routeKey(r)) && !seen.has(r.body)) {
    seen.add(r.body);
    SCHEMAS.push({ name: `${routeKey(r)} body`, schema: r.body, valid: VALID_BODIES[routeKey(r)], where: 'body' });
  }
  if (r.query && !seen.has(r.query)) {
    seen.add(r.query);
    SCHEMAS.push({ name: `${routeKey(r)} query`, schema: r.query, where: 'params' });
  }
}
SCHEMAS.push({ name: 'meter mapping (multipart field)', schema: MeterMappingSchema, valid: validMeterMapping, where: 'body' });
SCHEMAS.push({ name: 'bill mapping (multipart field)', schema: BillMappingSchema, valid: validBillMapping, where: 'body' });

/** Runs one property with a fixed seed derived from the schema's name and counts its runs. */
function check<T>(name: string, arb: fc.Arbitrary<T>, prop: (v: T) => void) {
  let seed = 0;
  for (const ch of name) seed = (seed * 31 + ch.charCodeAt(0)) | 0;
  const out = fc.check(fc.property(arb, prop), { seed: seed + SEED, numRuns: RUNS });
  total += out.numRuns;
  if (out.failed) throw new Error(`${name}: seed ${seed + SEED}, path ${out.counterexamplePath}: ${fc.stringify(out.counterexample)}\n${out.errorInstance instanceof Error ? out.errorInstance.stack : String(out.errorInstance)}`);
}

/** The property every schema keeps, whatever it is given. */
function holds(e: Entry, input: unknown) {
  const parsed = e.schema.safeParse(input);
  if (!parsed.success) {
    const err = fromZod(parsed.error, e.where);
    expect(err.status).toBe(400);
    expect(Object.keys(err.fields ?? {}).length).toBeGreaterThan(0);
    expect(err.message.length).toBeGreaterThan(0);
    return;
  }
  const again = e.schema.safeParse(JSON.parse(JSON.stringify(parsed.data)));
  expect(again.success, JSON.stringify(again.error?.issues)).toBe(true);
}

const anything = fc.anything({ maxDepth: 4, withBigInt: true, withDate: true, withMap: true, withSet: true, withNullPrototype: true, withTypedArray: true, withSparseArray: true, withBoxedValues: true, withObjectString: true });
const queryValue = fc.oneof(edgeValue.map(String), fc.string({ maxLength: 20 }), fc.constantFrom('csv', 'xlsx', 'month', 'billing', 'fixed', 'switched', '0.95', '1e3', '0x10', ' 12 ', '-0'));

describe.each(SCHEMAS.map((e) => [e.name, e] as const))('%s', (_name, e) => {
  it('any JS value: no throw, a refusal names a field', () => check(`${e.name} anything`, anything, (v) => holds(e, v)));
  it('any JSON value: no throw, a refusal names a field', () => check(`${e.name} json`, fc.jsonValue({ maxDepth: 5 }), (v) => holds(e, v)));
  it('values generated from the schema itself: no throw, a refusal names a field', () => check(`${e.name} generated`, fromSchema(e.schema), (v) => holds(e, v)));
  if (e.valid) {
    it('the valid example is accepted', () => expect(e.schema.safeParse(e.valid!()).success).toBe(true));
    it('a mutated valid example: no throw, a refusal names a field', () => check(`${e.name} mutated`, mutated(e.valid!), (v) => holds(e, v)));
  }
  if (e.where === 'params') {
    const keys = Object.keys(shapeOf(e.schema));
    const query = fc.dictionary(fc.oneof(fc.constantFrom(...keys), fc.string({ maxLength: 6 })), queryValue, { maxKeys: 6 });
    it('any query string: no throw, a refusal names a parameter', () => check(`${e.name} query`, query, (v) => holds(e, v)));
  }
});

/**
 * Found by the mutated-example property: an unknown top-level field named like an Object.prototype
 * member ("constructor", "toString", "__proto__") went unnamed in `fields` while fromZod collected
 * into a plain object. fromZod now uses a null-prototype map.
 */
describe('fromZod and keys named like Object.prototype members', () => {
  const strict = SCHEMAS.find((e) => e.name.startsWith('POST /api/sites body'))!;
  it.each(['constructor', 'toString', '__proto__'])('an unknown top-level field "%s" is named in fields', (key) => {
    const body = JSON.parse(`{"name": "Check site", "timeZone": "UTC", ${JSON.stringify(key)}: 1}`);
    const parsed = strict.schema.safeParse(body);
    expect(parsed.success).toBe(false);
    expect(Object.keys(fromZod(parsed.error!).fields ?? {})).toContain(key);
  });
});
