/**
 * Power-triangle relations. Sign convention (IEC quadrants): P > 0 import, Q > 0
 * lagging (inductive), Q < 0 leading (capacitive). PF is always a magnitude 0..1 and
 * its lagging/leading sense is carried separately, never as a signed number.
 */

/** Sense of a power factor: lagging (Q > 0), leading (Q < 0) or unity. */
export type PfSense = 'lag' | 'lead' | 'unity';

/** Apparent power (kVA) from kW and kvar. */
export function apparentKva(kw: number, kvar: number): number {
  return Math.hypot(kw, kvar);
}

/** PF = P / sqrt(P^2 + Q^2); null when P <= 0 (no import, no meaningful PF). */
export function powerFactor(kw: number, kvar: number): number | null {
  if (!(kw > 0)) return null;
  return kw / Math.hypot(kw, kvar);
}

/** Lagging/leading sense of a reactive value. */
export function pfSense(kvar: number): PfSense {
  return kvar > 0 ? 'lag' : kvar < 0 ? 'lead' : 'unity';
}

/** tan(acos(pf)): kvar per kW at a power factor (0.4843 at 0.90, 0.3287 at 0.95). */
export function tanPhi(pf: number): number {
  if (!(pf > 0 && pf <= 1)) throw new RangeError(`Power factor ${pf} must be in (0, 1].`);
  return Math.sqrt(1 - pf * pf) / pf;
}

/** Reactive power (kvar, signed) of a load of `kw` at `pf` lagging or leading. */
export function kvarOfLoad(kw: number, pf: number, sense: 'lag' | 'lead'): number {
  const q = kw * tanPhi(pf);
  return sense === 'lag' ? q : -q;
}

export interface LoadSpec {
  kw: number;
  pf: number;
  sense: 'lag' | 'lead';
}

/** Sum of loads by vector addition: total kW, signed kvar, kVA, PF and its sense. */
export function combineLoads(loads: readonly LoadSpec[]): { kw: number; kvar: number; kva: number; pf: number | null; sense: PfSense } {
  let kw = 0;
  let kvar = 0;
  for (const l of loads) {
    kw += l.kw;
    kvar += kvarOfLoad(l.kw, l.pf, l.sense);
  }
  return { kw, kvar, kva: apparentKva(kw, kvar), pf: powerFactor(kw, kvar), sense: pfSense(kvar) };
}

/**
 * True PF from displacement PF and current THD (IEEE Std 1459 definitions, with voltage
 * distortion neglected): PF ~ PF1 / sqrt(1 + THD_I^2). `thdI` is a fraction (0.30 = 30 %).
 */
export function truePowerFactor(displacementPf: number, thdI: number): number {
  return displacementPf / Math.sqrt(1 + thdI * thdI);
}

/** Average PF from energy totals: kWh / sqrt(kWh^2 + kvarh^2); null without import. */
export function averagePf(kwh: number, kvarh: number): number | null {
  return powerFactor(kwh, kvarh);
}
