import { describe, expect, it } from 'vitest';
import { aggregateOf, kvarhForPf } from '../support/factories';
import { runRule } from '../support/rules';

/** A period whose average lagging PF is exactly `pf` and whose peak is `peakKw`. */
const periodAt = (pf: number, peakKw = 100, extra = {}) => aggregateOf({ kwh: 10_000, kvarhLag: kvarhForPf(10_000, pf), peakKw, ...extra });
const rule = (extra = {}) => ({ type: 'pf-billing-demand' as const, id: 'bd', targetPf: 0.9, demandRatePerKw: 10, ...extra });

describe('PF-adjusted billing demand: the worked ratio example', () => {
  // worked example: 51.09 kW, target 0.93, PF 0.871 -> 54.55 kW; at $23.80/kW-year the PF cost is $82.37 (82.35 if kW is rounded to 0.01 first).
  const base = { targetPf: 0.93, demandRatePerKw: 23.8 };
  it('unrounded: 54.55 kW and $82.37 (worked example, ratio billing demand)', () => {
    const r = runRule(rule(base), periodAt(0.871, 51.09));
    expect(r.quantities.billingDemandKw).toBeCloseTo(54.55, 2);
    expect(r.amount).toBeCloseTo(82.37, 2);
    expect(r.explanation).toBe('Average PF (lagging kvarh) 0.871 is below the 0.93 target: billing demand = 51.09 kW × 0.93 / 0.871 = 54.55 kW; PF-related demand 3.46 kW × $23.80/kW = $82.37.');
  });
  it('kW rounded to 0.01 before pricing: $82.35 (worked example, ratio billing demand)', () => {
    const r = runRule(rule({ ...base, demandDecimals: 2 }), periodAt(0.871, 51.09));
    expect(r.quantities.billingDemandKw).toBe(54.55);
    // 3.46 kW x $23.80 = $82.348, shown as $82.35; money is rounded only for display.
    expect(r.amount).toBeCloseTo(3.46 * 23.8, 9);
    expect(r.explanation).toMatch(/= \$82\.35\.$/);
  });
});

describe('PF-adjusted billing demand: formula variants', () => {
  it.each([
    ['ratio', {}, 0.8, 1.125, 'worked example: ratio form at target 0.90, PF 0.80 -> x1.125'],
    ['linear', { formula: 'linear' }, 0.8, 1.1, 'worked example: linear billing demand at target 0.90, PF 0.80 -> x1.10'],
    ['per point, m = 1', { formula: 'per-point', percentPerPoint: 1 }, 0.8, 1.1, 'common practice: 10 points x 1 % = +10 %'],
    ['per point, m = 2', { formula: 'per-point', percentPerPoint: 2 }, 0.8, 1.2, 'common practice: 10 points x 2 % = +20 %'],
    ['per point rounded up', { formula: 'per-point', pointRounding: 'up' }, 0.873, 1.03, 'common practice: 2.7 points rounded up = 3'],
    ['per point rounded down', { formula: 'per-point', pointRounding: 'down' }, 0.873, 1.02, 'common practice: 2.7 points rounded down = 2'],
    ['per point to nearest', { formula: 'per-point', pointRounding: 'nearest' }, 0.874, 1.03, 'common practice: 2.6 points to nearest = 3'],
    ['per point exact', { formula: 'per-point', pointRounding: 'exact' }, 0.875, 1.025, 'common practice: 2.5 points unrounded'],
  ])('%s', (_name, extra, pf, factor, _source) => {
    const r = runRule(rule(extra), periodAt(pf));
    expect(r.quantities.factor).toBeCloseTo(factor, 9);
    expect(r.quantities.billingDemandKw).toBeCloseTo(100 * factor, 9);
    expect(r.amount).toBeCloseTo(100 * (factor - 1) * 10, 9);
  });
});

describe('PF-adjusted billing demand: edges', () => {
  it.each([
    [0.9, 0, 'common practice: PF exactly at the threshold is not below it'],
    [0.95, 0, 'common practice: PF above the target adds nothing'],
    [0.8999, 100 * (0.9 / 0.8999 - 1) * 10, 'hand-computed: a hair below the target is charged'],
  ])('PF %s', (pf, amount) => {
    expect(runRule(rule(), periodAt(pf)).amount).toBeCloseTo(amount, 9);
  });

  it.each([
    [{ decimals: 2, mode: 'nearest' }, 0, 'PF 0.8951 rounds to 0.90: no charge (common practice: tariffs compare PF to two decimals)'],
    [{ decimals: 2, mode: 'down' }, 100 * (0.9 / 0.89 - 1) * 10, 'hand-computed: PF 0.8951 truncated to 0.89: charged at 0.89'],
    [{ decimals: 3, mode: 'nearest' }, 100 * (0.9 / 0.895 - 1) * 10, 'hand-computed: PF 0.8951 to three decimals is 0.895'],
  ] as const)('PF rounding %j', (pfRounding, amount, _source) => {
    expect(runRule(rule({ pfRounding }), periodAt(0.8951)).amount).toBeCloseTo(amount, 9);
  });

  it('caps the increase (common practice: optional cap, e.g. +10 %)', () => {
    const r = runRule(rule({ maxIncreasePct: 10 }), periodAt(0.7));
    // Uncapped 0.90 / 0.70 = x1.2857; capped at x1.10.
    expect(r.quantities.billingDemandKw).toBeCloseTo(110, 9);
    expect(r.amount).toBeCloseTo(100, 9);
    expect(r.explanation).toMatch(/capped at \+10 %/);
  });

  it('uses the PF at the kW peak when asked (common practice: PF at peak)', () => {
    // Average PF 0.95 (no charge on average); the peak reading is 100 kW with 75 kvar: PF 0.80.
    const r = runRule(rule({ pfBasis: 'at-peak' }), periodAt(0.95, 100, { peakKvar: 75 }));
    expect(r.quantities.pf).toBeCloseTo(0.8, 9);
    expect(r.amount).toBeCloseTo(100 * (0.9 / 0.8 - 1) * 10, 9);
  });

  it.each([
    // 10,000 kWh with 4,000 lagging and 2,000 leading kvarh.
    ['lagging', 10_000 / Math.hypot(10_000, 4_000), 'common practice: lagging only ignores leading kvarh'],
    ['net', 10_000 / Math.hypot(10_000, 2_000), 'common practice: net = lagging - leading'],
    ['absolute', 10_000 / Math.hypot(10_000, 6_000), 'common practice: absolute = lagging + leading'],
  ] as const)('leading kvarh on the %s basis', (kvarhBasis, pf, _source) => {
    const agg = aggregateOf({ kwh: 10_000, kvarhLag: 4_000, kvarhLead: 2_000, peakKw: 100 });
    const r = runRule(rule({ kvarhBasis, targetPf: 0.99 }), agg);
    expect(r.quantities.pf).toBeCloseTo(pf, 12);
  });

  it('has nothing to adjust without import demand', () => {
    expect(runRule(rule(), aggregateOf({})).status).toBe('not-applicable');
  });
});

describe('PF-adjusted billing demand with a ratchet', () => {
  // common practice: BD = max(this month, r x highest of the previous 11 months), r = 0.8 (from memory).
  const ratchet = (order: string) => rule({ ratchet: { fraction: 0.8, order } });
  const history = [
    { demandKw: 150, adjustedKw: 160 },
    { demandKw: 140, adjustedKw: 140 },
    { demandKw: 120, adjustedKw: 130 },
  ];

  it('with only 3 of 11 earlier months, ratchets over the months there are', () => {
    const r = runRule(ratchet('adjust-then-ratchet'), periodAt(0.8, 100), history);
    // Adjusted 100 x 0.9/0.8 = 112.5; floor 0.8 x 160 = 128 -> BD 128. Without PF: max(100, 0.8 x 150 = 120) = 120.
    expect(r.quantities.billingDemandKw).toBeCloseTo(128, 9);
    expect(r.quantities.billingDemandWithoutPfKw).toBeCloseTo(120, 9);
    expect(r.amount).toBeCloseTo(80, 9);
    expect(r.quantities.ratchetPeriodsUsed).toBe(3);
    expect(r.explanation).toMatch(/3 of 11 earlier periods available/);
  });

  it('ratchet first, then the PF adjustment', () => {
    const r = runRule(ratchet('ratchet-then-adjust'), periodAt(0.8, 100), history);
    // Base max(100, 0.8 x 150) = 120; x 0.9/0.8 = 135; PF part 15 kW.
    expect(r.quantities.billingDemandKw).toBeCloseTo(135, 9);
    expect(r.amount).toBeCloseTo(150, 9);
  });

  it('looks back only over the stated number of periods', () => {
    const old = [{ demandKw: 500, adjustedKw: 500 }, ...Array.from({ length: 11 }, () => ({ demandKw: 90, adjustedKw: 90 }))];
    const r = runRule(ratchet('adjust-then-ratchet'), periodAt(0.9, 100), old);
    expect(r.quantities.billingDemandKw).toBeCloseTo(100, 9);
    expect(r.quantities.ratchetPeriodsUsed).toBe(11);
  });

  it('remembers this period for the next one', () => {
    const r = runRule(ratchet('adjust-then-ratchet'), periodAt(0.8, 100));
    expect(r.memory?.demandKw).toBe(100);
    expect(r.memory?.adjustedKw).toBeCloseTo(112.5, 9);
  });
});
