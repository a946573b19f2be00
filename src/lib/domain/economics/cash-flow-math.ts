/**
 * Discounting primitives. Cash flows are yearly, `flows[0]` at time 0 (the capex,
 * negative), `flows[t]` at the end of year t, the convention of numpy-financial.
 */

/** Net present value of yearly flows at `rate`. */
export function npv(rate: number, flows: readonly number[]): number {
  let total = 0;
  let factor = 1;
  for (let t = 0; t < flows.length; t++) {
    total += flows[t] / factor;
    factor *= 1 + rate;
  }
  return total;
}

/**
 * Internal rate of return by bracketing and bisection, so it cannot diverge the way
 * Newton's method can. Meant for conventional flows (one sign change); returns null
 * when NPV does not change sign between -99.99 % and 1,000,000 %.
 */
export function irr(flows: readonly number[]): number | null {
  let lo = -0.9999;
  let hi = 1;
  const fLo = npv(lo, flows);
  let fHi = npv(hi, flows);
  while (Math.sign(fHi) === Math.sign(fLo) && hi < 1e4) {
    hi *= 4;
    fHi = npv(hi, flows);
  }
  if (fLo === 0) return lo;
  if (Math.sign(fHi) === Math.sign(fLo)) return null;
  for (let i = 0; i < 200 && hi - lo > 1e-13; i++) {
    const mid = (lo + hi) / 2;
    const f = npv(mid, flows);
    if (f === 0) return mid;
    if (Math.sign(f) === Math.sign(fLo)) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Simple payback in years: capex / net annual benefit; Infinity when the benefit is not positive. */
export function simplePayback(capex: number, netAnnual: number): number {
  if (!(netAnnual > 0)) return Number.POSITIVE_INFINITY;
  return capex / netAnnual;
}

/** Yearly flows: -capex now, then `netAnnual` for each year of the life. */
export function levelFlows(capex: number, netAnnual: number, lifeYears: number): number[] {
  return [-capex, ...Array.from({ length: lifeYears }, () => netAnnual)];
}
