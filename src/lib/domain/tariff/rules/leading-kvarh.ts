import { z } from 'zod';
import { ruleBaseShape, priceSchema } from '../common-schemas';
import { money, num, rate } from '../format';
import type { RuleInput, RuleOutcome } from '../rule-contract';

export const LEADING_KVARH = 'leading-kvarh';

/**
 * Clause shape 6, the "charged" form: a price per leading kvarh, optionally only
 * while kW is zero and/or in a window (nights and weekends). The "ignored" and
 * "counted like lagging" forms are the `kvarhBasis` choice of the PF-based rules.
 */
export const leadingKvarhRuleSchema = z
  .strictObject({
    type: z.literal(LEADING_KVARH),
    ...ruleBaseShape,
    ratePerKvarh: priceSchema().describe('Price per leading kvarh.'),
    condition: z
      .enum(['any-load', 'zero-kw-only'])
      .default('any-load')
      .describe('Charge all leading kvarh, or only leading kvarh recorded while kW is zero.'),
  })
  .describe('Leading reactive energy');

export type LeadingKvarhRule = z.infer<typeof leadingKvarhRuleSchema>;

/** Leading kvarh (all, or at zero kW) x rate. */
export function evaluateLeadingKvarh(rule: LeadingKvarhRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const kvarh = rule.condition === 'zero-kw-only' ? agg.kvarhLeadZeroKw : agg.kvarhLead;
  const amount = kvarh * rule.ratePerKvarh;
  const scope = () => rule.condition === 'zero-kw-only' ? `leading kvarh while kW was zero (${agg.zeroKwIntervals} intervals)` : 'leading kvarh';
  return {
    amount,
    status: amount > 0 ? 'charge' : 'none',
    quantities: { leadingKvarh: kvarh, ratePerKvarh: rule.ratePerKvarh, leadingIntervals: agg.leadingIntervals },
    explain: () => `${num(kvarh)} ${scope()} × ${rate(rule.ratePerKvarh, currency, 'kvarh')} = ${money(amount, currency)}.`,
  };
}
