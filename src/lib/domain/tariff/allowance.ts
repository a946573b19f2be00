import { tanPhi } from '../power/quantities';
import type { Allowance } from './common-schemas';

/** kvar per kW allowed free: tan(acos(pf)) or the stated ratio. */
export function allowanceK(a: Allowance): number {
  return a.basis === 'pf' ? tanPhi(a.pf) : a.kvarPerKw;
}

/** Text for explanations: `0.4843 (PF 0.90)` or `0.3333`. */
export function allowanceText(a: Allowance): string {
  return a.basis === 'pf' ? `${allowanceK(a).toFixed(4)} (tan of PF ${a.pf})` : `${Number(a.kvarPerKw.toFixed(4))}`;
}
