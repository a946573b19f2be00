/**
 * Reads the engine's zod schemas so the editor can render a field for each part of a tariff:
 * what kind of input, its bounds, its `.describe()` text and a valid starting value.
 * Uses zod 4's definition objects (`_zod.def`), the same data `z.toJSONSchema` reads.
 */
import type { z } from 'zod';
import { START_VALUES } from './labels';

type Schema = z.ZodType;
// zod 4 keeps each schema's definition on `_zod.def`; its shape varies by type.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const def = (s: Schema): any => (s as any)._zod.def;

export type Unwrapped = { schema: Schema; optional: boolean; defaultValue: unknown; description: string | undefined };

/** Strips optional/default wrappers, keeping the outermost description. */
export function unwrap(s: Schema): Unwrapped {
  let cur = s;
  let optional = false;
  let defaultValue: unknown;
  let description = s.description;
  for (;;) {
    const d = def(cur);
    if (d.type === 'optional') optional = true;
    else if (d.type === 'default' || d.type === 'prefault') defaultValue ??= structuredClone(d.defaultValue);
    else break;
    cur = d.innerType;
    description ??= cur.description;
  }
  return { schema: cur, optional, defaultValue, description };
}

export type Kind =
  | { kind: 'string'; date: boolean; time: boolean; maxLength?: number; upper: boolean }
  | { kind: 'number'; min?: number; max?: number; minExclusive: boolean; int: boolean }
  | { kind: 'enum'; options: string[] }
  | { kind: 'literal'; value: unknown }
  | { kind: 'object'; shape: Record<string, Schema> }
  | { kind: 'union'; discriminator: string; options: { value: string; schema: Schema }[] }
  | { kind: 'array'; element: Schema; min: number; intSet?: { from: number; to: number } }
  | { kind: 'other' };

function checks(s: Schema): Record<string, unknown>[] {
  return (def(s).checks ?? []).map((c: { _zod: { def: Record<string, unknown> } }) => c._zod.def);
}

/** What input a (unwrapped) schema needs. */
export function kindOf(s: Schema): Kind {
  const d = def(s);
  switch (d.type) {
    case 'string': {
      const cs = checks(s);
      const pattern = cs.map((c) => (c.pattern instanceof RegExp ? c.pattern.source : '')).join(' ');
      const max = cs.find((c) => c.check === 'max_length')?.maximum as number | undefined;
      return { kind: 'string', date: pattern.includes('\\d{4}-\\d{2}-\\d{2}'), time: pattern.includes('[0-5]\\d'), maxLength: max, upper: pattern.includes('[A-Z]{3}') };
    }
    case 'number': {
      let min: number | undefined;
      let max: number | undefined;
      let minExclusive = false;
      let int = false;
      for (const c of checks(s)) {
        if (c.check === 'greater_than') {
          min = c.value as number;
          minExclusive = !c.inclusive;
        } else if (c.check === 'less_than') max = c.value as number;
        else if (c.check === 'number_format' && String(c.format).includes('int')) int = true;
      }
      return { kind: 'number', min, max, minExclusive, int };
    }
    case 'enum':
      return { kind: 'enum', options: Object.values(d.entries as Record<string, string>) };
    case 'literal':
      return { kind: 'literal', value: d.values[0] };
    case 'object':
      return { kind: 'object', shape: d.shape };
    case 'union': {
      if (d.discriminator) {
        return {
          kind: 'union',
          discriminator: d.discriminator,
          options: (d.options as Schema[]).map((o) => ({ value: String(def(def(o).shape[d.discriminator]).values[0]), schema: o })),
        };
      }
      // A union of enums and literals (e.g. a rounding mode or 'exact') reads as one choice.
      const options: string[] = [];
      for (const o of d.options as Schema[]) {
        const k = kindOf(o);
        if (k.kind === 'enum') options.push(...k.options);
        else if (k.kind === 'literal') options.push(String(k.value));
        else return { kind: 'other' };
      }
      return { kind: 'enum', options };
    }
    case 'array': {
      const min = (checks(s).find((c) => c.check === 'min_length')?.minimum as number | undefined) ?? 0;
      const el = kindOf(unwrap(d.element).schema);
      const intSet = el.kind === 'number' && el.int && el.min !== undefined && el.max !== undefined && el.max - el.min <= 11 ? { from: el.min, to: el.max } : undefined;
      return { kind: 'array', element: d.element, min, intSet };
    }
    default:
      return { kind: 'other' };
  }
}

/** The field's own key: the last non-index segment of a path. */
export function keyOf(path: string): string {
  return path.split('.').filter((p) => !/^\d+$/.test(p)).at(-1) ?? path;
}

/**
 * A valid starting value for a schema: its default, a typical figure for the field, the
 * first choice of an enum or union; optional parts are left out unless `withOptional`.
 */
export function initialValue(s: Schema, key = '', withOptional = false): unknown {
  const u = unwrap(s);
  if (u.optional && !withOptional) return undefined;
  if (u.defaultValue !== undefined) return u.defaultValue;
  if (key in START_VALUES) return structuredClone(START_VALUES[key]);
  const k = kindOf(u.schema);
  switch (k.kind) {
    case 'object': {
      const out: Record<string, unknown> = {};
      for (const [name, child] of Object.entries(k.shape)) {
        const v = initialValue(child, name);
        if (v !== undefined) out[name] = v;
      }
      return out;
    }
    case 'union':
      return initialValue(k.options[0]!.schema);
    case 'enum':
      return k.options[0];
    case 'literal':
      return k.value;
    case 'number':
      return k.max !== undefined && k.max <= 1 ? 0.9 : (k.min ?? 0) + (k.minExclusive ? 1 : 0);
    case 'array':
      return k.min > 0 ? [initialValue(k.element, key)] : [];
    case 'string':
      return '';
    default:
      return undefined;
  }
}

/** The option of a discriminated union whose discriminator has `value`. */
export function unionOption(s: Schema, value: string): Schema | undefined {
  const k = kindOf(unwrap(s).schema);
  return k.kind === 'union' ? k.options.find((o) => o.value === value)?.schema : undefined;
}
