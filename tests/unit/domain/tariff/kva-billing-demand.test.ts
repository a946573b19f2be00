import { describe, expect, it } from 'vitest';
import { aggregateOf, kvarhForPf } from '../support/factories';
import { runRule } from '../support/rules';

// The Worked example: 1000 kW with 750 kvar is 1250 kVA at PF 0.800.
const peak = aggregateOf({ peakKw: 1000, peakKvar: 750, peakKva: 1250, peakKvaKw: 1000, kwh: 500_000, kvarhLag: 375_000 });
const rule = (extra: Record<string, unknown>) => ({ type: 'kva-billing-demand' as const, id: 'kva', demandRate: 10, ...extra });

describe('kVA billing demand', () => {
  it.each([
    ['peak kVA vs unity', { mode: 'peak-kva' }, 1250, 1000, 'common practice: bill at actual kVA minus bill at unity; s.5 1250 kVA'],
    ['peak kVA vs target 0.90', { mode: 'peak-kva', reference: 'target-pf', targetPf: 0.9 }, 1250, 1000 / 0.9, 'common practice: reference at the target PF'],
    ['kW over average PF', { mode: 'kw-over-average-pf' }, 1250, 1000, 'common practice: peak kW / average PF (average PF 0.80)'],
    ['greater of kW or 0.90 kVA', { mode: 'greater-of-kw-or-kva-share', kvaShare: 0.9 }, 1125, 1000, 'common practice: max(kW, 0.90 x kVA) = max(1000, 1125)'],
    ['greater of, target 0.95', { mode: 'greater-of-kw-or-kva-share', kvaShare: 0.9, reference: 'target-pf', targetPf: 0.95 }, 1125, 1000, 'hand-computed: at PF 0.95: 0.9 x 1052.6 = 947.4 < 1000 kW'],
  ])('%s', (_name, extra, billed, reference, _source) => {
    const r = runRule(rule(extra), peak);
    expect(r.quantities.billedDemand).toBeCloseTo(billed, 6);
    expect(r.quantities.referenceDemand).toBeCloseTo(reference, 6);
    expect(r.amount).toBeCloseTo((billed - reference) * 10, 6);
  });

  it('no PF cost when the site already runs at unity (common practice)', () => {
    const unity = aggregateOf({ peakKw: 800, peakKva: 800, kwh: 1000, kvarhLag: 0 });
    expect(runRule(rule({ mode: 'peak-kva' }), unity).amount).toBe(0);
  });

  it('no PF cost above the target PF when the reference is the target', () => {
    const good = aggregateOf({ peakKw: 1000, peakKva: 1000 / 0.96, kwh: 1000, kvarhLag: kvarhForPf(1000, 0.96) });
    expect(runRule(rule({ mode: 'kw-over-average-pf', reference: 'target-pf', targetPf: 0.95 }), good).amount).toBeCloseTo(0, 9);
  });

  it('ratchets billed and reference demand alike', () => {
    const r = runRule(rule({ mode: 'peak-kva', ratchet: { fraction: 0.8 } }), peak, [{ billed: 2000, reference: 1500 }]);
    // Billed max(1250, 1600) = 1600; reference max(1000, 1200) = 1200.
    expect(r.amount).toBeCloseTo(4000, 9);
  });
});
