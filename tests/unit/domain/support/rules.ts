import { evaluateRule, tariffRuleSchema, type EnteredAmounts, type WindowAggregate } from '../../../../src/lib/domain';
import type { RuleMemory } from '../../../../src/lib/domain/tariff/rule-contract';
import { TEST_PERIOD } from './periods';

/** Parses a rule as stored JSON would be, evaluates one period and formats the explanation. */
export function runRule(rule: object, agg: WindowAggregate, memory: RuleMemory[] = [], amounts?: EnteredAmounts) {
  const parsed = tariffRuleSchema.parse(rule);
  const outcome = evaluateRule(parsed, { agg, period: TEST_PERIOD, currency: 'USD', memory, amounts });
  return { ...outcome, explanation: outcome.explain() };
}
