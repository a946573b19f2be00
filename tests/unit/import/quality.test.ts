/** Quality report counts and rules on small in-memory files. */
import { describe, expect, it } from 'vitest';
import { parseMeterCsv, type MeterMappingInput } from '@/lib/import';
import { percentile } from '@/lib/import/quality';

const Q = 15 * 60_000;
const T0 = Date.UTC(2025, 0, 6); // Monday
const iso = (ms: number) => new Date(ms).toISOString().slice(0, 19) + 'Z';
const mapping = (reactive: MeterMappingInput['meters'][number]['reactive'] = { kind: 'net', column: 'kvarh', unit: 'kvarh' }): MeterMappingInput => ({
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  timestamp: { column: 'start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'X', active: { column: 'kWh', unit: 'kWh' }, reactive }],
});

async function run(rows: [number, string | number, string | number][], m = mapping(), options = {}) {
  const text = ['start,kWh,kvarh', ...rows.map(([k, p, q]) => `${iso(T0 + k * Q)},${p},${q}`)].join('\n');
  const r = await parseMeterCsv([text], m, options);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.meters[0];
}

describe('quality report', () => {
  it('computes the period average PF from energy totals, never from interval PFs (common practice)', async () => {
    // 10,000 kWh and 6,000 kvarh -> 10000 / sqrt(10000^2 + 6000^2) = 0.8575 (domain check value).
    const m = await run([[0, 5000, 1000], [1, 5000, 5000]]);
    expect(m.quality.pf.averageLagging).toBeCloseTo(0.8575, 4);
  });

  it('lists gaps with their missing interval counts', async () => {
    const m = await run([[0, 1, 1], [1, 1, 1], [5, 1, 1], [6, 1, 1], [10, 1, 1]]);
    expect(m.quality.gaps.count).toBe(2);
    expect(m.quality.gaps.missingIntervals).toBe(6);
    expect(m.quality.intervals).toEqual({ expected: 11, present: 5, missing: 6 });
    expect(m.quality.gaps.first.map((g) => [g.afterRow, g.beforeRow, g.missingIntervals])).toEqual([[3, 4, 3], [5, 6, 3]]);
  });

  it('counts export, zero and missing active readings separately', async () => {
    const m = await run([[0, 5, 1], [1, -2, 1], [2, 0, 0], [3, '', 1], [4, 5, 1]]);
    expect(m.quality.active.export).toEqual({ count: 1, firstRows: [3] });
    expect(m.quality.active.zero).toEqual({ count: 1, firstRows: [4] });
    expect(m.quality.active.missing).toEqual({ count: 1, firstRows: [5] });
    expect(Number.isNaN(m.series.active[3])).toBe(true);
  });

  it('states the spike rule and applies it (5 x the 99th percentile)', async () => {
    const rows: [number, number, number][] = Array.from({ length: 200 }, (_, k) => [k, 10, 3]);
    rows[120] = [120, 51, 3];
    rows[121] = [121, 49, 3];
    const m = await run(rows);
    expect(m.quality.active.spikes.thresholdKwh).toBe(50);
    expect(m.quality.active.spikes.firstRows).toEqual([122]);
    expect(m.quality.active.spikes.rule).toContain('99th');
  });

  it('keeps missing reactive readings as missing, in ranges', async () => {
    const m = await run([[0, 5, 1], [1, 5, ''], [2, 5, ''], [3, 5, 1], [4, 5, '']], mapping());
    expect(m.quality.reactive.missing.count).toBe(3);
    expect(m.quality.reactive.missing.ranges.map((r) => [r.fromRow, r.toRow, r.intervals])).toEqual([[3, 4, 2], [6, 6, 1]]);
    expect(m.series.reactive.kind).toBe('net');
    if (m.series.reactive.kind === 'net') expect(Number.isNaN(m.series.reactive.net[1])).toBe(true);
  });

  it('flags PF below 0.3 and kvarh with zero kWh', async () => {
    const m = await run([[0, 1, 4], [1, 0, 2], [2, 10, 3]]);
    expect(m.quality.pf.implausible.firstRows).toEqual([2]);
    expect(m.quality.pf.kvarWithZeroKw.firstRows).toEqual([3]);
  });

  it('counts the 92 and 100 quarter-hours of clock-change days even for UTC stamps (common practice)', async () => {
    // America/Chicago 2025: clocks forward 9 March (23 h), back 2 November (25 h); tz database.
    const m1 = Date.UTC(2025, 2, 9, 6);
    const rows = Array.from({ length: 92 }, (_, k) => `${iso(m1 + k * Q)},1,1`);
    const r = await parseMeterCsv([['start,kWh,kvarh', ...rows].join('\n')], mapping(), { siteTimeZone: 'America/Chicago' });
    if (!r.ok) throw new Error('parse failed');
    expect(r.meters[0].quality.timestamps.dstDays).toEqual([{ localDate: '2025-03-09', kind: 'clocks-forward', hours: 23, expectedIntervals: 92, presentIntervals: 92 }]);
  });

  it('applies a meter multiplier and unit factors to every channel', async () => {
    const m = mapping({ kind: 'net', column: 'kvarh', unit: 'varh' });
    m.meters[0].active.unit = 'Wh';
    m.meters[0].multiplier = 640;
    const r = await run([[0, 500, 250], [1, 500, 250]], m);
    expect(Array.from(r.series.active)).toEqual([320, 320]);
    expect(r.quality.reactive.totalLagKvarh).toBe(320);
  });

  it('converts kW demand to kWh with the detected interval', async () => {
    const m = mapping();
    m.meters[0].active.unit = 'kW';
    const r = await run([[0, 100, 1], [1, 80, 1]], m);
    expect(Array.from(r.series.active)).toEqual([25, 20]);
    expect(r.series.activeUnit).toBe('kWh');
  });
});

describe('percentile (nearest rank at floor(p x (n - 1)))', () => {
  it.each([
    [[5, 1, 4, 2, 3], 0.5, 3],
    [[5, 1, 4, 2, 3], 0, 1],
    [[5, 1, 4, 2, 3], 1, 5],
    [Array.from({ length: 101 }, (_, i) => 100 - i), 0.99, 99],
  ])('%j at %s -> %s', (values, p, v) => {
    expect(percentile(Float64Array.from(values), p)).toBe(v);
  });
});
