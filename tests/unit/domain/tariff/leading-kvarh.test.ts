import { describe, expect, it } from 'vitest';
import { aggregateOf } from '../support/factories';
import { runRule } from '../support/rules';

describe('leading reactive energy charge', () => {
  const agg = aggregateOf({ kwh: 5000, kvarhLag: 1000, kvarhLead: 800, kvarhLeadZeroKw: 300, zeroKwIntervals: 40 });
  it.each([
    ['any-load', 800 * 0.02, 'common practice: charged per leading kvarh'],
    ['zero-kw-only', 300 * 0.02, 'common practice: only when kW is zero'],
  ] as const)('%s', (condition, amount, _source) => {
    const r = runRule({ type: 'leading-kvarh', id: 'ld', ratePerKvarh: 0.02, condition }, agg);
    expect(r.amount).toBeCloseTo(amount, 9);
    expect(r.explanation).toContain(`= $${amount.toFixed(2)}.`);
  });
});
