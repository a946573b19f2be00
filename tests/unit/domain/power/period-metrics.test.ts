import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { billingPeriods, buildSeries, computeMetrics, unwrap } from '../../../../src/lib/domain';
import { constantSeries, seriesByTime, seriesFrom } from '../support/factories';

// Invented readings, 15-min intervals from midnight UTC on 6 Jan 2025, as [kWh, signed kvarh]:
const ROWS: [number, number][] = [
  [25, 15], // 100 kW, 60 kvar
  [30, 20], // 120 kW, 80 kvar
  [35, 10], // 140 kW, 40 kvar (kW peak)
  [20, 30], // 80 kW, 120 kvar (worst PF)
  [0, 2], // zero kW, lagging
  [0, -3], // zero kW, leading
  [-10, 4], // export (Q2)
  [10, -5], // 40 kW, 20 kvar leading (Q4)
];
const T0 = Date.UTC(2025, 0, 6);
const series = seriesFrom(T0, 15, ROWS);
const day = unwrap(billingPeriods([{ from: '2025-01-06', to: '2025-01-06' }], 'UTC'));
const [m15] = computeMetrics(series, day, { demandWindowMinutes: 15, pfThreshold: 0.9 });
const [m30] = computeMetrics(series, day, { demandWindowMinutes: 30 });

describe('period totals and average PF from energy totals (common practice)', () => {
  it.each([
    ['kwh', m15.kwh, 120, 'hand-computed: hand sum of import kWh'],
    ['kvarhLag', m15.kvarhLag, 77, 'hand-computed: hand sum of lagging kvarh, import and zero-kW intervals'],
    ['kvarhLead', m15.kvarhLead, 8, 'hand-computed: hand sum of leading kvarh, import and zero-kW intervals'],
    ['kvarhNet', m15.kvarhNet, 69, 'hand-computed: lagging minus leading'],
    ['pfAvgLagging', m15.pfAvgLagging, 120 / Math.hypot(120, 77), 'common practice: kWh / sqrt(kWh^2 + kvarh^2), lagging basis = 0.8416'],
    ['pfAvgNet', m15.pfAvgNet, 120 / Math.hypot(120, 69), 'common practice, net basis = 0.8669'],
    ['pfAvgAbsolute', m15.pfAvgAbsolute, 120 / Math.hypot(120, 85), 'common practice, absolute basis = 0.8160'],
    ['kwhExport', m15.kwhExport, 10, 'hand-computed: export interval reported apart'],
    ['kvarhLagExport', m15.kvarhLagExport, 4, 'hand-computed: export interval reported apart'],
  ])('%s', (_name, actual, expected) => {
    expect(actual).toBeCloseTo(expected as number, 9);
  });
  it('never averages interval PFs (common practice): the mean of interval PFs differs from the energy PF', () => {
    const pfs = ROWS.filter(([e]) => e > 0).map(([e, q]) => e / Math.hypot(e, q));
    const mean = pfs.reduce((s, x) => s + x, 0) / pfs.length;
    expect(Math.abs(mean - (m15.pfAvgNet ?? 0))).toBeGreaterThan(0.01);
  });
});

describe('demand, kVA and kvar maxima', () => {
  it.each([
    ['15-min peak kW', m15.peakKw, 140, 'hand-computed: interval 3: 35 kWh x 4'],
    ['15-min coincident kvar', m15.peakKvar, 40, 'hand-computed: same interval: 10 kvarh x 4'],
    ['15-min PF at peak', m15.peakPf, 140 / Math.hypot(140, 40), 'common practice: PF at peak = 0.9615'],
    ['15-min peak kVA', m15.peakKva, Math.hypot(140, 40), 'hand-computed: interval 3: 145.6 kVA'],
    ['15-min max kvar', m15.maxKvar, 120, 'hand-computed: interval 4: 30 kvarh x 4'],
    ['30-min peak kW', m30.peakKw, 110, 'common practice: 30-min demand from 15-min data, (25+30) x 2 = 110, earliest of a tie'],
    ['30-min coincident kvar', m30.peakKvar, 70, 'hand-computed: (15+20) x 2'],
    ['30-min peak kVA', m30.peakKva, Math.hypot(110, 80), 'hand-computed: second half-hour: 110 kW, 80 kvar'],
    ['30-min max kvar', m30.maxKvar, 80, 'hand-computed: (10+30) x 2'],
  ])('%s', (_name, actual, expected) => {
    expect(actual).toBeCloseTo(expected as number, 9);
  });
  it('reports the time of the peak', () => {
    expect(m15.peakAtMs).toBe(T0 + 2 * 15 * 60_000);
    expect(m30.peakAtMs).toBe(T0);
  });
  it('rolling 30-min demand sees the 130 kW that block demand splits (common practice: rolling vs block demand)', () => {
    const [rolling] = computeMetrics(series, day, { demandWindowMinutes: 30, demandMethod: 'rolling' });
    expect(rolling.peakKw).toBeCloseTo(130, 9);
  });
});

describe('interval statistics and counts', () => {
  it.each([
    ['minIntervalPf', m15.minIntervalPf, 80 / Math.hypot(80, 120), 'hand-computed: interval 4: 0.5547'],
    ['hoursBelowThreshold', m15.hoursBelowThreshold, 1, 'hand-computed: four import intervals below 0.90'],
    ['loadFactor', m15.loadFactor, 120 / (140 * 24), 'hand-computed: kWh / (peak kW x hours)'],
    ['zeroKwIntervals', m15.zeroKwIntervals, 2, 'common practice: zero-kW intervals counted, no PF'],
    ['exportIntervals', m15.exportIntervals, 1, 'IEC quadrants, common practice: Q2 export counted apart'],
    ['leadingIntervals', m15.leadingIntervals, 1, 'hand-computed: Q4 import interval'],
    ['worstLeadPf', m15.worstLeadPf, 40 / Math.hypot(40, 20), 'hand-computed: interval 8: 0.8944 leading'],
    ['presentIntervals', m15.presentIntervals, 8, 'hand-computed: eight rows'],
    ['expectedIntervals', m15.expectedIntervals, 96, 'common practice: 96 quarter-hours in a 24-hour day'],
    ['completeness', m15.completeness, 8 / 96, 'hand-computed: present / expected'],
  ])('%s', (_name, actual, expected) => {
    expect(actual).toBeCloseTo(expected as number, 9);
  });
  it('labels senses: the worst interval lags, the net average lags', () => {
    expect(m15.minIntervalPfSense).toBe('lag');
    expect(m15.pfAvgNetSense).toBe('lag');
  });
  it('export intervals stay out of kvar and kVA maxima (common practice: export reported apart)', () => {
    const s = seriesFrom(T0, 15, [[25, 10], [-50, 200], [20, 5]]);
    const [m] = computeMetrics(s, day);
    expect(m.maxKvar).toBeCloseTo(40, 9);
    expect(m.peakKva).toBeCloseTo(Math.hypot(100, 40), 9);
    expect(m.kvarhLagExport).toBe(200);
  });

  it('an export-only period has no PF rather than a nonsense one', () => {
    const exportOnly = seriesFrom(T0, 15, [[-5, 2], [-6, -1]]);
    const [m] = computeMetrics(exportOnly, day);
    expect([m.pfAvgLagging, m.pfAvgNet, m.peakPf, m.minIntervalPf]).toEqual([null, null, null, null]);
    expect(m.exportIntervals).toBe(2);
  });
});

describe('completeness across a clock change', () => {
  it.each([
    ['America/New_York', '2025-11-02', Date.UTC(2025, 10, 2, 4), 100, 'IANA tz database: the fall-back day has 100 quarter-hours'],
    ['America/New_York', '2025-03-09', Date.UTC(2025, 2, 9, 5), 92, 'IANA tz database: the spring-forward day has 92'],
    ['Australia/Sydney', '2025-04-06', Date.UTC(2025, 3, 5, 13), 100, 'IANA tz: NSW fall-back day, southern hemisphere'],
  ])('%s %s', (zone, date, startMs, count) => {
    const s = constantSeries({ startMs, count: count + 8, intervalMinutes: 15, kw: 100, kvar: 50 });
    const [m] = computeMetrics(s, unwrap(billingPeriods([{ from: date, to: date }], zone)));
    expect(m.expectedIntervals).toBe(count);
    expect(m.presentIntervals).toBe(count);
    expect(m.completeness).toBe(1);
    expect(m.kwh).toBeCloseTo(25 * count, 9);
  });
});

describe('missing reactive data', () => {
  it('a period without any kvarh reading has no PF, not a PF of 1 (common practice: never fill a missing channel)', () => {
    const s = unwrap(buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + 900_000], active: [25, 30], reactive: { kind: 'none' } }));
    const [m] = computeMetrics(s, day);
    expect([m.pfAvgLagging, m.pfAvgNet, m.pfAvgAbsolute, m.peakPf, m.minIntervalPf]).toEqual([null, null, null, null, null]);
    expect(m.reactiveMissingIntervals).toBe(2);
  });
  it('intervals without kvarh are left out of interval PF statistics', () => {
    const s = unwrap(buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + 900_000], active: [25, 30], reactive: { kind: 'registers', lag: [15, Number.NaN], lead: [0, 0] } }));
    const [m] = computeMetrics(s, day);
    expect(m.minIntervalPf).toBeCloseTo(25 / Math.hypot(25, 15), 12);
    expect(m.hoursBelowThreshold).toBe(0.25);
  });
});

describe('demand blocks follow the local clock (IANA tz database via luxon)', () => {
  it.each([
    ['Asia/Kolkata', 60, 'UTC+05:30: hourly blocks start at :30 UTC'],
    ['Australia/Adelaide', 30, 'UTC+10:30 / +09:30 with a clock change in April'],
  ])('%s, %s-min demand from 15-min data', (zone, windowMinutes) => {
    const start = Date.UTC(2025, 3, 1);
    const s = seriesByTime(start, 10 * 96, 15, (_t, i) => ({ kw: 100 + ((i * 53) % 97), kvar: 20 }));
    const periods = unwrap(billingPeriods([{ from: '2025-04-02', to: '2025-04-09' }], zone));
    const [m] = computeMetrics(s, periods, { demandWindowMinutes: windowMinutes });
    // Reference: group intervals by the local clock window they start in, using luxon per interval.
    const sums = new Map<number, number>();
    for (let i = 0; i < s.length; i++) {
      const t = s.startMs[i];
      if (t < periods[0].startMs || t >= periods[0].endMs) continue;
      const d = DateTime.fromMillis(t, { zone });
      const key = d.startOf('hour').plus({ minutes: Math.floor(d.minute / windowMinutes) * windowMinutes }).toMillis();
      sums.set(key, (sums.get(key) ?? 0) + s.kwh[i]);
    }
    let best = -1;
    let bestAt = 0;
    for (const [key, kwh] of [...sums.entries()].sort((a, b) => a[0] - b[0])) if (kwh > best) [best, bestAt] = [kwh, key];
    expect(m.peakKw).toBeCloseTo((best * 60) / windowMinutes, 9);
    expect(m.peakAtMs).toBe(bestAt);
  });
});
