import type { RuleMemory } from './rule-contract';
import type { TariffRule } from './rule-registry';

/** A bill from before the interval data, for ratchets. Quantities as printed on the bill. */
export interface PriorPeriod {
  label: string;
  /** Measured peak demand, kW. */
  peakKw?: number;
  /** Billing demand after any PF adjustment, kW. */
  billingDemandKw?: number;
  /** Billed kVA demand (or kW under a greater-of clause). */
  billedKva?: number;
  /** Billable excess kvar. */
  billableKvar?: number;
}

/**
 * Turns entered bills into a rule's ratchet memory. A bill without the quantity a rule
 * needs is skipped, so the ratchet works over the months that are known. For kVA
 * demand the PF share of an old bill is unknown, so its billed and reference demand
 * are taken as equal: the ratchet then adds no PF cost from history.
 */
export function historyMemory(rule: TariffRule, history: readonly { peakKw?: number; billingDemandKw?: number; billedKva?: number; billableKvar?: number }[]): RuleMemory[] {
  const out: RuleMemory[] = [];
  for (const h of history) {
    if (rule.type === 'pf-billing-demand' && h.peakKw !== undefined) {
      out.push({ demandKw: h.peakKw, adjustedKw: h.billingDemandKw ?? h.peakKw });
    } else if (rule.type === 'kva-billing-demand' && h.billedKva !== undefined) {
      out.push({ billed: h.billedKva, reference: h.billedKva });
    } else if (rule.type === 'excess-kvar-demand' && h.billableKvar !== undefined) {
      out.push({ billableKvar: h.billableKvar });
    }
  }
  return out;
}
