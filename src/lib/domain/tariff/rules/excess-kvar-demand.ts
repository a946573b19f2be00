import { z } from 'zod';
import { apparentKva, powerFactor } from '../../power/quantities';
import { allowanceSchema, ratchetSchema, ruleBaseShape, priceSchema } from '../common-schemas';
import { money, num, pfText, rate } from '../format';
import { allowanceK, allowanceText } from '../allowance';
import { ratchetFloor, type RuleInput, type RuleOutcome } from '../rule-contract';

export const EXCESS_KVAR_DEMAND = 'excess-kvar-demand';

/** Clause shape 3: charge per kvar of demand above k x kW. */
export const excessKvarDemandRuleSchema = z
  .strictObject({
    type: z.literal(EXCESS_KVAR_DEMAND),
    ...ruleBaseShape,
    allowance: allowanceSchema,
    kvarSource: z
      .enum(['coincident', 'period-max'])
      .default('coincident')
      .describe('coincident: kvar of the same demand reading as the kW peak; period-max: the period\'s highest kvar, whenever it occurred.'),
    ratePerKvar: priceSchema().describe('Charge per billable kvar for the period.'),
    ratchet: ratchetSchema.optional().describe('Billable kvar is at least this share of the highest billable kvar of earlier periods.'),
  })
  .describe('Excess reactive demand');

export type ExcessKvarDemandRule = z.infer<typeof excessKvarDemandRuleSchema>;

/** Billable kvar = max(0, Q - k x P) (with optional ratchet) x rate. */
export function evaluateExcessKvarDemand(rule: ExcessKvarDemandRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const k = allowanceK(rule.allowance);
  const p = agg.peakKw;
  const q = rule.kvarSource === 'coincident' ? agg.peakKvar : agg.maxKvar;
  if (p <= 0) {
    return { amount: 0, status: 'not-applicable', quantities: { peakKw: 0 }, explain: () => 'No import demand in this period.', memory: { billableKvar: 0 } };
  }
  const allowed = k * p;
  const measured = Math.max(0, q - allowed);
  let billable = measured;
  let head: () => string;
  if (rule.kvarSource === 'coincident') {
    const pf = powerFactor(p, q) ?? 1;
    head = () => `Peak ${num(p)} kW with ${num(q)} kvar in the same reading (${num(apparentKva(p, q))} kVA, PF ${pfText(pf, q > 0 ? 'lag' : q < 0 ? 'lead' : 'unity')})`;
  } else {
    head = () => `Peak ${num(p)} kW and highest ${num(q)} kvar of the period (not necessarily coincident)`;
  }
  const parts: (() => string)[] = [head, () => `allowance ${num(p)} kW × ${allowanceText(rule.allowance)} = ${num(allowed)} kvar`, () => `excess ${num(measured)} kvar`];
  const quantities: Record<string, number | null> = { peakKw: p, kvar: q, kFactor: k, allowedKvar: allowed, excessKvar: measured };
  if (rule.ratchet) {
    const f = ratchetFloor(input.memory, 'billableKvar', rule.ratchet.lookbackPeriods);
    const r = rule.ratchet;
    billable = Math.max(measured, r.fraction * f.max);
    parts.push(() => `ratchet ${num(r.fraction * 100, 0)} % of the highest earlier billable kvar (${f.used} of ${r.lookbackPeriods} periods available) = ${num(r.fraction * f.max)} kvar`);
    quantities.ratchetPeriodsUsed = f.used;
  }
  const amount = billable * rule.ratePerKvar;
  const billed = billable;
  quantities.billableKvar = billable;
  parts.push(() => `billable ${num(billed)} kvar × ${rate(rule.ratePerKvar, currency, 'kvar')} = ${money(amount, currency)}`);
  return { amount, status: amount > 0 ? 'charge' : 'none', quantities, explain: () => `${parts.map((f) => f()).join('; ')}.`, memory: { billableKvar: rule.ratchet?.basis === 'billed' ? billable : measured } };
}
