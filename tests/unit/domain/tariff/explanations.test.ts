import { describe, expect, it } from 'vitest';
import { aggregateOf, kvarhForPf } from '../support/factories';
import { runRule } from '../support/rules';

// One invented period: 40,000 kWh at average lagging PF 0.80, 1,000 leading kvarh (200 of it at zero kW),
// peak 200 kW with 150 kvar (PF 0.80), highest kvar 160, peak 250 kVA.
const agg = aggregateOf({
  kwh: 40_000,
  kvarhLag: kvarhForPf(40_000, 0.8),
  kvarhLead: 1_000,
  kvarhLeadZeroKw: 200,
  zeroKwIntervals: 12,
  peakKw: 200,
  peakKvar: 150,
  maxKvar: 160,
  peakKva: 250,
});

describe('every rule type explains its charge with the numbers filled in', () => {
  it.each([
    [{ type: 'pf-billing-demand', id: 'a', targetPf: 0.9, demandRatePerKw: 10 }, 250, ['200.00 kW × 0.9 / 0.800 = 225.00 kW', '25.00 kW × $10.00/kW'], 'common practice: ratio clause, (225 - 200) kW x $10'],
    [{ type: 'kva-billing-demand', id: 'b', mode: 'peak-kva', demandRate: 4 }, 200, ['peak demand 250.00 kVA', '200.00 kW / 1'], 'common practice: kVA clause against unity, (250 - 200) x $4'],
    [{ type: 'excess-kvar-demand', id: 'c', allowance: { basis: 'ratio', kvarPerKw: 0.5 }, ratePerKvar: 2 }, 100, ['allowance 200.00 kW × 0.5 = 100.00 kvar', 'billable 50.00 kvar × $2.00/kvar'], 'common practice: (150 - 100) kvar x $2'],
    [{ type: 'excess-kvarh', id: 'd', allowance: { basis: 'ratio', kvarPerKw: 0.5 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 } }, 100, ['30,000 kvarh (lagging) against 40,000 kWh', 'billable 10,000 kvarh × $0.01/kvarh'], 'common practice: (30,000 - 20,000) kvarh x $0.01'],
    [{ type: 'pf-percent-adjustment', id: 'e', base: { source: 'energy-rate', ratePerKwh: 0.1 }, thresholdPf: 0.85, tiers: [{ pctPerStep: 1 }] }, 200, ['counted as 5', '5 × 1 % = 5 %', '$4,000.00 = $200.00'], 'common practice: 5 steps x 1 % of $4,000'],
    [{ type: 'leading-kvarh', id: 'f', ratePerKvarh: 0.05, condition: 'zero-kw-only' }, 10, ['200.00 leading kvarh while kW was zero (12 intervals) × $0.05/kvarh = $10.00'], 'common practice: 200 kvarh x $0.05'],
  ])('%j', (rule, amount, fragments, _source) => {
    const r = runRule(rule, agg);
    expect(r.amount).toBeCloseTo(amount, 6);
    for (const f of fragments) expect(r.explanation).toContain(f);
    expect(r.explanation).toMatch(/\.$/);
  });
});
