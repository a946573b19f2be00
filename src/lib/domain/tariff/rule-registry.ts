import { z } from 'zod';
import type { RuleInput, RuleOutcome } from './rule-contract';
import { evaluateExcessKvarDemand, excessKvarDemandRuleSchema, EXCESS_KVAR_DEMAND } from './rules/excess-kvar-demand';
import { evaluateExcessKvarh, excessKvarhRuleSchema, EXCESS_KVARH } from './rules/excess-kvarh';
import { evaluateKvaBillingDemand, kvaBillingDemandRuleSchema, KVA_BILLING_DEMAND } from './rules/kva-billing-demand';
import { evaluateLeadingKvarh, leadingKvarhRuleSchema, LEADING_KVARH } from './rules/leading-kvarh';
import { evaluatePfBillingDemand, pfBillingDemandRuleSchema, PF_BILLING_DEMAND } from './rules/pf-billing-demand';
import { evaluatePfPercentAdjustment, pfPercentAdjustmentRuleSchema, PF_PERCENT_ADJUSTMENT } from './rules/pf-percent-adjustment';

/** Every tariff PF rule type, discriminated by `type`. JSON-storable. */
export const tariffRuleSchema = z
  .discriminatedUnion('type', [
    pfBillingDemandRuleSchema,
    kvaBillingDemandRuleSchema,
    excessKvarDemandRuleSchema,
    excessKvarhRuleSchema,
    pfPercentAdjustmentRuleSchema,
    leadingKvarhRuleSchema,
  ])
  .describe('One power-factor clause of a tariff.');

export type TariffRule = z.infer<typeof tariffRuleSchema>;
export type TariffRuleInput = z.input<typeof tariffRuleSchema>;
export type TariffRuleType = TariffRule['type'];

/** Human labels and one-line summaries of the rule types, for pickers and reports. */
export const RULE_TYPES: readonly { type: TariffRuleType; label: string; summary: string }[] = [
  { type: PF_BILLING_DEMAND, label: 'PF-adjusted billing demand', summary: 'Billing demand raised when PF is below a target (ratio, linear or per point), optional cap and ratchet.' },
  { type: KVA_BILLING_DEMAND, label: 'kVA billing demand', summary: 'Demand billed in kVA, as kW over average PF, or as the greater of kW and a share of kVA.' },
  { type: EXCESS_KVAR_DEMAND, label: 'Excess reactive demand', summary: 'Charge per kvar above k × kW, coincident or period maximum, optional ratchet.' },
  { type: EXCESS_KVARH, label: 'Excess reactive energy', summary: 'Charge per kvarh above k × kWh, flat or priced by PF band, per period or window.' },
  { type: PF_PERCENT_ADJUSTMENT, label: 'PF percentage adjustment', summary: 'Percent of a base per PF step below a threshold, in tiers, with an optional credit.' },
  { type: LEADING_KVARH, label: 'Leading reactive energy', summary: 'Charge per leading kvarh, optionally only at zero kW or in a window.' },
];

/** Label of a rule type. */
export function ruleTypeLabel(type: TariffRuleType): string {
  return RULE_TYPES.find((t) => t.type === type)?.label ?? type;
}

/** Dispatches one rule's evaluation for one period. */
export function evaluateRule(rule: TariffRule, input: RuleInput): RuleOutcome {
  switch (rule.type) {
    case PF_BILLING_DEMAND:
      return evaluatePfBillingDemand(rule, input);
    case KVA_BILLING_DEMAND:
      return evaluateKvaBillingDemand(rule, input);
    case EXCESS_KVAR_DEMAND:
      return evaluateExcessKvarDemand(rule, input);
    case EXCESS_KVARH:
      return evaluateExcessKvarh(rule, input);
    case PF_PERCENT_ADJUSTMENT:
      return evaluatePfPercentAdjustment(rule, input);
    case LEADING_KVARH:
      return evaluateLeadingKvarh(rule, input);
  }
}
