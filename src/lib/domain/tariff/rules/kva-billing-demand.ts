import { z } from 'zod';
import { averagePf } from '../../power/quantities';
import { kvarhBasisSchema, pfTarget, ratchetSchema, ruleBaseShape, priceSchema } from '../common-schemas';
import { money, num, rate } from '../format';
import { kvarhOnBasis } from '../pf-basis';
import { ratchetFloor, type RuleInput, type RuleOutcome } from '../rule-contract';
import type { WindowAggregate } from '../../power/window-aggregate';

export const KVA_BILLING_DEMAND = 'kva-billing-demand';

/** Clause shape 2: demand billed in kVA, or kW raised to a share of kVA. */
export const kvaBillingDemandRuleSchema = z
  .strictObject({
    type: z.literal(KVA_BILLING_DEMAND),
    ...ruleBaseShape,
    mode: z
      .enum(['peak-kva', 'kw-over-average-pf', 'greater-of-kw-or-kva-share'])
      .describe('peak-kva: highest kVA demand reading; kw-over-average-pf: peak kW / average PF; greater-of-kw-or-kva-share: max(peak kW, share x peak kVA).'),
    kvaShare: z.number().gt(0).max(1).optional().describe('Share of peak kVA in the greater-of mode, e.g. 0.90.'),
    kvarhBasis: kvarhBasisSchema.default('lagging').describe('kvarh basis of the average PF in kw-over-average-pf mode.'),
    reference: z
      .enum(['unity', 'target-pf'])
      .default('unity')
      .describe('The PF-related cost is the bill at actual kVA minus the bill at unity PF or at the target PF.'),
    targetPf: pfTarget.optional().describe('Target PF when the reference is target-pf.'),
    demandRate: priceSchema().describe('Charge per billed unit (kVA, or kW in the greater-of mode) for the period.'),
    ratchet: ratchetSchema.optional(),
  })
  .describe('kVA billing demand');

export type KvaBillingDemandRule = z.infer<typeof kvaBillingDemandRuleSchema>;

/**
 * Billed demand in kVA terms against the same demand at the reference PF; the
 * difference priced at the demand rate is the PF cost. Ratchets apply to both.
 */
export function evaluateKvaBillingDemand(rule: KvaBillingDemandRule, input: RuleInput): RuleOutcome {
  const { agg, currency } = input;
  const refPf = rule.reference === 'target-pf' ? (rule.targetPf ?? 1) : 1;
  const refText = rule.reference === 'target-pf' ? `at the ${refPf} target PF` : 'at unity PF';
  if (agg.peakKw <= 0) {
    return { amount: 0, status: 'not-applicable', quantities: { peakKw: 0 }, explain: () => 'No import demand in this period.', memory: { billed: 0, reference: 0 } };
  }
  const measured = billedAndReference(rule, agg, refPf, refText);
  let { billed, reference } = measured;
  let formula = measured.text;
  const unit = measured.unit;
  const quantities: Record<string, number | null> = { peakKw: agg.peakKw, peakKva: agg.peakKva, billedDemand: billed, referenceDemand: reference };
  const measuredMemory = { billed, reference };
  if (rule.ratchet) {
    const r = rule.ratchet;
    const fb = ratchetFloor(input.memory, 'billed', r.lookbackPeriods);
    const fr = ratchetFloor(input.memory, 'reference', r.lookbackPeriods);
    billed = Math.max(billed, r.fraction * fb.max);
    reference = Math.max(reference, r.fraction * fr.max);
    const before = formula;
    const [b, ref] = [billed, reference];
    formula = () => `${before()}; ratchet ${num(r.fraction * 100, 0)} % over ${fb.used} of ${r.lookbackPeriods} earlier periods gives ${num(b)} ${unit} billed against ${num(ref)} ${unit}`;
    quantities.ratchetPeriodsUsed = fb.used;
    quantities.billedAfterRatchet = billed;
    quantities.referenceAfterRatchet = reference;
  }
  const extra = Math.max(0, billed - reference);
  const amount = extra * rule.demandRate;
  quantities.pfRelatedDemand = extra;
  return {
    amount,
    status: amount > 0 ? 'charge' : 'none',
    quantities,
    explain: () => `${formula()}; PF-related demand ${num(extra)} ${unit} × ${rate(rule.demandRate, currency, unit)} = ${money(amount, currency)}.`,
    memory: rule.ratchet?.basis === 'billed' ? { billed, reference } : measuredMemory,
  };
}

function billedAndReference(rule: KvaBillingDemandRule, agg: WindowAggregate, refPf: number, refText: string): { billed: number; reference: number; unit: string; text: () => string } {
  if (rule.mode === 'peak-kva') {
    const billed = agg.peakKva;
    const reference = Math.min(billed, agg.peakKw / refPf);
    return { billed, reference, unit: 'kVA', text: () => `peak demand ${num(billed)} kVA; ${refText} it would be ${num(reference)} kVA (${num(agg.peakKw)} kW / ${refPf})` };
  }
  if (rule.mode === 'kw-over-average-pf') {
    const pf = averagePf(agg.kwh, kvarhOnBasis(agg, rule.kvarhBasis)) ?? 1;
    const billed = agg.peakKw / pf;
    const reference = agg.peakKw / Math.max(pf, refPf);
    return { billed, reference, unit: 'kVA', text: () => `billed ${num(agg.peakKw)} kW / average PF ${pf.toFixed(3)} = ${num(billed)} kVA; ${refText} ${num(reference)} kVA` };
  }
  const share = rule.kvaShare ?? 0.9;
  const billed = Math.max(agg.peakKw, share * agg.peakKva);
  const reference = Math.max(agg.peakKw, share * Math.min(agg.peakKva, agg.peakKw / refPf));
  return { billed, reference, unit: 'kW', text: () => `billed max(${num(agg.peakKw)} kW, ${share} × ${num(agg.peakKva)} kVA) = ${num(billed)} kW; ${refText} ${num(reference)} kW` };
}
