import { z } from 'zod';
import { touWindowSchema } from './tou-window';

/** Which kvarh registers make up a period's reactive energy. */
export const kvarhBasisSchema = z
  .enum(['lagging', 'net', 'absolute'])
  .describe('kvarh basis: lagging only (leading ignored), net (lagging minus leading, not below zero), or absolute (lagging plus leading).');
export type KvarhBasis = z.infer<typeof kvarhBasisSchema>;

/** Which PF a rule compares: the period average or the PF at the kW peak. */
export const pfBasisSchema = z
  .enum(['average', 'at-peak'])
  .describe('PF used: period average from energy totals, or the PF of the peak-kW demand reading.');
export type PfBasis = z.infer<typeof pfBasisSchema>;

export const roundingModeSchema = z.enum(['nearest', 'down', 'up']).describe('Rounding direction.');
export type RoundingMode = z.infer<typeof roundingModeSchema>;

/** How the measured PF is rounded before it is compared (tariffs print 2 or 3 decimals). */
export const pfRoundingSchema = z
  .strictObject({
    decimals: z.number().int().min(1).max(6).describe('Decimals the PF is rounded to before comparison.'),
    mode: roundingModeSchema,
  })
  .describe('Rounding of the measured PF before it is compared with the target.');
export type PfRounding = z.infer<typeof pfRoundingSchema>;

// Bounds carry zod's own messages: the tariff editor turns those into its short field texts.
// At least 0.01, not just above 0: k = tan(acos(pf)) runs to infinity as the PF nears 0, and
// 0 x infinity put NaN into charges. No tariff judges a PF below 0.5.
export const PF_MIN = 0.01;
const pfValue = z.number().min(PF_MIN).max(1);

/** Largest price per unit the schemas accept: far above any tariff, so only a unit slip is refused. */
export const RATE_MAX = 1_000_000;

/** A price per unit (kW, kVA, kvar, kWh or kvarh) in the tariff currency. */
export const priceSchema = () => z.number().min(0).max(RATE_MAX);

/** Reactive allowance, as a PF (k = tan(acos(pf))) or as kvar per kW directly. */
export const allowanceSchema = z
  .discriminatedUnion('basis', [
    z.strictObject({ basis: z.literal('pf'), pf: pfValue.describe('PF at which reactive use is free; k = tan(acos(pf)).') }),
    z.strictObject({ basis: z.literal('ratio'), kvarPerKw: z.number().min(0).max(10).describe('Free kvar per kW (or kvarh per kWh), e.g. 0.3333.') }),
  ])
  .describe('Reactive allowance before a charge applies.');
export type Allowance = z.infer<typeof allowanceSchema>;

/** Demand ratchet: billed = max(this period, fraction x highest of the previous N). */
export const ratchetSchema = z
  .strictObject({
    fraction: z.number().gt(0).max(1).describe('Share of the highest earlier billed demand that sets a floor, e.g. 0.8.'),
    lookbackPeriods: z.number().int().min(1).max(36).default(11).describe('How many earlier periods the ratchet looks back over.'),
    basis: z
      .enum(['measured', 'billed'])
      .default('measured')
      .describe('What earlier periods contribute: their measured (PF-adjusted) demand, or the demand finally billed, ratchet included.'),
  })
  .describe('Demand ratchet.');
export type Ratchet = z.infer<typeof ratchetSchema>;

/** Fields every rule carries. */
export const ruleBaseShape = {
  id: z.string().min(1).max(60).describe('Identifier of this rule within its tariff, stable across versions.'),
  name: z.string().max(120).optional().describe('Name shown on reports, e.g. the clause title on the tariff sheet.'),
  window: touWindowSchema.optional().describe('Limit the rule to a time-of-use window; absent means all hours.'),
};

export const pfTarget = pfValue;
