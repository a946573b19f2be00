/**
 * Field offsets of the flat accumulator used by the aggregation kernel: one record of
 * `FIELD_COUNT` numbers per (period, window). A flat Float64Array lets each sizing
 * candidate re-aggregate a site-year with no allocation.
 */
export const Field = {
  kwh: 0,
  kvarhLag: 1,
  kvarhLead: 2,
  kvarhLeadZeroKw: 3,
  importIntervals: 4,
  zeroKwIntervals: 5,
  exportIntervals: 6,
  kwhExport: 7,
  leadingIntervals: 8,
  reactiveMissing: 9,
  /** Highest -kvar/kW of a leading import interval; its PF is 1 / sqrt(1 + ratio^2). */
  maxLeadRatio: 10,
  maxKvar: 11,
  maxKvarBlock: 12,
  maxKvaSq: 13,
  maxKvaBlock: 14,
  coincidentKvar: 15,
  kvarhLagExport: 16,
  kvarhLeadExport: 17,
} as const;

export const FIELD_COUNT = 18;

/** Below this magnitude an interval's kWh counts as zero (no PF, counted apart). */
export const ZERO_KWH = 1e-9;
