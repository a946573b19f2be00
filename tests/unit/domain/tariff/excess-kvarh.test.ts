import { describe, expect, it } from 'vitest';
import type { Allowance } from '../../../../src/lib/domain';
import { aggregateOf } from '../support/factories';
import { runRule } from '../support/rules';

// worked example: 10,000 kWh with 6,000 kvarh (average PF 0.857).
const period = aggregateOf({ kwh: 10_000, kvarhLag: 6_000 });
const rule = (allowance: Allowance, extra = {}) => ({ type: 'excess-kvarh' as const, id: 'xr', allowance, pricing: { kind: 'flat' as const, ratePerKvarh: 0.05 }, ...extra });

describe('excess reactive energy', () => {
  it.each<[Allowance, number, string]>([
    [{ basis: 'ratio', kvarPerKw: 0.4 }, 2000, 'worked example: k = 0.4 -> 2,000 kvarh billable'],
    [{ basis: 'ratio', kvarPerKw: 0.5 }, 1000, 'worked example: k = 0.5 -> 1,000'],
    [{ basis: 'ratio', kvarPerKw: 0.33 }, 2700, 'worked example: k = 0.33 -> 2,700'],
  ])('allowance %j', (allowance, billable) => {
    const r = runRule(rule(allowance), period);
    expect(r.quantities.billableKvarh).toBeCloseTo(billable, 9);
    expect(r.amount).toBeCloseTo(billable * 0.05, 9);
  });

  it('reports the average PF 0.857 (worked example)', () => {
    expect(runRule(rule({ basis: 'ratio', kvarPerKw: 0.4 }), period).quantities.pf).toBeCloseTo(0.857, 3);
  });

  it.each([
    [0.85, 0.02, 'RD 1164/2001 art. 9.3 shape: PF between 0.80 and 0.95 priced in the upper band'],
    [0.75, 0.06, 'RD 1164/2001 art. 9.3 shape: PF below 0.80 priced in the lower band'],
    [0.96, 0, 'RD 1164/2001 art. 9.3 shape: no band applies at or above 0.95'],
  ])('PF bands at average PF %s', (pf, unitRate) => {
    const kvarh = 10_000 * Math.sqrt(1 - pf * pf) / pf;
    const bands = { kind: 'pf-bands', bands: [{ pfBelow: 0.95, ratePerKvarh: 0.02 }, { pfBelow: 0.8, ratePerKvarh: 0.06 }] };
    const r = runRule(rule({ basis: 'ratio', kvarPerKw: 0.33 }, { pricing: bands }), aggregateOf({ kwh: 10_000, kvarhLag: kvarh }));
    expect(r.quantities.ratePerKvarh).toBe(unitRate);
    expect(r.amount).toBeCloseTo(Math.max(0, kvarh - 3300) * unitRate, 9);
  });

  it.each<['lagging' | 'net' | 'absolute', number, string]>([
    ['lagging', 6000 - 4000, 'common practice: leading ignored'],
    ['net', 6000 - 1500 - 4000, 'common practice: net = lagging - leading'],
    ['absolute', 6000 + 1500 - 4000, 'common practice: absolute = lagging + leading'],
  ])('leading kvarh on the %s basis', (kvarhBasis, billable) => {
    const r = runRule(rule({ basis: 'ratio', kvarPerKw: 0.4 }, { kvarhBasis }), aggregateOf({ kwh: 10_000, kvarhLag: 6_000, kvarhLead: 1_500 }));
    expect(r.quantities.billableKvarh).toBeCloseTo(billable, 9);
  });

  it('net basis never goes below zero when leading exceeds lagging', () => {
    const r = runRule(rule({ basis: 'ratio', kvarPerKw: 0 }, { kvarhBasis: 'net' }), aggregateOf({ kwh: 100, kvarhLag: 10, kvarhLead: 40 }));
    expect(r.quantities.kvarh).toBe(0);
    expect(r.amount).toBe(0);
  });
});
