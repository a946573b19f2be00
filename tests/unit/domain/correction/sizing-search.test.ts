import { describe, expect, it } from 'vitest';
import { evaluateTariff, kvarPerKwMultiplier, kvarRange, monthlyPeriods, parseTariff, simulateFixedBank, simulateSwitchedBank, sizingSearch, unwrap } from '../../../../src/lib/domain';
import { seriesByTime } from '../support/factories';

const START = Date.UTC(2025, 0, 1);
// Invented plant, two months hourly: busy 07:00-19:00 at 500 kW / 400 kvar (PF 0.78), otherwise 60 kW / 45 kvar.
const s = seriesByTime(START, (31 + 28) * 24, 60, (t) => {
  const h = new Date(t).getUTCHours();
  const feb = new Date(t).getUTCMonth() === 1;
  return h >= 7 && h < 19 ? { kw: feb ? 450 : 500, kvar: feb ? 300 : 400 } : { kw: 60, kvar: 45 };
});
const periods = unwrap(monthlyPeriods({ fromMs: START, toMs: Date.UTC(2025, 2, 1) }, 'UTC'));
const tariff = unwrap(
  parseTariff({
    name: 'Invented demand tariff',
    currency: 'USD',
    rules: [
      { type: 'pf-billing-demand', id: 'bd', targetPf: 0.95, demandRatePerKw: 15 },
      { type: 'leading-kvarh', id: 'ld', ratePerKvarh: 0.02 },
    ],
  }),
);
const options = {
  sizesKvar: [50, 100, 200, 300, 400],
  stepCounts: [4],
  targetPf: 0.95,
  costs: { fixed: { perKvar: 30, fixedCost: 2000 }, switched: { perKvar: 60, fixedCost: 3000 } },
  finance: { lifeYears: 10, discountRate: 0.08 },
};
const table = sizingSearch(tariff, s, periods, options);

describe('sizing search', () => {
  it('evaluates every size as a fixed and a switched bank', () => {
    expect(table.rows.map((r) => `${r.kind}:${r.kvar}`)).toEqual(options.sizesKvar.flatMap((k) => [`fixed:${k}`, `switched:${k}`]));
  });

  it('each saving is the difference of two honest evaluations (baseline minus corrected series)', () => {
    const base = evaluateTariff(tariff, s, periods).total;
    const factor = table.annualFactor;
    for (const row of table.rows.filter((r) => r.kvar === 200)) {
      const sim = row.kind === 'fixed' ? simulateFixedBank(s, { kvar: 200 }, periods) : simulateSwitchedBank(s, { stepsKvar: [50, 50, 50, 50], targetPf: 0.95 }, periods);
      const after = evaluateTariff(tariff, sim.series, periods).total;
      expect(row.annualSaving).toBeCloseTo((base - after) * factor, 6);
      expect(row.leadingHours).toBeCloseTo(sim.summary.leadingHours, 9);
    }
  });

  it('scales two months to a year (8766 h / 1416 h)', () => {
    expect(table.annualFactor).toBeCloseTo(8766 / ((31 + 28) * 24), 12);
    expect(table.notes[0]).toMatch(/scaled/);
  });

  it('marks the best NPV and the shortest payback', () => {
    const best = Math.max(...table.rows.map((r) => r.npv));
    const quickest = Math.min(...table.rows.map((r) => r.paybackYears));
    expect(table.rows.filter((r) => r.bestNpv).map((r) => r.npv)).toEqual([best]);
    expect(table.rows.filter((r) => r.shortestPayback).map((r) => r.paybackYears)).toEqual([quickest]);
  });

  it('a fixed bank larger than the light-load kvar runs leading at night; a switched one does not', () => {
    const fixed = table.rows.find((r) => r.kind === 'fixed' && r.kvar === 100);
    const switched = table.rows.find((r) => r.kind === 'switched' && r.kvar === 100);
    expect(fixed?.leadingHours).toBeCloseTo(59 * 12, 9);
    expect(fixed?.worstLeadPf).toBeCloseTo(60 / Math.hypot(60, 55), 9);
    expect(switched?.leadingHours).toBe(0);
  });

  it('shows the textbook estimate for the worst month (IEEE Std 141 ch. 8: Qc = P (tan phi1 - tan phi2))', () => {
    const t = table.textbook;
    expect(t?.periodLabel).toBe('January 2025');
    expect(t?.peakKw).toBeCloseTo(500, 9);
    expect(t?.kvar).toBeCloseTo(500 * kvarPerKwMultiplier(t?.pfFrom ?? 1, 0.95), 9);
    expect(t?.explanation).toMatch(/^Worst period January 2025: average PF 0\.\d{3} at a peak of 500\.0 kW; Qc = 500\.0 × /);
  });

  it('a plan whose savings never cover O&M has infinite payback and is never the quickest', () => {
    const costly = sizingSearch(tariff, s, periods, { ...options, sizesKvar: [50], kinds: ['switched'], costs: { ...options.costs, omPctOfCapex: 2000 } });
    expect(costly.rows[0].paybackYears).toBe(Number.POSITIVE_INFINITY);
    expect(costly.rows[0].shortestPayback).toBe(false);
    expect(costly.shortestPaybackIndex).toBeNull();
  });
});

describe('candidate sizes', () => {
  it.each([
    [25, 100, 25, [25, 50, 75, 100], 'hand-computed: both ends included'],
    [50, 120, 25, [50, 75, 100], 'hand-computed: the end is not passed'],
    [0.5, 1.5, 0.5, [0.5, 1, 1.5], 'hand-computed: fractional steps without float drift'],
  ])('from %s to %s by %s', (from, to, step, sizes) => {
    expect(kvarRange(from, to, step)).toEqual(sizes);
  });
});

describe('screening each row against the transformer', () => {
  const screened = sizingSearch(tariff, s, periods, { ...options, sizesKvar: [600], stepCounts: [4], transformer: { kva: 1500, impedancePct: 5.75 } });
  it.each([
    ['fixed', 6.59, [7], 'hand-computed from h = sqrt(kVA_sc / kvar), common practice: 600 kvar on 1500 kVA at 5.75 % -> 6.59, near the 7th'],
    ['switched', 6.59, [7, 13], 'hand-computed, same formula per step: 150, 300, 450, 600 kvar -> 13.19 (13th), 9.33, 7.61 and 6.59 (7th)'],
  ])('%s bank', (kind, order, near, _source) => {
    const row = screened.rows.find((r) => r.kind === kind);
    expect(row?.screen?.order).toBeCloseTo(order, 2);
    expect(row?.screen?.nearHarmonics).toEqual(near);
    // from memory (IEEE Std 141): dV% ~ kvar x Z% / kVA = 600 x 5.75 / 1500 = 2.3 %.
    expect(row?.screen?.voltageRisePct).toBeCloseTo(2.3, 9);
  });
  it('notes that switched banks are simulated on interval averages', () => {
    expect(screened.notes.some((n) => /averages/.test(n))).toBe(true);
  });
});
