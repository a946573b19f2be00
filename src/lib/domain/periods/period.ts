/**
 * A span the tariff is evaluated over: a calendar month in the site's zone or a
 * billing period from a bill. Half-open in UTC: `[startMs, endMs)`.
 */
export interface Period {
  /** Stable key: `2025-03` for months, `2025-01-15..2025-02-13` for billing periods. */
  id: string;
  /** Human label, e.g. `March 2025` or `15 Jan – 13 Feb 2025`. */
  label: string;
  kind: 'month' | 'billing';
  /** IANA zone the period's boundaries are local midnights in. */
  zone: string;
  startMs: number;
  endMs: number;
  /** Length in hours (743 or 745 for months with a clock change). */
  hours: number;
}

/** Number of meter intervals a period should hold at a given interval length. */
export function expectedIntervals(period: Period, intervalMinutes: number): number {
  return Math.round((period.endMs - period.startMs) / (intervalMinutes * 60_000));
}
