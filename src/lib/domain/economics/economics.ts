import { irr, levelFlows, npv, simplePayback } from './cash-flow-math';

/** An optional benefit line, kept apart from the tariff savings and labelled as such. */
export interface OptionalBenefit {
  /** e.g. "Line-loss reduction (optional)" or "Released capacity (optional)". */
  label: string;
  perYear: number;
}

export interface EconomicsInput {
  capex: number;
  /** PF charges avoided per year under the site's tariff. */
  annualSaving: number;
  omPerYear: number;
  lifeYears: number;
  /** Discount rate as a fraction, e.g. 0.08. */
  discountRate: number;
  optionalBenefits?: readonly OptionalBenefit[];
  /** Count the optional benefits in the headline figures (default false: shown, not counted). */
  includeOptional?: boolean;
}

export interface EconomicsFigures {
  annualSaving: number;
  netAnnual: number;
  /** Years; Infinity when savings do not cover O&M. */
  paybackYears: number;
  npv: number;
  /** Fraction, null when no rate makes NPV zero. */
  irr: number | null;
}

export interface EconomicsResult extends EconomicsFigures {
  capex: number;
  omPerYear: number;
  optionalPerYear: number;
  optionalCounted: boolean;
  cashFlows: number[];
  /** The same figures with the tariff savings at 80 %, 100 % and 120 %. */
  sensitivity: ({ savingsFactor: number } & EconomicsFigures)[];
}

/**
 * Payback, NPV and IRR of a correction plan over its life, with a ±20 % sensitivity
 * on the tariff savings. Optional benefits are reported apart and only counted when
 * `includeOptional` is set.
 */
export function economics(input: EconomicsInput): EconomicsResult {
  if (!(Number.isInteger(input.lifeYears) && input.lifeYears >= 1)) throw new RangeError('Life must be a whole number of years, at least 1.');
  const optionalPerYear = (input.optionalBenefits ?? []).reduce((s, b) => s + b.perYear, 0);
  const extra = input.includeOptional ? optionalPerYear : 0;
  const figures = (factor: number): EconomicsFigures => {
    const annualSaving = input.annualSaving * factor;
    const netAnnual = annualSaving + extra - input.omPerYear;
    const flows = levelFlows(input.capex, netAnnual, input.lifeYears);
    return { annualSaving, netAnnual, paybackYears: simplePayback(input.capex, netAnnual), npv: npv(input.discountRate, flows), irr: irr(flows) };
  };
  const base = figures(1);
  return {
    ...base,
    capex: input.capex,
    omPerYear: input.omPerYear,
    optionalPerYear,
    optionalCounted: Boolean(input.includeOptional),
    cashFlows: levelFlows(input.capex, base.netAnnual, input.lifeYears),
    sensitivity: [0.8, 1, 1.2].map((f) => ({ savingsFactor: f, ...figures(f) })),
  };
}
