import { z } from 'zod';
import { kvarhBasisSchema, pfBasisSchema, pfRoundingSchema, pfTarget, roundingModeSchema, ruleBaseShape, priceSchema } from '../common-schemas';
import { money, num, pct, rate } from '../format';
import { isBelow, PF_EPSILON, roundSteps, rulePf } from '../pf-basis';
import type { RuleInput, RuleOutcome } from '../rule-contract';

export const PF_PERCENT_ADJUSTMENT = 'pf-percent-adjustment';

const stepRounding = z.union([roundingModeSchema, z.literal('exact')]);

const tierSchema = z
  .strictObject({
    downToPf: z.number().min(0).max(1).optional().describe('Lower end of the tier; absent means no lower end.'),
    pctPerStep: z.number().min(0).max(100).describe('Percent of the base added per step within this tier.'),
  })
  .describe('Surcharge tier, running down from the previous tier\'s end (the first starts at the threshold).');

const baseSchema = z
  .discriminatedUnion('source', [
    z.strictObject({ source: z.literal('energy-rate'), ratePerKwh: priceSchema().describe('Energy price per kWh; base = kWh x price.') }),
    z.strictObject({ source: z.literal('demand-rate'), ratePerKw: priceSchema().describe('Demand price per kW; base = peak kW x price.') }),
    z.strictObject({
      source: z.literal('entered-amount'),
      field: z.enum(['energyCharge', 'demandCharge', 'totalBill']).describe('Which amount from the bill is the base.'),
    }),
  ])
  .describe('The amount the percentage applies to.');

/** Clause shape 5: percent surcharge per PF step below a threshold, tiers, optional credit. */
export const pfPercentAdjustmentRuleSchema = z
  .strictObject({
    type: z.literal(PF_PERCENT_ADJUSTMENT),
    ...ruleBaseShape,
    base: baseSchema,
    pfBasis: pfBasisSchema.default('average'),
    kvarhBasis: kvarhBasisSchema.default('lagging'),
    pfRounding: pfRoundingSchema.optional(),
    thresholdPf: pfTarget.describe('PF below which the surcharge starts, e.g. 0.95.'),
    stepPf: z.number().min(0.001).max(0.1).default(0.01).describe('Size of one step of PF, usually 0.01.'),
    stepRounding: stepRounding.default('up').describe('Rounding of the number of steps below the threshold (exact counts part steps).'),
    tiers: z.array(tierSchema).min(1).describe('Surcharge tiers in order from the threshold down.'),
    credit: z
      .strictObject({
        abovePf: pfTarget.describe('PF above which a credit is earned.'),
        pctPerStep: z.number().min(0).max(100).describe('Percent of the base credited per step above.'),
        maxPct: z.number().min(0).max(100).describe('Cap on the credit, percent of the base.'),
        stepRounding: stepRounding.default('down'),
      })
      .optional()
      .describe('Optional credit for PF above a level.'),
  })
  .describe('PF percentage adjustment');

export type PfPercentAdjustmentRule = z.infer<typeof pfPercentAdjustmentRuleSchema>;

/**
 * Steps below the threshold are rounded once, then filled tier by tier from the top
 * (e.g. 0.5 % a step from 0.95 to 0.90, 1 % a step below). Credit above a level, capped.
 */
export function evaluatePfPercentAdjustment(rule: PfPercentAdjustmentRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const base = baseAmount(rule, input);
  if (base.amount === null) {
    return { amount: 0, status: 'needs-input', quantities: { base: null }, explain: () => `Enter the ${base.text()} for this period to compute the PF adjustment.` };
  }
  const baseValue = base.amount;
  const measured = rulePf(agg, rule.pfBasis, rule.kvarhBasis, rule.pfRounding);
  if (measured.pf === null) {
    return { amount: 0, status: 'not-applicable', quantities: { base: base.amount, pf: null }, explain: () => 'No import in this period, so there is no PF adjustment.' };
  }
  const pf = measured.pf;
  const quantities: Record<string, number | null> = { base: base.amount, pf, rawPf: measured.rawPf };
  if (isBelow(pf, rule.thresholdPf)) {
    const rawSteps = (rule.thresholdPf - pf) / rule.stepPf;
    const steps = roundSteps(rawSteps, rule.stepRounding);
    const { percent, breakdown } = surchargePercent(rule, steps);
    const amount = (percent / 100) * base.amount;
    Object.assign(quantities, { steps, rawSteps, surchargePct: percent });
    return {
      amount,
      status: amount > 0 ? 'charge' : 'none',
      quantities,
      explain: () => `${measured.text()} is below the ${rule.thresholdPf} threshold by ${rawSteps.toFixed(2)} steps of ${rule.stepPf}, counted as ${steps}: surcharge ${breakdown()} = ${pct(percent)} of ${base.text()} ${money(baseValue, currency)} = ${money(amount, currency)}.`,
    };
  }
  const c = rule.credit;
  if (c && pf > c.abovePf + PF_EPSILON) {
    const rawSteps = (pf - c.abovePf) / rule.stepPf;
    const steps = roundSteps(rawSteps, c.stepRounding);
    const percent = Math.min(c.maxPct, steps * c.pctPerStep);
    const amount = -(percent / 100) * base.amount;
    Object.assign(quantities, { steps, rawSteps, creditPct: percent });
    return {
      amount,
      status: amount < 0 ? 'credit' : 'none',
      quantities,
      explain: () => `${measured.text()} is above ${c.abovePf} by ${rawSteps.toFixed(2)} steps, counted as ${steps}: credit ${steps} × ${pct(c.pctPerStep)}${percent < steps * c.pctPerStep ? ` capped at ${pct(c.maxPct)}` : ''} = ${pct(percent)} of ${base.text()} ${money(baseValue, currency)} = ${money(amount, currency)}.`,
    };
  }
  return { amount: 0, status: 'none', quantities, explain: () => `${measured.text()} is not below the ${rule.thresholdPf} threshold: no adjustment.` };
}

function surchargePercent(rule: PfPercentAdjustmentRule, steps: number): { percent: number; breakdown: () => string } {
  let remaining = steps;
  let top = rule.thresholdPf;
  let percent = 0;
  const parts: [number, number][] = [];
  for (const tier of rule.tiers) {
    if (remaining <= 0) break;
    const capacity = tier.downToPf === undefined ? Number.POSITIVE_INFINITY : roundSteps((top - tier.downToPf) / rule.stepPf, 'nearest');
    const take = Math.min(remaining, capacity);
    percent += take * tier.pctPerStep;
    parts.push([take, tier.pctPerStep]);
    remaining -= take;
    if (tier.downToPf !== undefined) top = tier.downToPf;
  }
  return { percent, breakdown: () => parts.map(([take, p]) => `${Number(take.toFixed(4))} × ${pct(p)}`).join(' + ') || '0' };
}

function baseAmount(rule: PfPercentAdjustmentRule, input: RuleInput): { amount: number | null; text: () => string } {
  const b = rule.base;
  if (b.source === 'energy-rate') return { amount: input.agg.kwh * b.ratePerKwh, text: () => `energy charge (${num(input.agg.kwh, 0)} kWh × ${rate(b.ratePerKwh, input.currency, 'kWh')})` };
  if (b.source === 'demand-rate') return { amount: input.agg.peakKw * b.ratePerKw, text: () => `demand charge (${num(input.agg.peakKw)} kW × ${rate(b.ratePerKw, input.currency, 'kW')})` };
  const label = { energyCharge: 'energy charge', demandCharge: 'demand charge', totalBill: 'bill total' }[b.field];
  const v = input.amounts?.[b.field];
  return { amount: v === undefined ? null : v, text: () => label };
}
