import { describe, expect, it } from 'vitest';
import { apparentKva, combineLoads, powerFactor, tanPhi, truePowerFactor } from '../../../../src/lib/domain';

describe('tan(acos(pf)): allowance factors k', () => {
  it.each([
    // pf, k, decimals, source
    [0.9, 0.4843, 4, 'common practice (k for 0.90); tan(acos 0.90) = 0.43589/0.90'],
    [0.95, 0.3287, 4, 'common practice (k for 0.95); tan(acos 0.95) = 0.31225/0.95'],
    [0.8, 0.75, 6, 'common practice: 3-4-5 triangle, PF 0.80 -> 0.75 kvar per kW'],
    [1, 0, 9, 'common practice: unity PF draws no kvar'],
  ])('PF %s -> k %s', (pf, k, decimals) => {
    expect(tanPhi(pf)).toBeCloseTo(k, decimals);
  });

  it('rejects a PF outside (0, 1] instead of returning NaN', () => {
    expect(() => tanPhi(0)).toThrow(RangeError);
    expect(() => tanPhi(1.2)).toThrow(RangeError);
  });
});

describe('power triangle of one reading', () => {
  it.each([
    // kW, kvar, kVA, PF, source
    [1000, 750, 1250, 0.8, 'worked example, kvar demand charge (1000 kW, 750 kvar -> 1250 kVA, PF 0.800)'],
    [300, 400, 500, 0.6, 'common practice: 3-4-5 triangle'],
    [120, -50, 130, 120 / 130, 'common practice: 5-12-13 triangle, leading kvar gives the same magnitude'],
  ])('%s kW, %s kvar', (kw, kvar, kva, pf) => {
    expect(apparentKva(kw, kvar)).toBeCloseTo(kva, 9);
    expect(powerFactor(kw, kvar)).toBeCloseTo(pf, 9);
  });

  it.each([
    [0, 10, 'common practice: a zero-kW interval has no PF'],
    [-40, 10, 'IEC quadrants, common practice: export (Q2/Q3) gives no consumer PF'],
  ])('no PF for %s kW (%s)', (kw, kvar) => {
    expect(powerFactor(kw, kvar)).toBeNull();
  });
});

describe('vector addition of loads', () => {
  // worked example: 20 kW at PF 1, 100 kW at 0.707 leading, 50 kW at 0.90 lagging
  // -> 170 kW, -75.8 kvar, 186 kVA, PF 0.913 leading.
  const total = combineLoads([
    { kw: 20, pf: 1, sense: 'lag' },
    { kw: 100, pf: 0.707, sense: 'lead' },
    { kw: 50, pf: 0.9, sense: 'lag' },
  ]);
  it.each([
    ['kw', total.kw, 170, 6, 'worked example, vector addition of three loads'],
    ['kvar', total.kvar, -75.8, 1, 'worked example, vector addition of three loads (leading sign)'],
    ['kva', total.kva, 186, 0, 'worked example, vector addition of three loads'],
    ['pf', total.pf ?? Number.NaN, 0.913, 3, 'worked example, vector addition of three loads'],
  ])('%s', (_name, actual, expected, decimals) => {
    expect(actual).toBeCloseTo(expected, decimals);
  });
  it('is leading (worked example: PF 0.913 leading)', () => {
    expect(total.sense).toBe('lead');
  });
});

describe('true PF with harmonic current', () => {
  it.each([
    // PF1, THD_I, true PF, source
    [0.95, 0.3, 0.95 / Math.sqrt(1.09), 'IEEE Std 1459-2010 definitions: PF ~ PF1 / sqrt(1 + THD^2), hand-computed 0.9099'],
    [1.0, 0.8, 1 / Math.sqrt(1.64), 'IEEE Std 1459-2010 definitions: near-unity displacement drive with 80 % THD -> 0.781'],
    [0.9, 0, 0.9, 'IEEE Std 1459-2010 definitions: no distortion, true PF = displacement PF'],
  ])('PF1 %s, THD %s', (pf1, thd, expected) => {
    expect(truePowerFactor(pf1, thd)).toBeCloseTo(expected, 6);
  });
  it('0.95 displacement with 30 % THD is about 0.910 (hand-computed from IEEE Std 1459 definitions)', () => {
    expect(truePowerFactor(0.95, 0.3)).toBeCloseTo(0.9099, 4);
  });
});
