/** Unit factors, header units, the meter multiplier and the number reader. */
import { describe, expect, it } from 'vitest';
import { meterMultiplier, unitFromHeader, unitInfo } from '@/lib/import/units';
import { numberReader } from '@/lib/import/numbers';

describe('unitInfo (SI prefixes: k = 10^3, M = 10^6)', () => {
  it.each([
    ['Wh', 0.001, 'energy'],
    ['kWh', 1, 'energy'],
    ['MWh', 1000, 'energy'],
    ['W', 0.001, 'demand'],
    ['MW', 1000, 'demand'],
    ['varh', 0.001, 'energy'],
    ['Mvarh', 1000, 'energy'],
    ['kvar', 1, 'demand'],
    ['kVA', 1, 'demand'],
    ['VAh', 0.001, 'energy'],
  ])('%s -> x%s (%s)', (unit, factor, kind) => {
    expect(unitInfo(unit)).toEqual({ toKilo: factor, kind });
  });
});

describe('meterMultiplier = CT ratio x PT ratio (common practice)', () => {
  it.each([
    ['800:5', '480:120', 640],
    ['200/5', '1:1', 40],
    ['1000:5', '11000:110', 20_000],
  ])('%s and %s -> %s', (ct, pt, m) => {
    expect(meterMultiplier(ct, pt)).toBe(m);
  });
  it('refuses an unreadable ratio', () => {
    expect(meterMultiplier('800-5')).toBeNull();
    expect(meterMultiplier('0:5')).toBeNull();
  });
});

describe('unitFromHeader', () => {
  it.each([
    ['Energy (MWh)', 'MWh', 'active'],
    ['kvarh_lag', 'kvarh', 'reactive'],
    ['Demand [W]', 'W', 'active'],
    ['Reactive (varh)', 'varh', 'reactive'],
    ['Apparent kVA', 'kVA', 'apparent'],
    ['Mvarh import', 'Mvarh', 'reactive'],
    ['KWH', 'kWh', 'active'],
  ])('%s -> %s', (header, unit, family) => {
    expect(unitFromHeader(header)).toMatchObject({ unit, family });
  });
  it.each(['Interval start', 'Wind speed', 'Value', 'Meter ID', 'Power factor'])('%s has no unit', (header) => {
    expect(unitFromHeader(header)).toBeNull();
  });
});

describe('numberReader', () => {
  const dot = numberReader('.', ['']);
  const comma = numberReader(',', ['', '-']);
  it.each([
    ['12.5', 12.5],
    ['-0.25', -0.25],
    ['+3', 3],
    ['0', 0],
    [' 7.75 ', 7.75],
    ['1e3', 1000],
    ['.5', 0.5],
    ['"42.1"', 42.1],
    ['123456789.123456', 123456789.123456],
  ])('point: %s -> %s', (text, v) => {
    expect(dot(text)).toBe(v);
  });
  it.each(['12,5', 'n/a', '0x10', 'Infinity', '1.2.3', '--1', '1,234.5'])('point refuses %s', (text) => {
    expect(dot(text)).toBeNull();
  });
  it('reads the empty cell as a missing reading, not as zero', () => {
    expect(Number.isNaN(dot('') as number)).toBe(true);
    expect(Number.isNaN(dot('   ') as number)).toBe(true);
  });
  it.each([
    ['12,5', 12.5],
    ['-3,25', -3.25],
    ['7', 7],
  ])('comma: %s -> %s', (text, v) => {
    expect(comma(text)).toBe(v);
  });
  it('comma: refuses points and reads listed missing markers as missing', () => {
    expect(comma('12.5')).toBeNull();
    expect(comma('1,2,3')).toBeNull();
    expect(Number.isNaN(comma('-') as number)).toBe(true);
  });
  it('agrees with Number() on 20,000 generated decimals (IEEE 754 correct rounding)', () => {
    let seed = 11;
    let mismatches = 0;
    for (let k = 0; k < 20_000; k++) {
      seed = (seed * 1_103_515_245 + 12_345) >>> 0;
      const text = ((seed / 2 ** 32) * 10 ** (seed % 8)).toFixed(seed % 7);
      if (dot(text) !== Number(text)) mismatches++;
    }
    expect(mismatches).toBe(0);
  });
});
