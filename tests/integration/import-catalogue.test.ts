/**
 * Every catalogued fixture (invented files, fixtures/meter-data/catalogue.json) is uploaded
 * through the real HTTP endpoint into its own fresh site, and the outcome the catalogue
 * states is asserted: counts and interval length for good files, the problem codes, first
 * row and total for bad ones, and for bad ones that nothing at all was stored.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';

type MeterExpect = { ok: true; meters: { meterId: string; intervals: number; intervalMinutes: number; firstStartUtc?: string; lastEndUtc?: string; findingCodes?: string[] }[] } | { ok: false; problemCodes: string[]; firstProblemRow: number | null; totalProblems: number };
type Entry = { file: string; description: string; mapping: Record<string, unknown>; siteTimeZone?: string; expect: MeterExpect };
type BillEntry = { file: string; description: string; mapping: Record<string, unknown>; expect: { ok: boolean; bills?: number; warnings?: string[]; problemCodes?: string[]; firstProblemRow?: number } };
const catalogue = JSON.parse(readFileSync('fixtures/meter-data/catalogue.json', 'utf8')) as { meterFiles: Entry[]; billFiles: BillEntry[] };

let energy: Client;
let n = 0;
async function freshSite(zone = 'UTC') {
  const r = await energy.post('/api/sites', { name: `Catalogue ${++n} ${Date.now()}`, timeZone: zone });
  return r.json.site.id as string;
}

beforeAll(async () => {
  energy = await as(DEMO.energy);
});

describe('meter-data catalogue through the HTTP endpoint', () => {
  it('has at least 25 files', () => expect(catalogue.meterFiles.length).toBeGreaterThanOrEqual(25));

  it.each(catalogue.meterFiles.map((e) => [e.file.split('/').pop()!, e] as const))('%s', async (_name, e) => {
    const zone = e.siteTimeZone ?? ((e.mapping.timestamp as { timeZone?: string }).timeZone ?? 'UTC');
    const siteId = await freshSite(zone);
    const r = await uploadFile(energy, `/api/sites/${siteId}/meter-data`, { name: e.file.split('/').pop()!, content: readFileSync(e.file) }, { mapping: JSON.stringify(e.mapping) });
    const stored = await energy.get(`/api/sites/${siteId}/meter-data`);
    if (e.expect.ok) {
      expect(r.status, JSON.stringify(r.json?.error ?? r.json).slice(0, 500)).toBe(201);
      const quality = r.json.import.quality.meters as { meterId: string; intervals: { present: number }; intervalMinutes: number; findings: { code: string }[]; active: { missing: { count: number } } }[];
      for (const m of e.expect.meters) {
        const q = quality.find((x) => x.meterId === m.meterId)!;
        expect(q, m.meterId).toBeTruthy();
        expect(q.intervals.present).toBe(m.intervals);
        expect(q.intervalMinutes).toBe(m.intervalMinutes);
        if (m.findingCodes) expect(q.findings.map((f) => f.code).sort()).toEqual([...m.findingCodes].sort());
      }
      // Stored intervals: those present, less the ones without a kW reading (the engine drops and counts them).
      const missingKw = quality.reduce((s, q) => s + q.active.missing.count, 0);
      expect(r.json.import.intervals).toBe(e.expect.meters.reduce((s, m) => s + m.intervals, 0) - missingKw);
      expect(stored.json.meters.map((m: { name: string }) => m.name).sort()).toEqual(e.expect.meters.map((m) => m.meterId).sort());
    } else {
      expect(r.status, JSON.stringify(r.json).slice(0, 300)).toBe(422);
      const problems = r.json.error.problems as { code: string; row: number | null }[];
      expect([...new Set(problems.map((p) => p.code))].sort()).toEqual([...e.expect.problemCodes].sort());
      expect(problems[0]!.row).toBe(e.expect.firstProblemRow);
      expect(r.json.error.totalProblems).toBe(e.expect.totalProblems);
      // All or nothing: no meter, no interval, only the rejected import record.
      expect(stored.json.meters).toEqual([]);
      expect(stored.json.imports.map((i: { status: string }) => i.status)).toEqual(['rejected']);
      const f = await energy.get(`/api/sites/${siteId}/findings?from=2020-01-01&to=2020-01-31`);
      expect(f.json.periods[0].metrics.presentIntervals).toBe(0);
    }
  });

  it('answers 413 for a 101 MB file before storing anything', async () => {
    const siteId = await freshSite();
    const big = new Uint8Array(101 * 1024 * 1024).fill(0x31);
    const r = await uploadFile(energy, `/api/sites/${siteId}/meter-data`, { name: 'huge.csv', content: big }, { mapping: JSON.stringify(catalogue.meterFiles[0]!.mapping) });
    expect(r.status).toBe(413);
    expect(r.json.error.code).toBe('too_large');
    expect((await energy.get(`/api/sites/${siteId}/meter-data`)).json.imports).toEqual([]);
  });
});

describe('bill-history catalogue through the HTTP endpoint', () => {
  it.each(catalogue.billFiles.map((e) => [e.file.split('/').pop()!, e] as const))('%s', async (_name, e) => {
    const siteId = await freshSite();
    const r = await uploadFile(energy, `/api/sites/${siteId}/bills/import`, { name: 'bills.csv', content: readFileSync(e.file) }, { mapping: JSON.stringify(e.mapping) });
    const after = (await energy.get(`/api/sites/${siteId}/bills`)).json.bills;
    const overlapping = e.expect.warnings?.includes('period-overlap');
    if (e.expect.ok && !overlapping) {
      expect(r.status, JSON.stringify(r.json).slice(0, 300)).toBe(201);
      expect(r.json.bills).toHaveLength(e.expect.bills!);
      expect(r.json.warnings.map((w: { code: string }) => w.code)).toEqual(e.expect.warnings);
      expect(after).toHaveLength(e.expect.bills!);
    } else if (overlapping) {
      // The parser only warns; the site refuses overlapping billing periods (they must tile the year).
      expect(r.status).toBe(409);
      expect(r.json.error.code).toBe('bill_overlap');
      expect(after).toHaveLength(0);
    } else {
      expect(r.status).toBe(422);
      expect([...new Set(r.json.error.problems.map((p: { code: string }) => p.code))]).toEqual(e.expect.problemCodes);
      expect(r.json.error.problems[0].row).toBe(e.expect.firstProblemRow);
      expect(after).toHaveLength(0);
    }
  });
});
