/**
 * Generated tariffs, plans and sizing queries that pass their schemas, through the engine on an
 * invented two-month load (lagging days, leading nights, idle and exporting hours): findings,
 * plan evaluation and the sizing search finish without a throw and put no NaN into an answer
 * (JSON would turn it into a silent null). This is what the endpoints would answer with a
 * 500 if it threw. Fixed seeds; the run count is printed.
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildSeries, tariffDataProblems, unwrap } from '@/lib/domain';
import { TariffVersionSchema } from '@/lib/schemas/tariff';
import { PlanSpecSchema, SizingQuerySchema } from '@/lib/correction-plans/plan-spec';
import { computeFindings } from '@/lib/findings/compute';
import { buildSiteInputs } from '@/lib/correction-plans/site-inputs';
import { evaluatePlan } from '@/lib/correction-plans/evaluate-plan';
import { runSizing } from '@/lib/correction-plans/sizing';
import { SiteCreateSchema, type SiteDto } from '@/lib/schemas/site';
import { fromSchema } from './from-schema';
import { ApiError } from '@/lib/api/errors';
import { validPlan, validTariff } from './examples';

// FUZZ_RUNS and FUZZ_SEED explore further by hand; CI runs the fixed default.
const RUNS = Number(process.env.FUZZ_RUNS ?? 100);
const SEED = Number(process.env.FUZZ_SEED ?? 0);
let total = 0;
afterAll(() => console.log(`fuzz-engine: ${total} runs`));

// Invented load, January and February 2025 in UTC, quarter-hours: 400 kW at PF 0.80 lagging by day,
// 40 kW leading by night (over-corrected), nothing on Sunday mornings, exporting 50 kW on Saturday noons.
const START = Date.UTC(2025, 0, 1);
const N = 59 * 96;
const rows = Array.from({ length: N }, (_, i) => {
  const t = new Date(START + i * 900_000);
  const h = t.getUTCHours();
  if (t.getUTCDay() === 0 && h < 12) return [0, 0] as const;
  if (t.getUTCDay() === 6 && h >= 11 && h < 14) return [-12.5, 2] as const;
  return h >= 7 && h < 19 ? ([100, 75] as const) : ([10, -6] as const);
});
const series = unwrap(
  buildSeries({ intervalMinutes: 15, stamps: rows.map((_, i) => START + i * 900_000), active: rows.map((r) => r[0]), reactive: { kind: 'registers', lag: rows.map((r) => Math.max(0, r[1])), lead: rows.map((r) => Math.max(0, -r[1])) } }),
);
const fixedSite = { id: 'site_fuzz', name: 'Engine fuzz site', address: '', timeZone: 'Europe/London', utility: '', accountNumber: '', serviceVoltageV: 415, transformerKva: 1000, transformerImpedancePct: 5.5, currency: 'USD', auditState: 'draft', createdAt: '', updatedAt: '' } satisfies SiteDto;

/** Paths of NaN numbers anywhere in a value. */
function nans(v: unknown, path = '', out: string[] = []): string[] {
  if (typeof v === 'number' && Number.isNaN(v)) out.push(path || '(root)');
  else if (Array.isArray(v)) v.forEach((x, i) => nans(x, `${path}.${i}`, out));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) nans(x, `${path}.${k}`, out);
  return out;
}

async function check<T>(name: string, arb: fc.Arbitrary<T>, prop: (v: T) => void, runs = RUNS) {
  let seed = 5;
  for (const ch of name) seed = (seed * 31 + ch.charCodeAt(0)) | 0;
  const out = fc.check(fc.property(arb, prop), { seed: seed + SEED, numRuns: runs });
  total += out.numRuns;
  if (out.failed) throw new Error(`${name}: seed ${seed + SEED}, path ${out.counterexamplePath}: ${fc.stringify(out.counterexample).slice(0, 3000)}\n${out.errorInstance instanceof Error ? out.errorInstance.stack : String(out.errorInstance)}`);
}

/** The value, or null for a 4xx ApiError (the endpoint's answer); anything else thrown fails the run. */
function answered<T>(fn: () => T): T | null {
  try {
    return fn();
  } catch (e) {
    if (e instanceof ApiError && e.status >= 400 && e.status < 500) return null;
    throw e;
  }
}

/** Values of `schema` that it accepts (generated from its own definition), parsed. */
const accepted = <S extends { safeParse: (v: unknown) => { success: boolean; data?: unknown } }>(schema: S, arb: fc.Arbitrary<unknown>) =>
  arb.map((v) => schema.safeParse(v)).filter((p) => p.success).map((p) => p.data as never);

const anyTariff = accepted(TariffVersionSchema, fromSchema(TariffVersionSchema));
const tariffs = fc.oneof({ weight: 4, arbitrary: anyTariff }, { weight: 1, arbitrary: fc.constant(TariffVersionSchema.parse(validTariff())) });
// The engine's contract: a tariff whose demand window is not made of whole meter intervals is
// checked with tariffDataProblems first (evaluateTariff throws on it). Findings do not check yet
// (see the known-bug test below), so they get fitting tariffs only.
const fits = (t: unknown) => tariffDataProblems(t as never, series).length === 0;
const fittingTariffs = tariffs.filter(fits);
const plans = fc.oneof({ weight: 4, arbitrary: accepted(PlanSpecSchema, fromSchema(PlanSpecSchema)) }, { weight: 1, arbitrary: fc.constant(PlanSpecSchema.parse(validPlan())) });
/** The fixed site, or one with any accepted voltage and transformer (they feed the screens). */
const sites = fc.oneof(
  fc.constant(fixedSite),
  accepted(SiteCreateSchema, fromSchema(SiteCreateSchema)).map((s: Record<string, unknown>) => ({ ...fixedSite, serviceVoltageV: (s.serviceVoltageV as number | undefined) ?? null, transformerKva: (s.transformerKva as number | undefined) ?? null, transformerImpedancePct: (s.transformerImpedancePct as number | undefined) ?? null })),
);
const version = (t: { name: string; effectiveFrom: string }, i = 0) => ({ id: `trf_${i}`, name: t.name, effectiveFrom: t.effectiveFrom, definition: t });

describe('the engine on generated inputs', () => {
  it('findings by month for any accepted tariff (one or two versions)', () =>
    check('findings', fc.array(fittingTariffs, { minLength: 1, maxLength: 2 }), (ts) => {
      const r = computeFindings({ series, zone: fixedSite.timeZone, tariffs: ts.map((t, i) => version(t as never, i)), basis: 'month' });
      expect(r.ok, JSON.stringify(r)).toBe(true);
      expect(nans(r)).toEqual([]);
    }), 120_000);
  it('plan evaluation for any accepted plan and tariff', () =>
    check('evaluate', fc.tuple(tariffs, plans, sites), ([t, p, site]) => {
      const ev = answered(() => evaluatePlan(buildSiteInputs(site, series, [version(t as never)]), p as never));
      expect(nans(ev)).toEqual([]);
    }), 120_000);
  it('the sizing search for any accepted query and tariff', () =>
    check('sizing', fc.tuple(tariffs, accepted(SizingQuerySchema, fromSchema(SizingQuerySchema)), sites), ([t, q, site]) => {
      const s = answered(() => runSizing(buildSiteInputs(site, series, [version(t as never)]), q as never));
      expect(nans(s)).toEqual([]);
    }, Math.max(5, Math.round(RUNS / 4))), 120_000);
});

/**
 * Found by this run: a saved version whose demand window does not fit the meter data (a 5-minute
 * window, then 15-minute data imported) made computeFindings throw a RangeError (findings,
 * reconciliation, Portfolio and reports answered 500). It is now left out with a note.
 */
describe('a demand window that does not fit the data, in findings', () => {
  it('a saved version with a 5-minute demand window on 15-minute data is left out, not thrown', () => {
    const t = TariffVersionSchema.parse({ ...validTariff(), demandWindowMinutes: 5 });
    const r = computeFindings({ series, zone: fixedSite.timeZone, tariffs: [version(t)], basis: 'month' });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.findings.notes.join(' ')).toMatch(/was left out: .*demand window/i);
  });
});
