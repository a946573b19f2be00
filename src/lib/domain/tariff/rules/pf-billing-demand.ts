import { z } from 'zod';
import {
  kvarhBasisSchema,
  pfBasisSchema,
  pfRoundingSchema,
  pfTarget,
  ratchetSchema,
  roundingModeSchema,
  ruleBaseShape,
  priceSchema,
} from '../common-schemas';
import { money, num, pct, rate } from '../format';
import { isBelow, roundSteps, roundTo, rulePf } from '../pf-basis';
import { ratchetFloor, type RuleInput, type RuleOutcome } from '../rule-contract';

export const PF_BILLING_DEMAND = 'pf-billing-demand';

/** Clause shape 1: billing demand raised when PF is below a target. */
export const pfBillingDemandRuleSchema = z
  .strictObject({
    type: z.literal(PF_BILLING_DEMAND),
    ...ruleBaseShape,
    targetPf: pfTarget.describe('PF below which billing demand is raised, e.g. 0.90.'),
    pfBasis: pfBasisSchema.default('average'),
    kvarhBasis: kvarhBasisSchema.default('lagging'),
    pfRounding: pfRoundingSchema.optional(),
    formula: z
      .enum(['ratio', 'linear', 'per-point'])
      .default('ratio')
      .describe('ratio: D x target / PF; linear: D x (1 + target - PF); per-point: D x (1 + m x points below target / 100).'),
    percentPerPoint: z.number().positive().max(10).default(1).describe('Per-point formula: percent added per PF point (0.01) below target.'),
    pointRounding: z.union([roundingModeSchema, z.literal('exact')]).default('up').describe('Per-point formula: rounding of the points below target.'),
    maxIncreasePct: z.number().min(0).max(1000).optional().describe('Cap on the increase, percent of measured demand (e.g. 10).'),
    demandRatePerKw: priceSchema().describe('Demand charge per kW of billing demand for the period.'),
    demandDecimals: z.number().int().min(0).max(4).optional().describe('Decimals kW figures are rounded to before pricing, when the bill does so.'),
    ratchet: ratchetSchema
      .extend({
        order: z
          .enum(['adjust-then-ratchet', 'ratchet-then-adjust'])
          .default('adjust-then-ratchet')
          .describe('Whether the PF adjustment applies to each month before the ratchet compares them, or to the ratcheted demand.'),
      })
      .optional(),
  })
  .describe('PF-adjusted billing demand');

export type PfBillingDemandRule = z.infer<typeof pfBillingDemandRuleSchema>;

/**
 * Billing demand adjusted for PF, with optional cap and ratchet. The PF-related charge
 * is (BD - BD without the PF adjustment) x demand rate, both computed the same way.
 */
export function evaluatePfBillingDemand(rule: PfBillingDemandRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const measured = rulePf(agg, rule.pfBasis, rule.kvarhBasis, rule.pfRounding);
  if (agg.peakKw <= 0 || measured.pf === null) {
    return { amount: 0, status: 'not-applicable', quantities: { peakKw: agg.peakKw, pf: null }, explain: () => 'No import demand in this period, so there is no PF adjustment.', memory: { demandKw: 0, adjustedKw: 0 } };
  }
  const pf = measured.pf;
  const kw = (x: number) => (rule.demandDecimals === undefined ? x : roundTo(x, rule.demandDecimals, 'nearest'));
  const demandKw = kw(agg.peakKw);
  const factor = adjustmentFactor(rule, pf);
  const capFactor = rule.maxIncreasePct === undefined ? Number.POSITIVE_INFINITY : 1 + rule.maxIncreasePct / 100;
  const applied = Math.min(factor.value, capFactor);
  const adjustedKw = kw(demandKw * applied);
  const parts: (() => string)[] = [];
  if (factor.value > 1) {
    parts.push(() => `${measured.text()} is below the ${rule.targetPf} target: billing demand = ${factor.text(demandKw)} = ${num(kw(demandKw * factor.value))} kW`);
    if (applied < factor.value) parts.push(() => `capped at +${pct(rule.maxIncreasePct ?? 0)} = ${num(adjustedKw)} kW`);
  } else {
    parts.push(() => `${measured.text()} is not below the ${rule.targetPf} target: billing demand stays ${num(demandKw)} kW`);
  }

  let billedKw = adjustedKw;
  let withoutPfKw = demandKw;
  const quantities: Record<string, number | null> = { peakKw: agg.peakKw, demandKw, pf, rawPf: measured.rawPf, targetPf: rule.targetPf, factor: applied, adjustedKw };
  if (rule.ratchet) {
    const r = rule.ratchet;
    const floorRaw = ratchetFloor(input.memory, 'demandKw', r.lookbackPeriods);
    const floorAdj = ratchetFloor(input.memory, 'adjustedKw', r.lookbackPeriods);
    const scope = () => `${floorRaw.used} of ${r.lookbackPeriods} earlier periods available`;
    if (r.order === 'adjust-then-ratchet') {
      const floor = kw(r.fraction * floorAdj.max);
      billedKw = Math.max(adjustedKw, floor);
      withoutPfKw = Math.max(demandKw, kw(r.fraction * floorRaw.max));
      parts.push(() => `ratchet ${num(r.fraction * 100, 0)} % of the highest adjusted demand (${scope()}) = ${num(floor)} kW, so billing demand = ${num(billedKw)} kW; without the PF adjustment it would be ${num(withoutPfKw)} kW`);
    } else {
      const base = Math.max(demandKw, kw(r.fraction * floorRaw.max));
      billedKw = kw(base * applied);
      withoutPfKw = base;
      parts.push(() => `ratchet first: max(${num(demandKw)} kW, ${num(r.fraction * 100, 0)} % of the highest earlier demand (${scope()})) = ${num(base)} kW, adjusted x ${applied.toFixed(4)} = ${num(billedKw)} kW`);
    }
    quantities.ratchetFloorKw = r.fraction * floorRaw.max;
    quantities.ratchetPeriodsUsed = floorRaw.used;
  }
  const pfKw = Math.max(0, billedKw - withoutPfKw);
  const amount = pfKw * rule.demandRatePerKw;
  quantities.billingDemandKw = billedKw;
  quantities.billingDemandWithoutPfKw = withoutPfKw;
  quantities.pfRelatedKw = pfKw;
  parts.push(() => `PF-related demand ${num(pfKw)} kW × ${rate(rule.demandRatePerKw, currency, 'kW')} = ${money(amount, currency)}`);
  // A billed-basis ratchet remembers what was billed, ratchet included; else the measured demand.
  const memory = rule.ratchet?.basis === 'billed' ? { demandKw: withoutPfKw, adjustedKw: billedKw } : { demandKw, adjustedKw };
  return { amount, status: amount > 0 ? 'charge' : 'none', quantities, explain: () => `${parts.map((f) => f()).join('; ')}.`, memory };
}

function adjustmentFactor(rule: PfBillingDemandRule, pf: number): { value: number; text: (d: number) => string } {
  if (!isBelow(pf, rule.targetPf)) return { value: 1, text: (d) => `${num(d)} kW` };
  if (rule.formula === 'ratio') {
    return { value: rule.targetPf / pf, text: (d) => `${num(d)} kW × ${rule.targetPf} / ${pf.toFixed(3)}` };
  }
  if (rule.formula === 'linear') {
    return { value: 1 + (rule.targetPf - pf), text: (d) => `${num(d)} kW × (1 + (${rule.targetPf} − ${pf.toFixed(3)}))` };
  }
  const rawPoints = (rule.targetPf - pf) * 100;
  const points = roundSteps(rawPoints, rule.pointRounding);
  return {
    value: 1 + (rule.percentPerPoint * points) / 100,
    text: (d) => `${num(d)} kW × (1 + ${rule.percentPerPoint} × ${points} points / 100) (${rawPoints.toFixed(2)} points below target, rounded ${rule.pointRounding})`,
  };
}
