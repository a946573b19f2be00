import { z } from 'zod';
import { averagePf } from '../../power/quantities';
import { allowanceK, allowanceText } from '../allowance';
import { allowanceSchema, kvarhBasisSchema, PF_MIN, ruleBaseShape, priceSchema } from '../common-schemas';
import { money, num, rate } from '../format';
import { isBelow, kvarhOnBasis } from '../pf-basis';
import type { RuleInput, RuleOutcome } from '../rule-contract';

export const EXCESS_KVARH = 'excess-kvarh';

const bandSchema = z
  .strictObject({
    pfBelow: z.number().min(PF_MIN).max(1).describe('The band applies when the average PF is below this value.'),
    ratePerKvarh: priceSchema().describe('Price per billable kvarh in this band.'),
  })
  .describe('PF band price.');

/** Clause shape 4: charge per kvarh above k x kWh, flat or priced by PF band. */
export const excessKvarhRuleSchema = z
  .strictObject({
    type: z.literal(EXCESS_KVARH),
    ...ruleBaseShape,
    allowance: allowanceSchema,
    kvarhBasis: kvarhBasisSchema.default('lagging'),
    pricing: z
      .discriminatedUnion('kind', [
        z.strictObject({ kind: z.literal('flat'), ratePerKvarh: priceSchema().describe('Price per billable kvarh.') }),
        z.strictObject({
          kind: z.literal('pf-bands'),
          bands: z.array(bandSchema).min(1).describe('Bands by average PF; the lowest band whose limit the PF is below sets the price.'),
        }),
      ])
      .describe('How billable kvarh is priced.'),
  })
  .describe('Excess reactive energy');

export type ExcessKvarhRule = z.infer<typeof excessKvarhRuleSchema>;

/** Billable kvarh = max(0, kvarh - k x kWh), priced flat or by the PF band. */
export function evaluateExcessKvarh(rule: ExcessKvarhRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const k = allowanceK(rule.allowance);
  const kvarh = kvarhOnBasis(agg, rule.kvarhBasis);
  const allowed = k * agg.kwh;
  const billable = Math.max(0, kvarh - allowed);
  const pf = averagePf(agg.kwh, kvarh);
  const quantities: Record<string, number | null> = { kwh: agg.kwh, kvarh, kFactor: k, allowedKvarh: allowed, billableKvarh: billable, pf };
  let unitRate = 0;
  let priceText: () => string;
  if (rule.pricing.kind === 'flat') {
    unitRate = rule.pricing.ratePerKvarh;
    priceText = () => rate(unitRate, currency, 'kvarh');
  } else {
    const band = pf === null ? undefined : [...rule.pricing.bands].sort((a, b) => a.pfBelow - b.pfBelow).find((b) => isBelow(pf, b.pfBelow));
    unitRate = band?.ratePerKvarh ?? 0;
    priceText = () => (band ? `${rate(unitRate, currency, 'kvarh')} (band PF below ${band.pfBelow})` : 'no band applies');
    quantities.bandPfBelow = band?.pfBelow ?? null;
  }
  const amount = billable * unitRate;
  quantities.ratePerKvarh = unitRate;
  const pfPart = () => (pf === null ? 'no import' : `average PF ${pf.toFixed(3)}`);
  return {
    amount,
    status: amount > 0 ? 'charge' : 'none',
    quantities,
    explain: () => `${num(kvarh, 0)} kvarh (${rule.kvarhBasis}) against ${num(agg.kwh, 0)} kWh, ${pfPart()}: allowance ${num(agg.kwh, 0)} kWh × ${allowanceText(rule.allowance)} = ${num(allowed, 0)} kvarh; billable ${num(billable, 0)} kvarh × ${priceText()} = ${money(amount, currency)}.`,
  };
}
