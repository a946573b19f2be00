import { z } from 'zod';
import { fail, ok, type Issue, type Result } from '../result';
import { tariffRuleSchema } from './rule-registry';

/** True for a `YYYY-MM-DD` string that names a real calendar date (no 2025-02-30). */
export function isCalendarDate(s: string): boolean {
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2025-07-04.')
  .refine(isCalendarDate, 'This is not a real calendar date.');

/** Most rules and holidays one tariff version may list (far above any real tariff sheet). */
export const MAX_RULES = 50;
export const MAX_HOLIDAYS = 1000;

/**
 * A tariff's PF clauses: an ordered list of rules plus currency and demand window.
 * Versioned by `effectiveFrom`; stored as JSON and parsed with this schema.
 */
export const tariffSchema = z
  .strictObject({
    name: z.string().min(1).max(120).describe('Tariff name as the utility prints it.'),
    currency: z.string().regex(/^[A-Z]{3}$/, 'Use a three-letter ISO 4217 code such as USD.').describe('ISO 4217 currency code of every rate.'),
    effectiveFrom: isoDate.optional().describe('First local date this version applies to.'),
    demandWindowMinutes: z
      .number()
      .int()
      .min(1)
      .max(1440)
      .refine((m) => 1440 % m === 0, 'The demand window must divide a day evenly: 5, 10, 15, 30 or 60 minutes, for example.')
      .optional()
      .describe('Demand window in minutes (e.g. 15 or 30); absent means the meter interval.'),
    demandMethod: z.enum(['block', 'rolling']).default('block').describe('block: clock-aligned fixed windows; rolling: a window ending at every meter interval.'),
    holidays: z.array(isoDate).max(MAX_HOLIDAYS, `List at most ${MAX_HOLIDAYS} holidays.`).default([]).describe('Local dates treated as holidays by time-of-use windows.'),
    rules: z.array(tariffRuleSchema).max(MAX_RULES, `A tariff version holds at most ${MAX_RULES} rules.`).describe('PF rules, evaluated in this order.'),
  })
  .superRefine((t, ctx) => {
    const seen = new Set<string>();
    t.rules.forEach((r, i) => {
      if (seen.has(r.id)) ctx.addIssue({ code: 'custom', path: ['rules', i, 'id'], message: `Rule id "${r.id}" is used twice.` });
      seen.add(r.id);
    });
  })
  .describe('Power-factor clauses of a tariff.');

export type Tariff = z.infer<typeof tariffSchema>;
export type TariffInput = z.input<typeof tariffSchema>;

/** Parses stored or submitted tariff JSON; every problem comes back with its path. */
export function parseTariff(json: unknown): Result<Tariff> {
  const parsed = tariffSchema.safeParse(json);
  if (parsed.success) return ok(parsed.data);
  const errors: Issue[] = parsed.error.issues.map((i) => ({
    code: `tariff-${i.code}`,
    message: `${i.path.length ? i.path.join('.') : 'tariff'}: ${i.message}`,
  }));
  return fail(errors);
}

/** The version in force on a local date (`YYYY-MM-DD`): the latest `effectiveFrom` not after it. */
export function tariffVersionOn(versions: readonly Tariff[], date: string): Tariff | null {
  let best: Tariff | null = null;
  for (const v of versions) {
    const from = v.effectiveFrom ?? '0000-01-01';
    if (from <= date && (best === null || from >= (best.effectiveFrom ?? '0000-01-01'))) best = v;
  }
  return best;
}
