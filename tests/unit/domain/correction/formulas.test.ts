import { describe, expect, it } from 'vitest';
import { correctedPf, economicPf, kvarPerKwMultiplier, kvarToCorrect, lossReduction, releasedCapacityKva, voltageScale } from '../../../../src/lib/domain';

describe('kvar-per-kW multiplier table', () => {
  // Printed tables subtract rounded tangents, so compare to 0.001.
  it.each([
    [0.8, 0.95, 0.421, 'IEEE Std 141 ch. 8 multiplier table (0.80 -> 0.95)'],
    [0.7, 0.9, 0.536, 'IEEE Std 141 ch. 8 multiplier table (0.70 -> 0.90)'],
    [0.85, 1.0, 0.62, 'IEEE Std 141 ch. 8 multiplier table (0.85 -> 1.00)'],
    [0.65, 0.9, 0.685, 'IEEE Std 141 ch. 8 multiplier table (0.65 -> 0.90)'],
    [0.65, 1.0, 1.169, 'IEEE Std 141 ch. 8 multiplier table (0.65 -> 1.00)'],
    [0.5, 1.0, 1.732, 'IEEE Std 141 ch. 8 multiplier table (0.50 -> 1.00)'],
    [0.6, 0.95, 1.004, 'IEEE Std 141 ch. 8 multiplier table (0.60 -> 0.95, printed 1.00)'],
  ])('%s -> %s: %s', (from, to, printed) => {
    expect(Math.abs(kvarPerKwMultiplier(from, to) - printed)).toBeLessThanOrEqual(0.001);
  });

  it('0.60 -> 0.95 exact value is 1.00465 (IEEE Std 141 ch. 8 table with exact tangents: tan(acos .60) = 4/3 minus tan(acos .95))', () => {
    expect(kvarPerKwMultiplier(0.6, 0.95)).toBeCloseTo(1.00465, 5);
  });
});

describe('Qc = P (tan phi1 - tan phi2)', () => {
  it.each([
    [620, 0.65, 0.9, 424.6, 1, 'worked example: 620 kW from 0.65 to 0.90 -> 424.6 kvar'],
    [1000, 0.8, 0.95, 421.3, 1, 'IEEE Std 141 ch. 8 multiplier 0.421 x 1000 kW (exact 421.32)'],
  ])('%s kW from %s to %s', (kw, from, to, kvar, decimals) => {
    expect(kvarToCorrect(kw, from, to)).toBeCloseTo(kvar, decimals);
  });
  it('the table multiplier 0.685 gives 425 kvar for 620 kW (worked example)', () => {
    expect(Math.round(620 * 0.685)).toBe(425);
    expect(Math.round(kvarToCorrect(620, 0.65, 0.9))).toBe(425);
  });
});

describe('corrected PF of a constant load matches the formula', () => {
  it.each([
    // kW, PF before, PF after, source
    [500, 0.8, 0.95, 'IEEE Std 141 ch. 8: adding Qc = P(tan phi1 - tan phi2) lands exactly on PF2'],
    [620, 0.65, 0.9, 'worked example, 620 kW from 0.65 to 0.90'],
    [80, 0.7, 1.0, 'common practice: full compensation to unity'],
  ])('%s kW from %s to %s', (kw, from, to) => {
    const q = kw * Math.sqrt(1 - from * from) / from;
    expect(correctedPf(kw, q, kvarToCorrect(kw, from, to))).toBeCloseTo(to, 9);
  });
});

describe('other benefits', () => {
  it.each([
    [0.8, 0.95, 0.2909, 'common practice: line-loss reduction 1 - (PF1/PF2)^2, 0.80 -> 0.95 = 29.09 %'],
    [0.78, 0.98, 0.3665, 'common practice: line-loss reduction 1 - (PF1/PF2)^2, 0.78 -> 0.98 = 36.65 %'],
  ])('loss reduction %s -> %s', (from, to, share) => {
    expect(lossReduction(from, to)).toBeCloseTo(share, 4);
  });
  it('released capacity 1000 kW, 0.80 -> 0.95 = 197.4 kVA (common practice: kW/PF1 - kW/PF2)', () => {
    expect(releasedCapacityKva(1000, 0.8, 0.95)).toBeCloseTo(197.4, 1);
  });
  it.each([
    [0.375, 1, 0.927, 'textbook derivation: sin phi2 = y/x = 0.375 -> PF 0.927'],
    [0.6, 1, 0.8, 'common practice: sin phi 0.6 is the 3-4-5 triangle, PF 0.80'],
  ])('economic PF at y/x = %s', (y, x, pf) => {
    expect(economicPf(y, x)).toBeCloseTo(pf, 3);
  });
  it('no economic PF when capacitors cost as much as the kVA they save (textbook derivation: sin phi2 >= 1)', () => {
    expect(economicPf(2, 1)).toBeNull();
  });
});

describe('capacitor output scales with voltage squared', () => {
  it.each([
    [480, 480, 1, 'common practice: at rated voltage the bank delivers rated kvar'],
    [460, 480, 0.9184, 'common practice: (460/480)^2 = 0.9184'],
    [415, 440, 0.8896, 'common practice: (415/440)^2 = 0.8896'],
  ])('%s V on a %s V bank', (v, vr, scale) => {
    expect(voltageScale(v, vr)).toBeCloseTo(scale, 4);
  });
  it('no scaling when voltages are not given', () => {
    expect(voltageScale(undefined, 480)).toBe(1);
  });
});
