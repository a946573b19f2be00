import { describe, expect, it } from 'vitest';
import { aggregateOf, kvarhForPf } from '../support/factories';
import { runRule } from '../support/rules';

const at = (pf: number) => aggregateOf({ kwh: 100_000, kvarhLag: kvarhForPf(100_000, pf), peakKw: 400 });
// common practice: 0.5 % per 0.01 from 0.95 to 0.90, then 1 % per 0.01 below.
const tiered = (extra = {}) => ({
  type: 'pf-percent-adjustment' as const,
  id: 'pct',
  base: { source: 'energy-rate' as const, ratePerKwh: 0.1 },
  thresholdPf: 0.95,
  tiers: [{ downToPf: 0.9, pctPerStep: 0.5 }, { pctPerStep: 1 }],
  ...extra,
});

describe('PF percentage adjustment in cumulative tiers', () => {
  it.each([
    [0.95, 'up', 0, 'common practice: exactly at the threshold, no surcharge'],
    [0.93, 'up', 1, 'hand-computed: 2 steps x 0.5 %'],
    [0.9, 'up', 2.5, 'hand-computed: 5 steps x 0.5 % fill the first tier exactly'],
    [0.873, 'up', 5.5, 'hand-computed: 7.7 steps rounded up to 8: 5 x 0.5 % + 3 x 1 %'],
    [0.873, 'down', 4.5, 'hand-computed: 7.7 steps rounded down to 7: 5 x 0.5 % + 2 x 1 %'],
    [0.873, 'nearest', 5.5, 'hand-computed: 7.7 steps to nearest = 8'],
    [0.873, 'exact', 5.2, 'hand-computed: 7.7 steps: 5 x 0.5 % + 2.7 x 1 %'],
    [0.8, 'up', 12.5, 'hand-computed: 15 steps: 5 x 0.5 % + 10 x 1 %'],
  ] as const)('PF %s, steps %s -> %s percent', (pf, stepRounding, percent, _source) => {
    const r = runRule(tiered({ stepRounding }), at(pf));
    // Base: 100,000 kWh x $0.10 = $10,000.
    expect(r.quantities.surchargePct ?? 0).toBeCloseTo(percent, 9);
    expect(r.amount).toBeCloseTo(100 * percent, 6);
  });

  it('explains the tiers with numbers', () => {
    expect(runRule(tiered(), at(0.873)).explanation).toBe(
      'Average PF (lagging kvarh) 0.873 is below the 0.95 threshold by 7.70 steps of 0.01, counted as 8: surcharge 5 × 0.5 % + 3 × 1 % = 5.5 % of energy charge (100,000 kWh × $0.10/kWh) $10,000.00 = $550.00.',
    );
  });

  it.each([
    [0.97, 1, '2 steps above 0.95 x 0.5 % (common practice: credit above a level)'],
    [0.999, 1.5, 'hand-computed: 4.9 steps rounded down to 4 = 2 %, capped at 1.5 %'],
    [0.95, 0, 'hand-computed: no credit at the level itself'],
  ])('credit at PF %s -> %s percent', (pf, percent) => {
    const r = runRule(tiered({ credit: { abovePf: 0.95, pctPerStep: 0.5, maxPct: 1.5 } }), at(pf));
    expect(r.amount).toBeCloseTo(-100 * percent, 6);
    if (percent > 0) expect(r.status).toBe('credit');
  });

  it.each([
    [{ source: 'demand-rate', ratePerKw: 12 }, undefined, 4800, 'hand-computed: base = 400 kW x $12'],
    [{ source: 'entered-amount', field: 'totalBill' }, { totalBill: 20_000 }, 20_000, 'hand-computed: base = the bill total entered'],
  ] as const)('base %j', (base, amounts, baseAmount, _source) => {
    const r = runRule(tiered({ base }), at(0.93), [], amounts);
    expect(r.amount).toBeCloseTo(baseAmount * 0.01, 9);
  });

  it('asks for the bill amount when the base must be entered', () => {
    const r = runRule(tiered({ base: { source: 'entered-amount', field: 'energyCharge' } }), at(0.85));
    expect(r.status).toBe('needs-input');
    expect(r.amount).toBe(0);
  });
});
