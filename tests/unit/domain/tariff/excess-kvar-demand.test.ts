import { describe, expect, it } from 'vitest';
import { aggregateOf } from '../support/factories';
import { runRule } from '../support/rules';

const rule = (extra = {}) => ({ type: 'excess-kvar-demand' as const, id: 'kv', allowance: { basis: 'ratio' as const, kvarPerKw: 1 / 3 }, ratePerKvar: 0.4, ...extra });

describe('excess reactive demand', () => {
  it('worked check: 1000 kW, 750 kvar, k = 1/3, $0.40/kvar -> 416.7 kvar, $166.67 (worked example)', () => {
    const r = runRule(rule(), aggregateOf({ peakKw: 1000, peakKvar: 750 }));
    expect(r.quantities.billableKvar).toBeCloseTo(416.67, 2);
    expect(r.amount).toBeCloseTo(166.67, 2);
    expect(r.explanation).toBe(
      'Peak 1,000.00 kW with 750.00 kvar in the same reading (1,250.00 kVA, PF 0.800 lagging); allowance 1,000.00 kW × 0.3333 = 333.33 kvar; excess 416.67 kvar; billable 416.67 kvar × $0.40/kvar = $166.67.',
    );
  });

  it.each([
    [0.9, 1000 * 0.4843, 'common practice: k = tan(acos 0.90) = 0.4843'],
    [0.95, 1000 * 0.3287, 'common practice: k = tan(acos 0.95) = 0.3287'],
  ])('allowance from PF %s', (pf, allowed) => {
    const r = runRule(rule({ allowance: { basis: 'pf', pf } }), aggregateOf({ peakKw: 1000, peakKvar: 750 }));
    expect(r.quantities.allowedKvar).toBeCloseTo(allowed, 1);
    expect(r.amount).toBeCloseTo((750 - allowed) * 0.4, 1);
  });

  it.each<['coincident' | 'period-max', number, number, string]>([
    ['coincident', 300, 0, 'common practice: the kvar of the same reading as the kW peak, 300, is within the 333 kvar allowance'],
    ['period-max', 900, (900 - 1000 / 3) * 0.4, 'common practice: non-coincident, the period maximum kvar against the maximum kW'],
  ])('%s kvar', (kvarSource, _q, amount) => {
    // Peak 1000 kW with only 300 kvar; the period's highest kvar, 900, came at another time.
    const r = runRule(rule({ kvarSource }), aggregateOf({ peakKw: 1000, peakKvar: 300, maxKvar: 900 }));
    expect(r.amount).toBeCloseTo(amount, 9);
  });

  it('no charge when kvar is within the allowance, or leading', () => {
    expect(runRule(rule(), aggregateOf({ peakKw: 1000, peakKvar: 333 })).amount).toBe(0);
    expect(runRule(rule(), aggregateOf({ peakKw: 1000, peakKvar: -400 })).amount).toBe(0);
  });

  it('ratchet over fewer than 11 earlier periods (common practice: optional ratchet; r = 0.8 from memory)', () => {
    const r = runRule(rule({ ratchet: { fraction: 0.8 } }), aggregateOf({ peakKw: 1000, peakKvar: 400 }), [{ billableKvar: 500 }, { billableKvar: 300 }]);
    // Measured excess 66.67 kvar; floor 0.8 x 500 = 400 kvar.
    expect(r.quantities.billableKvar).toBeCloseTo(400, 9);
    expect(r.amount).toBeCloseTo(160, 9);
    expect(r.quantities.ratchetPeriodsUsed).toBe(2);
  });
});

describe('ratchet basis: measured or billed', () => {
  // Invented year: month 1 has 1,000 kvar of excess, the next twelve none (peak 1000 kW, kvar within allowance).
  const months = [aggregateOf({ peakKw: 1000, peakKvar: 1000 + 1000 / 3 }), ...Array.from({ length: 12 }, () => aggregateOf({ peakKw: 1000, peakKvar: 300 }))];
  const billableByMonth = (basis: 'measured' | 'billed') => {
    const memory: { billableKvar: number }[] = [];
    return months.map((agg) => {
      const r = runRule(rule({ ratchet: { fraction: 0.8, basis } }), agg, memory);
      memory.push(r.memory as { billableKvar: number });
      return Number((r.quantities.billableKvar ?? 0).toFixed(6));
    });
  };
  it.each([
    ['measured', [1000, ...Array(11).fill(800), 0], 'common practice: the floor follows the highest measured excess of the previous 11 months, so month 13 is free'],
    ['billed', [1000, ...Array(11).fill(800), 640], 'common practice: a floor on billed demand carries itself forward, 0.8 x 800 = 640 in month 13'],
  ] as const)('%s basis', (basis, expected, _source) => {
    expect(billableByMonth(basis)).toEqual(expected);
  });
});
