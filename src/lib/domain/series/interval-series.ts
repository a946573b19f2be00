/**
 * The compact in-memory form of one meter's interval data.
 *
 * Layout (see DEVELOPERS.md, engine decision E1): parallel typed arrays indexed by interval, sorted by
 * start instant. Energies are stored per interval (kWh, kvarh), never as signed PF.
 * Reactive energy is held as two non-negative registers: `kvarhLag` (reactive drawn,
 * inductive, Q > 0) and `kvarhLead` (reactive supplied, capacitive, Q < 0). A meter
 * that exports only net signed kvarh is split by sign and marked `reactiveSource: 'net'`.
 * 1-minute data for a year (525,600 intervals) takes about 17 MB.
 */
export interface IntervalSeries {
  /** Meter interval length in minutes (1..1440). */
  readonly intervalMinutes: number;
  /** Number of intervals held. */
  readonly length: number;
  /** UTC epoch milliseconds of each interval's start, strictly increasing. */
  readonly startMs: Float64Array;
  /** Active energy per interval; negative means export. */
  readonly kwh: Float64Array;
  /** Lagging (inductive, Q > 0) reactive energy per interval, >= 0. */
  readonly kvarhLag: Float64Array;
  /** Leading (capacitive, Q < 0) reactive energy per interval, >= 0. */
  readonly kvarhLead: Float64Array;
  /** Per-interval bit flags, see `SeriesFlag`. */
  readonly flags: Uint8Array;
  /** Whether reactive energy came as two registers or as one net signed channel. */
  readonly reactiveSource: 'registers' | 'net' | 'none';
}

/** Bit flags stored per interval in `IntervalSeries.flags`. */
export const SeriesFlag = {
  /** The reactive channel had no value here; kvarh is stored as 0 and the gap is reported. */
  reactiveMissing: 1,
  /** The source marked the value as estimated or substituted. */
  estimated: 2,
} as const;

/** Interval length in milliseconds. */
export function intervalMs(series: Pick<IntervalSeries, 'intervalMinutes'>): number {
  return series.intervalMinutes * 60_000;
}

/**
 * Returns a new series sharing stamps, kWh and flags with `base` but carrying other
 * reactive registers (used for corrected scenarios; the arrays are not copied).
 */
export function withReactive(
  base: IntervalSeries,
  kvarhLag: Float64Array,
  kvarhLead: Float64Array,
): IntervalSeries {
  if (kvarhLag.length !== base.length || kvarhLead.length !== base.length) {
    throw new RangeError('Reactive arrays must have one value per interval.');
  }
  return { ...base, kvarhLag, kvarhLead };
}
