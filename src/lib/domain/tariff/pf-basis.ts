import { averagePf, powerFactor } from '../power/quantities';
import type { WindowAggregate } from '../power/window-aggregate';
import type { KvarhBasis, PfBasis, PfRounding, RoundingMode } from './common-schemas';
import { pfText } from './format';

/** Comparisons tolerate float noise: a PF equal to its target is not below it. */
export const PF_EPSILON = 1e-9;

/** The period's kvarh on a basis (net is floored at zero: leading only offsets lagging). */
export function kvarhOnBasis(agg: WindowAggregate, basis: KvarhBasis): number {
  if (basis === 'lagging') return agg.kvarhLag;
  if (basis === 'net') return Math.max(0, agg.kvarhLag - agg.kvarhLead);
  return agg.kvarhLag + agg.kvarhLead;
}

/** The coincident kvar at the kW peak on a basis. */
export function peakKvarOnBasis(agg: WindowAggregate, basis: KvarhBasis): number {
  return basis === 'absolute' ? Math.abs(agg.peakKvar) : Math.max(0, agg.peakKvar);
}

/** Rounds `value` to `decimals` in a direction, immune to binary float noise. */
export function roundTo(value: number, decimals: number, mode: RoundingMode): number {
  const f = 10 ** decimals;
  const scaled = Number((value * f).toFixed(9));
  const r = mode === 'up' ? Math.ceil(scaled) : mode === 'down' ? Math.floor(scaled) : Math.round(scaled);
  return r / f;
}

/** Rounds a count of steps (or points) in a direction, immune to float noise. */
export function roundSteps(value: number, mode: RoundingMode | 'exact'): number {
  const clean = Number(value.toFixed(9));
  if (mode === 'exact') return clean;
  return mode === 'up' ? Math.ceil(clean) : mode === 'down' ? Math.floor(clean) : Math.round(clean);
}

export interface RulePf {
  /** PF after the tariff's rounding; null when there was no import. */
  pf: number | null;
  /** PF before rounding. */
  rawPf: number | null;
  /** Text for explanations, e.g. "Average PF (lagging kvarh) 0.871"; lazy like all explanation text. */
  text: () => string;
}

/** Measures the PF a rule compares, on its PF and kvarh bases, with its rounding. */
export function rulePf(agg: WindowAggregate, pfBasis: PfBasis, kvarhBasis: KvarhBasis, rounding?: PfRounding): RulePf {
  const raw = pfBasis === 'average' ? averagePf(agg.kwh, kvarhOnBasis(agg, kvarhBasis)) : powerFactor(agg.peakKw, peakKvarOnBasis(agg, kvarhBasis));
  const pf = raw === null ? null : rounding ? roundTo(raw, rounding.decimals, rounding.mode) : raw;
  const text = () => {
    const label = pfBasis === 'average' ? 'Average PF' : 'PF at the kW peak';
    const head = `${label} (${kvarhBasis} kvarh)`;
    if (raw === null || pf === null) return head;
    return rounding && pf !== raw ? `${head} ${raw.toFixed(4)} rounded ${rounding.mode} to ${pf.toFixed(rounding.decimals)}` : `${head} ${pfText(pf)}`;
  };
  return { pf, rawPf: raw, text };
}

/** True when `pf` is below `target` beyond float noise. */
export function isBelow(pf: number, target: number): boolean {
  return pf < target - PF_EPSILON;
}
