/**
 * Every catalogued fixture through the importer, whole and in 13-byte chunks (stream
 * boundaries inside fields, CRLF pairs and multi-byte characters), against the outcome the
 * catalogue states. The web layer's integration tests assert the same outcomes over HTTP.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildSeries } from '@/lib/domain/series/build-series';
import { parseBillCsv, parseMeterCsv, proposeMapping, type MeterImportResult } from '@/lib/import';

const ROOT = new URL('../../../', import.meta.url).pathname;
const catalogue = JSON.parse(readFileSync(`${ROOT}fixtures/meter-data/catalogue.json`, 'utf8'));

function* chunks(bytes: Uint8Array, size: number) {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

const METER_KEYS = new Set([
  'meterId', 'intervals', 'intervalMinutes', 'firstStartUtc', 'lastEndUtc', 'findingCodes', 'totalImportKwh', 'totalLagKvarh', 'totalLeadKvarh', 'totalExportKwh',
  'tolerance', 'duplicatesDropped', 'expectedIntervals', 'gaps', 'rowsOutOfOrder', 'dstDays', 'repeatedHourStamps', 'readAsEarlierOffset', 'leadingIntervals',
  'exportIntervals', 'exportFirstRows', 'reactiveMissing', 'reactiveMissingRanges', 'spikeRows', 'implausiblePfRows', 'kvarWithZeroKwRows',
]);

function checkMeterOutcome(result: MeterImportResult, expected: Record<string, any>) {
  if (!expected.ok) {
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect([...new Set(result.problems.map((p) => p.code))].sort()).toEqual([...expected.problemCodes].sort());
    expect(result.problems[0].row).toBe(expected.firstProblemRow);
    expect(result.totalProblems).toBe(expected.totalProblems);
    expect(result.problems.length).toBe(expected.listedProblems ?? expected.totalProblems);
    for (const p of result.problems) expect(p.message.length).toBeGreaterThan(20);
    return;
  }
  if (!result.ok) throw new Error(`expected ok, got ${JSON.stringify(result.problems.slice(0, 3))}`);
  expect(result.meters.map((m) => m.meterId)).toEqual(expected.meters.map((m: any) => m.meterId));
  result.meters.forEach((m, i) => {
    const e = expected.meters[i];
    for (const k of Object.keys(e)) expect(METER_KEYS.has(k), `unknown expectation key ${k}`).toBe(true);
    const q = m.quality;
    // The output feeds the engine as it is.
    expect(buildSeries(m.series).ok).toBe(true);
    const tol = e.tolerance ?? 1e-6;
    expect(m.series.stamps.length).toBe(e.intervals);
    expect(q.intervals.present).toBe(e.intervals);
    expect(m.series.intervalMinutes).toBe(e.intervalMinutes);
    expect(q.period.firstStartUtc).toBe(e.firstStartUtc);
    expect(q.period.lastEndUtc).toBe(e.lastEndUtc);
    expect(q.findings.map((f) => f.code).sort()).toEqual([...e.findingCodes].sort());
    const close = (actual: number, wanted: number | undefined) => wanted === undefined || expect(Math.abs(actual - wanted)).toBeLessThanOrEqual(tol);
    close(q.active.totalImportKwh, e.totalImportKwh);
    close(q.reactive.totalLagKvarh, e.totalLagKvarh);
    close(q.reactive.totalLeadKvarh, e.totalLeadKvarh);
    close(q.active.totalExportKwh, e.totalExportKwh);
    if (e.duplicatesDropped !== undefined) expect(q.duplicates.identicalDropped).toBe(e.duplicatesDropped);
    if (e.expectedIntervals !== undefined) expect(q.intervals.expected).toBe(e.expectedIntervals);
    if (e.gaps !== undefined) expect(q.gaps.first).toEqual(e.gaps);
    if (e.rowsOutOfOrder !== undefined) expect(q.rowsOutOfOrder).toBe(e.rowsOutOfOrder);
    if (e.dstDays !== undefined) expect(q.timestamps.dstDays).toEqual(e.dstDays);
    if (e.repeatedHourStamps !== undefined) expect(q.timestamps.repeatedHour.stamps).toBe(e.repeatedHourStamps);
    if (e.readAsEarlierOffset !== undefined) expect(q.timestamps.repeatedHour.readAsEarlierOffset).toBe(e.readAsEarlierOffset);
    if (e.leadingIntervals !== undefined) expect(q.reactive.leadingIntervals).toBe(e.leadingIntervals);
    if (e.exportIntervals !== undefined) expect(q.active.export.count).toBe(e.exportIntervals);
    if (e.exportFirstRows !== undefined) expect(q.active.export.firstRows).toEqual(e.exportFirstRows);
    if (e.reactiveMissing !== undefined) expect(q.reactive.missing.count).toBe(e.reactiveMissing);
    if (e.reactiveMissingRanges !== undefined) expect(q.reactive.missing.ranges).toEqual(e.reactiveMissingRanges);
    if (e.spikeRows !== undefined) expect(q.active.spikes.firstRows).toEqual(e.spikeRows);
    if (e.implausiblePfRows !== undefined) expect(q.pf.implausible.firstRows).toEqual(e.implausiblePfRows);
    if (e.kvarWithZeroKwRows !== undefined) expect(q.pf.kvarWithZeroKw.firstRows).toEqual(e.kvarWithZeroKwRows);
  });
}

describe('fixture catalogue', () => {
  it('lists at least 25 meter files, each present on disk and small', () => {
    expect(catalogue.meterFiles.length).toBeGreaterThanOrEqual(25);
    for (const f of catalogue.meterFiles) expect(readFileSync(`${ROOT}${f.file}`).byteLength).toBeLessThan(16_384);
  });

  describe.each(catalogue.meterFiles.map((f: any) => [f.file, f]) as [string, any][])('%s', (_name, entry) => {
    const bytes = new Uint8Array(readFileSync(`${ROOT}${entry.file}`));
    it('gives the catalogued outcome read whole', async () => {
      checkMeterOutcome(await parseMeterCsv([bytes], entry.mapping), entry.expect);
    });
    it('gives the same outcome read in 13-byte chunks', async () => {
      checkMeterOutcome(await parseMeterCsv(chunks(bytes, 13), entry.mapping), entry.expect);
    });
    if (entry.proposal) {
      it('gets the catalogued mapping proposal', () => {
        const p = proposeMapping(new TextDecoder().decode(bytes), { timeZone: entry.mapping.timestamp.timeZone });
        const e = entry.proposal;
        const d = p.draft;
        if (e.delimiter !== undefined) expect(d.delimiter).toBe(e.delimiter);
        if (e.decimalSeparator !== undefined) expect(d.decimalSeparator).toBe(e.decimalSeparator);
        if (e.needs !== undefined) expect(p.needs.map((n) => n.field)).toEqual(e.needs);
        if (e.dateOrder !== undefined) expect(d.timestamp?.dateOrder).toBe(e.dateOrder);
        if (e.zone !== undefined) expect(d.timestamp?.zone).toBe(e.zone);
        if (e.skipRows !== undefined) expect(d.skipRows).toBe(e.skipRows);
        if (e.hasHeader !== undefined) expect(d.hasHeader).toBe(e.hasHeader);
        if (e.skipRowsAfterHeader !== undefined) expect(d.skipRowsAfterHeader).toBe(e.skipRowsAfterHeader);
        if (e.meterIdColumn !== undefined) expect(d.meterIdColumn).toBe(e.meterIdColumn);
        if (e.meters !== undefined) expect(d.meters?.map((m) => m.meterId)).toEqual(e.meters);
        if (e.activeUnit !== undefined) expect(d.meters?.[0].active.unit).toBe(e.activeUnit);
        if (e.reactiveUnit !== undefined) expect((d.meters?.[0].reactive as { unit?: string }).unit).toBe(e.reactiveUnit);
        if (e.reactiveKind !== undefined) expect(d.meters?.[0].reactive.kind).toBe(e.reactiveKind);
      });
    }
  });

  describe.each(catalogue.billFiles.map((f: any) => [f.file, f]) as [string, any][])('%s', (_name, entry) => {
    it('gives the catalogued outcome', async () => {
      const r = await parseBillCsv([new Uint8Array(readFileSync(`${ROOT}${entry.file}`))], entry.mapping);
      const e = entry.expect;
      if (!e.ok) {
        expect(r.ok).toBe(false);
        if (r.ok) return;
        expect([...new Set(r.problems.map((p) => p.code))].sort()).toEqual([...e.problemCodes].sort());
        expect(r.problems[0].row).toBe(e.firstProblemRow);
        expect(r.totalProblems).toBe(e.totalProblems);
        return;
      }
      if (!r.ok) throw new Error(JSON.stringify(r.problems));
      expect(r.bills.length).toBe(e.bills);
      expect(r.warnings.map((w) => w.code)).toEqual(e.warnings);
      if (e.firstPeriod) expect([r.bills[0].periodStart, r.bills[0].periodEnd]).toEqual(e.firstPeriod);
      if (e.firstKwh !== undefined) expect(r.bills[0].kwh).toBe(e.firstKwh);
      if (e.firstDemand !== undefined) expect(r.bills[0].billedDemand).toBe(e.firstDemand);
      if (e.firstPfCharge !== undefined) expect(r.bills[0].pfCharge).toBe(e.firstPfCharge);
    });
  });
});
