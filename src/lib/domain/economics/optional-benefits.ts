import { lossReduction, releasedCapacityKva } from '../correction/formulas';
import type { OptionalBenefit } from './economics';

/**
 * Optional line: I^2R losses fall by 1 - (PF1/PF2)^2 at constant kW; valued from
 * the yearly cost of the losses the correction affects (the user's estimate).
 */
export function lossSavingBenefit(pfFrom: number, pfTo: number, annualLossCost: number): OptionalBenefit {
  const share = lossReduction(pfFrom, pfTo);
  return { label: `Line-loss reduction ${(share * 100).toFixed(2)} % (optional)`, perYear: share * annualLossCost };
}

/** Optional line: kVA released (kW/PF1 - kW/PF2) valued at a price per kVA-year. */
export function releasedCapacityBenefit(kw: number, pfFrom: number, pfTo: number, valuePerKvaYear: number): OptionalBenefit {
  const kva = releasedCapacityKva(kw, pfFrom, pfTo);
  return { label: `Released capacity ${kva.toFixed(1)} kVA (optional)`, perYear: kva * valuePerKvaYear };
}
