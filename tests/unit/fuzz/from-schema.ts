/**
 * A fast-check arbitrary read off a zod 4 schema (its `_zod.def`, as the tariff editor reads
 * it): objects with their optional parts sometimes left out, numbers anywhere in their bounds
 * and on them, the options of enums and unions, dates, clock times and currency codes for the
 * patterns this project uses. Most values it makes are valid, which is the point: they get past
 * validation into the engine. Refinements (unique rule ids, a bank's steps) are not read, so a
 * few values are still refused.
 */
import fc from 'fast-check';
import type { z } from 'zod';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const def = (s: z.ZodType): any => (s as any)._zod.def;
const checksOf = (s: z.ZodType): Record<string, unknown>[] => (def(s).checks ?? []).map((c: { _zod: { def: Record<string, unknown> } }) => c._zod.def);

const isoDay = fc.date({ min: new Date('2019-01-01T00:00:00Z'), max: new Date('2030-12-31T00:00:00Z'), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10));
const clock = fc.oneof(fc.tuple(fc.integer({ min: 0, max: 23 }), fc.integer({ min: 0, max: 59 })).map(([h, m]) => `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}`), fc.constant('24:00'), fc.constant('00:00'));

function numberArb(s: z.ZodType): fc.Arbitrary<number> {
  let min = -1e6;
  let max = 1e6;
  let minExcluded = false;
  let maxExcluded = false;
  let int = false;
  for (const c of checksOf(s)) {
    if (c.check === 'greater_than') [min, minExcluded] = [c.value as number, !c.inclusive];
    else if (c.check === 'less_than') [max, maxExcluded] = [c.value as number, !c.inclusive];
    else if (c.check === 'number_format' && String(c.format).includes('int')) int = true;
  }
  if (int) return fc.integer({ min: Math.ceil(minExcluded ? min + 1 : min), max: Math.floor(maxExcluded ? max - 1 : max) });
  const edges = [min, max, (min + max) / 2].filter((v) => (v > min || !minExcluded) && (v < max || !maxExcluded));
  return fc.oneof({ weight: 4, arbitrary: fc.double({ min, max, minExcluded, maxExcluded, noNaN: true }) }, { weight: 1, arbitrary: fc.constantFrom(...edges) });
}

function stringArb(s: z.ZodType): fc.Arbitrary<string> {
  const cs = checksOf(s);
  const pattern = cs.map((c) => (c.pattern instanceof RegExp ? c.pattern.source : '')).join(' ');
  if (cs.some((c) => c.format === 'email')) return fc.emailAddress();
  if (pattern.includes('\\d{4}-\\d{2}-\\d{2}')) return isoDay;
  if (pattern.includes('[0-5]\\d')) return clock;
  if (pattern.includes('[A-Z]{3}')) return fc.constantFrom('USD', 'EUR', 'GBP', 'AUD');
  const minLength = (cs.find((c) => c.check === 'min_length')?.minimum as number | undefined) ?? 0;
  const maxLength = Math.min((cs.find((c) => c.check === 'max_length')?.maximum as number | undefined) ?? 40, 40);
  return fc.string({ minLength: Math.min(minLength, maxLength), maxLength }).map((t) => (t.trim().length >= minLength ? t : `${t}${'x'.repeat(minLength)}`));
}

/** Fields whose rule is a refinement the walk cannot read: plausible values by name. */
const BY_KEY: Record<string, fc.Arbitrary<unknown>> = {
  timeZone: fc.constantFrom('UTC', 'Europe/London', 'America/Chicago', 'Australia/Lord_Howe', 'Asia/Kathmandu', 'Pacific/Chatham'),
  currency: fc.constantFrom('USD', 'EUR', 'GBP', 'AUD'),
};

/** An arbitrary of values shaped by `schema`. */
export function fromSchema(schema: z.ZodType, depth = 0): fc.Arbitrary<unknown> {
  const d = def(schema);
  switch (d.type) {
    case 'optional':
      return fc.option(fromSchema(d.innerType, depth), { nil: undefined, freq: 3 });
    case 'default':
    case 'prefault':
      return fc.option(fromSchema(d.innerType, depth), { nil: undefined, freq: 3 });
    case 'nullable':
      return fc.option(fromSchema(d.innerType, depth), { nil: null, freq: 5 });
    case 'object': {
      const shape = d.shape as Record<string, z.ZodType>;
      const field = (k: string, v: z.ZodType) => {
        const hint = BY_KEY[k];
        if (!hint) return fromSchema(v, depth + 1);
        return v.safeParse(undefined).success ? fc.option(hint, { nil: undefined, freq: 3 }) : hint;
      };
      return fc.record(Object.fromEntries(Object.entries(shape).map(([k, v]) => [k, field(k, v)]))).map((o) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)));
    }
    case 'union':
      return fc.oneof(...(d.options as z.ZodType[]).map((o) => fromSchema(o, depth + 1)));
    case 'array': {
      const cs = checksOf(schema);
      const minLength = (cs.find((c) => c.check === 'min_length')?.minimum as number | undefined) ?? 0;
      const maxLength = Math.max(minLength, Math.min((cs.find((c) => c.check === 'max_length')?.maximum as number | undefined) ?? 4, depth > 2 ? 3 : 4));
      return fc.array(fromSchema(d.element, depth + 1), { minLength, maxLength });
    }
    case 'number':
      return numberArb(schema);
    case 'string':
      return stringArb(schema);
    case 'enum':
      return fc.constantFrom(...(Object.values(d.entries) as string[]));
    case 'literal':
      return fc.constantFrom(...(d.values as unknown[]));
    case 'boolean':
      return fc.boolean();
    case 'record':
      return fc.dictionary(fc.string({ maxLength: 6 }), fromSchema(d.valueType, depth + 1), { maxKeys: 3 });
    case 'pipe':
      return fromSchema(d.in, depth);
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}
