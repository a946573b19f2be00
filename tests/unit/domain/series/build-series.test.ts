import { describe, expect, it } from 'vitest';
import { buildSeries, SeriesFlag } from '../../../../src/lib/domain';

const T0 = Date.UTC(2025, 0, 6);
const Q = 15 * 60_000;

describe('building a series', () => {
  it('splits a net signed kvarh channel by sign (common practice: Q1 lagging +, Q4 leading -)', () => {
    const r = buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + Q], active: [10, 10], reactive: { kind: 'net', net: [5, -3] } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(Array.from(r.value.kvarhLag)).toEqual([5, 0]);
    expect(Array.from(r.value.kvarhLead)).toEqual([0, 3]);
    expect(r.value.reactiveSource).toBe('net');
    expect(r.warnings.map((w) => w.code)).toContain('reactive-net-only');
  });

  it.each<['kW' | 'kWh', number, number, string]>([
    ['kW', 100, 25, 'common practice: kWh = kW x T/60, 100 kW for 15 min = 25 kWh'],
    ['kWh', 25, 25, 'energy passes through'],
  ])('active unit %s', (unit, value, kwh) => {
    const r = buildSeries({ intervalMinutes: 15, stamps: [T0], active: [value], activeUnit: unit, reactive: { kind: 'none' } });
    expect(r.ok && r.value.kwh[0]).toBe(kwh);
  });

  it('shifts interval-ending stamps back by one interval (common practice)', () => {
    const r = buildSeries({ intervalMinutes: 30, stamps: [T0 + 30 * 60_000], stampAt: 'end', active: [1], reactive: { kind: 'none' } });
    expect(r.ok && r.value.startMs[0]).toBe(T0);
  });

  it('flags a missing reactive value and reports it, never fills it (common practice)', () => {
    const r = buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + Q], active: [10, 10], reactive: { kind: 'registers', lag: [4, Number.NaN], lead: [0, 0] } });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.flags[1] & SeriesFlag.reactiveMissing).toBe(SeriesFlag.reactiveMissing);
    expect(r.value.flags[0]).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain('reactive-missing');
  });

  it('drops an interval without kW and says so', () => {
    const r = buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + Q, T0 + 2 * Q], active: [1, Number.NaN, 3], reactive: { kind: 'none' } });
    expect(r.ok && Array.from(r.value.kwh)).toEqual([1, 3]);
    expect(r.warnings.map((w) => w.code)).toContain('active-missing');
  });

  it.each([
    [[T0, T0], 'stamps-not-increasing', 'duplicate row'],
    [[T0 + Q, T0], 'stamps-not-increasing', 'unsorted rows'],
    [[T0, T0 + 60_000], 'stamps-not-increasing', 'rows closer than one interval'],
  ])('rejects %j as %s (%s)', (stamps, code) => {
    const r = buildSeries({ intervalMinutes: 15, stamps, active: [1, 1], reactive: { kind: 'none' } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].code).toBe(code);
  });

  it('rejects negative register values and mismatched lengths', () => {
    const neg = buildSeries({ intervalMinutes: 15, stamps: [T0], active: [1], reactive: { kind: 'registers', lag: [-1], lead: [0] } });
    expect(!neg.ok && neg.errors[0].code).toBe('register-negative');
    const len = buildSeries({ intervalMinutes: 15, stamps: [T0, T0 + Q], active: [1], reactive: { kind: 'none' } });
    expect(!len.ok && len.errors[0].code).toBe('length-mismatch');
  });
});
