/**
 * Reads a query schema's fields (zod 4 definitions, as the tariff editor does) to make values
 * each field must refuse: a word for a number, one past each bound, an option that is not one,
 * text that breaks a pattern or a length limit, an impossible calendar date.
 */
import type { z } from 'zod';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const def = (s: z.ZodType): any => (s as any)._zod.def;

/** The schema under optional/default/nullable wrappers. */
export function inner(s: z.ZodType): z.ZodType {
  let cur = s;
  for (;;) {
    const d = def(cur);
    if (d.type === 'optional' || d.type === 'default' || d.type === 'prefault' || d.type === 'nullable') cur = d.innerType;
    else return cur;
  }
}

const checksOf = (s: z.ZodType): Record<string, unknown>[] => (def(s).checks ?? []).map((c: { _zod: { def: Record<string, unknown> } }) => c._zod.def);

/** Query-string values that `schema` must refuse, with what each one tries. */
export function badQueryValues(schema: z.ZodType): { value: string; why: string }[] {
  const s = inner(schema);
  const d = def(s);
  const out: { value: string; why: string }[] = [];
  switch (d.type) {
    case 'number': {
      out.push({ value: 'abc', why: 'not a number' });
      for (const c of checksOf(s)) {
        if (c.check === 'less_than') out.push({ value: String((c.value as number) * 10 + 1), why: `above ${c.value}` });
        if (c.check === 'greater_than') out.push({ value: String((c.value as number) - 1), why: `below ${c.value}` });
        if (c.check === 'number_format' && String(c.format).includes('int')) out.push({ value: '1.5', why: 'not whole' });
      }
      break;
    }
    case 'enum':
      out.push({ value: 'not-an-option', why: 'not one of the options' });
      break;
    case 'string': {
      for (const c of checksOf(s)) {
        if (c.check === 'max_length') out.push({ value: 'x'.repeat((c.maximum as number) + 1), why: `longer than ${c.maximum}` });
        if (c.check === 'min_length' && (c.minimum as number) > 0) out.push({ value: '', why: 'empty' });
        if (c.pattern instanceof RegExp) {
          out.push({ value: '!!not~matching!!', why: `not ${c.pattern.source}` });
          if (c.pattern.source.includes('\\d{4}-\\d{2}-\\d{2}')) out.push({ value: '2025-02-30', why: 'not a real date' });
        }
      }
      break;
    }
  }
  return out;
}

/** The fields of an object schema. */
export const shapeOf = (s: z.ZodType) => (def(inner(s)).shape ?? {}) as Record<string, z.ZodType>;
