import { describe, expect, it } from 'vitest';
import { evaluateTariffVersions, monthlyPeriods, parseTariff, unwrap } from '../../../../src/lib/domain';
import { seriesByTime } from '../support/factories';

// Invented: January peaks at 200 kW, February to April at 100 kW, PF 0.80 throughout.
const start = Date.UTC(2025, 0, 1);
const series = seriesByTime(start, (31 + 28 + 31 + 30) * 24, 60, (t) => {
  const kw = new Date(t).getUTCMonth() === 0 ? 200 : 100;
  return { kw, kvar: 0.75 * kw };
});
const periods = unwrap(monthlyPeriods({ fromMs: start, toMs: Date.UTC(2025, 4, 1) }, 'UTC'));
const version = (id: string, effectiveFrom: string, rate: number) => ({
  id,
  effectiveFrom,
  tariff: unwrap(parseTariff({ name: id, currency: 'USD', rules: [{ type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, demandRatePerKw: rate, ratchet: { fraction: 0.8 } }] })),
});

describe('tariff versions by effective date', () => {
  const e = evaluateTariffVersions([version('v2', '2025-03-01', 20), version('v1', '2025-01-01', 10)], series, periods);
  it.each([
    [0, 'v1', 250, 'hand-computed: January: (225 - 200) kW x $10'],
    [1, 'v1', 200, 'February: ratchet floors 180 vs 160 kW (common practice: ratchet over the previous 11 months), x $10'],
    [2, 'v2', 400, 'hand-computed: March, new rate: the ratchet keeps January (180 vs 160 kW) x $20'],
    [3, 'v2', 400, 'hand-computed: April: same'],
  ])('period %s under %s charges %s', (p, id, amount, _source) => {
    expect(e.periods[p].versionId).toBe(id);
    expect(e.periods[p].total).toBeCloseTo(amount, 6);
  });

  it('totals over versions', () => {
    expect(e.total).toBeCloseTo(1250, 6);
    expect(e.byRule).toEqual([{ ruleId: 'bd', ruleLabel: 'PF-adjusted billing demand', total: expect.closeTo(1250, 6) }]);
  });

  it('says so when no version is in force', () => {
    const late = evaluateTariffVersions([version('v2', '2025-03-01', 20)], series, periods);
    expect(late.periods.map((p) => p.versionId)).toEqual([null, null, 'v2', 'v2']);
    expect(late.periods[0].warnings[0]).toMatch(/No tariff version/);
    // Without January and February evaluated, March has no ratchet floor: (112.5 - 100) x $20.
    expect(late.periods[2].total).toBeCloseTo(250, 6);
  });
});
