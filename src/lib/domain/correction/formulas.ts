import { tanPhi } from '../power/quantities';

/**
 * Textbook correction relations (IEEE Std 141 ch. 8 and capacitor application guides).
 * PFs are magnitudes in (0, 1]; kW and kvar are three-phase totals.
 */

/** kvar per kW to move a load from `pfFrom` to `pfTo`: tan(phi1) - tan(phi2). */
export function kvarPerKwMultiplier(pfFrom: number, pfTo: number): number {
  return tanPhi(pfFrom) - tanPhi(pfTo);
}

/** Capacitor kvar to move `kw` from `pfFrom` to `pfTo`: Qc = P (tan phi1 - tan phi2). */
export function kvarToCorrect(kw: number, pfFrom: number, pfTo: number): number {
  return kw * kvarPerKwMultiplier(pfFrom, pfTo);
}

/** PF of a load of `kw` and lagging `kvar` after adding a bank of `bankKvar`. */
export function correctedPf(kw: number, kvar: number, bankKvar: number): number {
  return kw / Math.hypot(kw, kvar - bankKvar);
}

/** A capacitor's output scales with the square of voltage: (V / Vrated)^2. */
export function voltageScale(serviceVoltageV?: number, ratedVoltageV?: number): number {
  if (serviceVoltageV === undefined || ratedVoltageV === undefined) return 1;
  return (serviceVoltageV / ratedVoltageV) ** 2;
}

/** Fractional I^2R loss reduction when PF rises at constant kW: 1 - (PF1/PF2)^2. */
export function lossReduction(pfFrom: number, pfTo: number): number {
  return 1 - (pfFrom / pfTo) ** 2;
}

/** kVA released at constant kW: kW/PF1 - kW/PF2. */
export function releasedCapacityKva(kw: number, pfFrom: number, pfTo: number): number {
  return kw / pfFrom - kw / pfTo;
}

/**
 * Cost-minimising PF under a kVA demand charge `x` per kVA-year and a capacitor cost
 * `y` per kvar-year: sin(phi2) = y / x, so PF = sqrt(1 - (y/x)^2). Null when y >= x
 * (correction never pays).
 */
export function economicPf(capacitorCostPerKvarYear: number, kvaChargePerKvaYear: number): number | null {
  const s = capacitorCostPerKvarYear / kvaChargePerKvaYear;
  if (!(s >= 0 && s < 1)) return null;
  return Math.sqrt(1 - s * s);
}
