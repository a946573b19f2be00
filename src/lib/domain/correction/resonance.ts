/** Characteristic harmonics of six-pulse loads, screened by default. */
export const SCREENED_HARMONICS = [5, 7, 11, 13] as const;

/** Common detuning reactor ratings, percent of capacitor reactance. */
export const DETUNING_REACTORS_PCT = [5.67, 7, 14] as const;

export interface ResonanceInput {
  transformerKva: number;
  /** Transformer impedance, percent (e.g. 5.75). */
  impedancePct: number;
  bankKvar: number;
  harmonics?: readonly number[];
  /** Warning band, percent either side of each harmonic (default 10). */
  bandPct?: number;
}

export interface ResonanceScreen {
  shortCircuitKva: number;
  /** Parallel resonance order h = sqrt(kVA_sc / kvar). */
  order: number;
  /** The screened harmonic h is close to, or null. */
  nearHarmonic: number | null;
  warning: boolean;
  message: string;
  /** Detuned-bank options: reactor percent and the tuning order 1/sqrt(p). */
  detunedOptions: { reactorPct: number; tuningOrder: number }[];
}

/** Tuning order of a detuned bank with a reactor of `reactorPct`: 1 / sqrt(p). */
export function detunedTuningOrder(reactorPct: number): number {
  return 1 / Math.sqrt(reactorPct / 100);
}

/**
 * Screens a bank for parallel resonance with the supply transformer (source impedance
 * beyond the transformer ignored): kVA_sc = kVA_tx / Z_pu, h = sqrt(kVA_sc / kvar).
 * Warns when h is within the band of a screened harmonic. A screen, not a study.
 */
export function screenResonance(input: ResonanceInput): ResonanceScreen {
  const { transformerKva, impedancePct, bankKvar } = input;
  if (!(transformerKva > 0 && impedancePct > 0 && bankKvar > 0)) throw new RangeError('Transformer kVA, impedance and bank kvar must be positive.');
  const shortCircuitKva = transformerKva / (impedancePct / 100);
  const order = Math.sqrt(shortCircuitKva / bankKvar);
  const band = (input.bandPct ?? 10) / 100;
  const near = (input.harmonics ?? SCREENED_HARMONICS).find((h) => Math.abs(order - h) <= band * h) ?? null;
  const detunedOptions = DETUNING_REACTORS_PCT.map((p) => ({ reactorPct: p, tuningOrder: detunedTuningOrder(p) }));
  const base = `${bankKvar} kvar on ${transformerKva} kVA at ${impedancePct} % impedance: short-circuit ${Math.round(shortCircuitKva).toLocaleString('en-US')} kVA, resonance near harmonic ${order.toFixed(2)}`;
  const message =
    near === null
      ? `${base}, not within ${band * 100} % of a screened harmonic. Have a harmonic study done if the site has drives or rectifiers.`
      : `${base}, within ${band * 100} % of the ${ordinal(near)} harmonic: risk of amplified harmonic voltage. Consider a detuned bank (7 % reactor tunes to ${detunedTuningOrder(7).toFixed(2)}) and a harmonic study.`;
  return { shortCircuitKva, order, nearHarmonic: near, warning: near !== null, message, detunedOptions };
}

/** Resonance screen for each cumulative step of a switched bank. */
export function screenResonanceSteps(input: Omit<ResonanceInput, 'bankKvar'>, stepsKvar: readonly number[]): ResonanceScreen[] {
  let total = 0;
  return stepsKvar.map((k) => {
    total += k;
    return screenResonance({ ...input, bankKvar: total });
  });
}

function ordinal(h: number): string {
  return `${h}th`;
}
