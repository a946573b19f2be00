/**
 * Test factories for the engine: invented interval data with hand-computable totals.
 */
import { buildSeries, unwrap, type IntervalSeries, type WindowAggregate } from '../../../../src/lib/domain';

export interface ConstantLoad {
  /** UTC start of the first interval. */
  startMs: number;
  count: number;
  intervalMinutes: number;
  kw: number;
  /** Signed kvar: + lagging, - leading. */
  kvar: number;
}

/** A series with the same kW and kvar in every interval. */
export function constantSeries(load: ConstantLoad): IntervalSeries {
  const h = load.intervalMinutes / 60;
  return seriesFrom(load.startMs, load.intervalMinutes, Array.from({ length: load.count }, () => [load.kw * h, load.kvar * h] as const));
}

/** A series from [kWh, signed kvarh] rows at a regular interval. */
export function seriesFrom(startMs: number, intervalMinutes: number, rows: readonly (readonly [number, number])[]): IntervalSeries {
  const stamps = rows.map((_, i) => startMs + i * intervalMinutes * 60_000);
  return unwrap(
    buildSeries({
      intervalMinutes,
      stamps,
      active: rows.map((r) => r[0]),
      reactive: { kind: 'registers', lag: rows.map((r) => Math.max(0, r[1])), lead: rows.map((r) => Math.max(0, -r[1])) },
    }),
  );
}

/** A series whose kW and kvar come from a function of the interval's UTC start. */
export function seriesByTime(startMs: number, count: number, intervalMinutes: number, load: (t: number, i: number) => { kw: number; kvar: number }): IntervalSeries {
  const h = intervalMinutes / 60;
  return seriesFrom(
    startMs,
    intervalMinutes,
    Array.from({ length: count }, (_, i) => {
      const { kw, kvar } = load(startMs + i * intervalMinutes * 60_000, i);
      return [kw * h, kvar * h] as const;
    }),
  );
}

/** A window aggregate for rule tests; unspecified fields are zero. */
export function aggregateOf(partial: Partial<WindowAggregate>): WindowAggregate {
  return {
    kwh: 0,
    kvarhLag: 0,
    kvarhLead: 0,
    kvarhLeadZeroKw: 0,
    importIntervals: 0,
    zeroKwIntervals: 0,
    exportIntervals: 0,
    kwhExport: 0,
    kvarhLagExport: 0,
    kvarhLeadExport: 0,
    leadingIntervals: 0,
    leadingHours: 0,
    worstLeadPf: null,
    reactiveMissingIntervals: 0,
    peakKw: 0,
    peakAtMs: null,
    peakKvar: 0,
    maxKvar: 0,
    maxKvarAtMs: null,
    peakKva: 0,
    peakKvaAtMs: null,
    peakKvaKw: 0,
    ...partial,
  };
}

/** kvarh that gives an average PF of exactly `pf` with `kwh`. */
export function kvarhForPf(kwh: number, pf: number): number {
  return kwh * Math.sqrt(1 - pf * pf) / pf;
}
