/** The demo generator: deterministic, readable by the importer with its own mapping, and usable by the engine. */
import { describe, expect, it } from 'vitest';
import { buildSeries } from '@/lib/domain/series/build-series';
import { MeterMappingSchema, parseBillCsv, parseMeterCsv, proposeMapping, textChunks } from '@/lib/import';
import {
  DEMO_METER_SITES,
  demoBillCsv,
  demoBillMapping,
  demoBills,
  demoIntervals,
  demoMeterCsv,
  demoMeterMapping,
  demoMeterSite,
  KESTREL_MISBILLED_INDEX,
  TARN_VALLEY_MULTIPLIER_ERROR,
} from '@/lib/demo/meter-csv.ts';

const imported = new Map<string, Awaited<ReturnType<typeof parseMeterCsv>>>();
async function importSite(site: (typeof DEMO_METER_SITES)[number]) {
  if (!imported.has(site)) imported.set(site, await parseMeterCsv(textChunks(demoMeterCsv(site)), demoMeterMapping(site)));
  return imported.get(site)!;
}

describe('demo meter data', () => {
  it('is the same text on every run (seeded, no clock)', () => {
    expect(demoMeterCsv('kestrel-bay')).toBe(demoMeterCsv('kestrel-bay'));
    expect(demoMeterCsv('brackwater').slice(0, 2000)).not.toBe(demoMeterCsv('kestrel-bay').slice(0, 2000));
  });

  // A 2025 year has 365 days: 35,040 quarter-hours and 17,520 half-hours (common practice).
  it.each([
    ['brackwater', 15, 35_040],
    ['tarn-valley', 30, 17_520],
    ['kestrel-bay', 15, 35_040],
  ] as const)('%s imports with its mapping: %s-minute, %s intervals, no gaps', async (site, minutes, n) => {
    const r = await importSite(site);
    if (!r.ok) throw new Error(JSON.stringify(r.problems.slice(0, 3)));
    const q = r.meters[0].quality;
    expect(q.intervalMinutes).toBe(minutes);
    expect(q.intervals).toEqual({ expected: n, present: n, missing: 0 });
    expect(q.gaps.count).toBe(0);
    expect(buildSeries(r.meters[0].series).ok).toBe(true);
  });

  it('imports the same energies it generated', async () => {
    const truth = demoIntervals('brackwater');
    const r = await importSite('brackwater');
    if (!r.ok) throw new Error('import failed');
    const s = r.meters[0].series;
    expect(Array.from(s.stamps).slice(0, 3)).toEqual(Array.from(truth.startMs.slice(0, 3)));
    let diff = 0;
    for (let i = 0; i < truth.kwh.length; i++) diff = Math.max(diff, Math.abs(s.active[i] - truth.kwh[i]));
    expect(diff).toBeLessThan(1e-9);
  });

  it('Tarn Valley: local time through both clock changes, 46 and 50 half-hours (common practice)', async () => {
    const r = await importSite('tarn-valley');
    if (!r.ok) throw new Error('import failed');
    const t = r.meters[0].quality.timestamps;
    expect(t.dstDays.map((d) => [d.localDate, d.hours, d.presentIntervals])).toEqual([
      ['2025-03-30', 23, 46],
      ['2025-10-26', 25, 50],
    ]);
    expect(t.repeatedHour).toMatchObject({ stamps: 4, readAsEarlierOffset: 2, readAsLaterOffset: 2 });
    expect(demoMeterCsv('tarn-valley')).toContain(';24:00;');
  });

  it('Kestrel Bay: solar export at midday and net signed kvarh', async () => {
    const r = await importSite('kestrel-bay');
    if (!r.ok) throw new Error('import failed');
    const q = r.meters[0].quality;
    expect(q.active.export.count).toBeGreaterThan(100);
    expect(q.reactive.netOnly).toBe(true);
    const csv = demoMeterCsv('kestrel-bay');
    expect(csv).toMatch(/T1[12]:\d\d:00\+1[01]:00,-\d/);
  });

  it('Brackwater: leading kvarh on light-load intervals', async () => {
    const r = await importSite('brackwater');
    if (!r.ok) throw new Error('import failed');
    expect(r.meters[0].quality.reactive.totalLeadKvarh).toBeGreaterThan(0);
  });
});

describe('proposals for the demo exports', () => {
  it.each(DEMO_METER_SITES)('%s: the proposal from the first 8 KB equals the demo mapping (meter name aside)', (site) => {
    const head = demoMeterCsv(site).slice(0, 8192);
    const zone = demoMeterSite(site).timeZone;
    const first = proposeMapping(head, { timeZone: zone });
    // Tarn Valley's first days are 01/01 to 03/01: day-first and month-first both fit, so it must ask.
    expect(first.needs.map((n) => n.field)).toEqual(site === 'tarn-valley' ? ['timestamp.dateOrder'] : []);
    const p = site === 'tarn-valley' ? proposeMapping(head, { timeZone: zone, dateOrder: 'dmy' }) : first;
    const want = MeterMappingSchema.parse(demoMeterMapping(site));
    const strip = (m: typeof want) => ({ ...m, meters: m.meters.map(({ meterId: _id, ...rest }) => rest) });
    expect(p.mapping && strip(p.mapping)).toEqual(strip(want));
  });
});

describe('demo bills', () => {
  it.each(DEMO_METER_SITES)('%s: twelve bills on reading dates, not calendar months, contiguous', async (site) => {
    const bills = demoBills(site);
    expect(bills).toHaveLength(12);
    const calendarMonth = (b: (typeof bills)[number]) => b.periodStart.endsWith('-01') && new Date(Date.parse(`${b.periodEnd}T00:00:00Z`) + 86_400_000).getUTCDate() === 1;
    expect(bills.filter(calendarMonth)).toEqual([]);
    expect(bills.filter((b) => b.periodStart.endsWith('-01')).length).toBeLessThanOrEqual(1);
    const r = await parseBillCsv([demoBillCsv(site)], demoBillMapping(site));
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    expect(r.warnings).toEqual([]);
    expect(r.bills.map((b) => b.kwh)).toEqual(bills.map((b) => b.kwh));
    expect(r.bills.map((b) => b.powerFactor)).toEqual(bills.map((b) => b.powerFactor));
  });

  it('monthly average PF of each plant lies between 0.78 and 0.90 lagging (design target of the demo plants)', () => {
    for (const site of DEMO_METER_SITES) {
      for (const b of demoBills(site)) {
        expect(b.powerFactor).toBeGreaterThanOrEqual(0.78);
        expect(b.powerFactor).toBeLessThanOrEqual(0.9);
      }
    }
  });

  it('Tarn Valley bills a steady 1.25 x the interval kWh (the planted multiplier error)', () => {
    for (const b of demoBills('tarn-valley')) expect(b.kwh / b.intervalKwh).toBeCloseTo(TARN_VALLEY_MULTIPLIER_ERROR, 3);
    for (const b of demoBills('brackwater')) expect(b.kwh / b.intervalKwh).toBeCloseTo(1, 3);
  });

  it('Kestrel Bay marks one mis-billed PF charge and passes it to the charge calculator', () => {
    const bills = demoBills('kestrel-bay');
    expect(bills.filter((b) => b.misbilledPfCharge).map((b) => b.index)).toEqual([KESTREL_MISBILLED_INDEX]);
    const csv = demoBillCsv('kestrel-bay', (b) => ({ pfCharge: b.misbilledPfCharge ? 999 : 10, total: 100 }));
    expect(csv.split('\n').filter((l) => l.includes(',999.00,'))).toHaveLength(1);
  });
});
