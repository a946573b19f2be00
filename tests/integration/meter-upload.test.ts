import { beforeAll, describe, expect, it } from 'vitest';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';

/** A small invented 15-minute export: ISO UTC stamps, kWh, lagging and leading kvarh. */
function csv(fromIso: string, count: number, kwh = 100, lag = 60) {
  const t0 = Date.parse(fromIso);
  const lines = ['Interval start (UTC),Energy kWh,Reactive lag kvarh,Reactive lead kvarh'];
  for (let i = 0; i < count; i++) lines.push(`${new Date(t0 + i * 900_000).toISOString().replace('.000', '')},${kwh},${lag},0`);
  return lines.join('\n') + '\n';
}
const mapping = {
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  timestamp: { column: 'Interval start (UTC)', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'Main meter', active: { column: 'Energy kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'Reactive lag kvarh', lead: 'Reactive lead kvarh', unit: 'kvarh' } }],
};

let energy: Client;
let finance: Client;
let siteId: string;
const path = () => `/api/sites/${siteId}/meter-data`;

beforeAll(async () => {
  [energy, finance] = await Promise.all([as(DEMO.energy), as(DEMO.finance)]);
  siteId = (await energy.post('/api/sites', { name: 'Upload check site', timeZone: 'UTC' })).json.site.id;
});

describe('meter-data upload through the real server', () => {
  it('imports a file, reports quality, and the figures read back through findings', async () => {
    const r = await uploadFile(energy, path(), { name: 'april.csv', content: csv('2026-04-01T00:00:00Z', 96 * 30) }, { mapping: JSON.stringify(mapping) });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.import).toMatchObject({ status: 'imported', intervals: 2880 });
    expect(r.json.import.quality).toBeTruthy();
    const f = await finance.get(`/api/sites/${siteId}/findings`);
    const april = f.json.periods.find((p: { id: string }) => p.id === '2026-04');
    expect(april.metrics.kwh).toBeCloseTo(288_000, 6);
    // 100 kWh and 60 kvarh per interval: PF = 100 / sqrt(100² + 60²) = 0.8575 (formula, common practice).
    expect(april.metrics.pfAvgLagging).toBeCloseTo(0.857493, 5);
    expect(april.metrics.completeness).toBe(1);
    const list = await finance.get(path());
    expect(list.json.meters[0]).toMatchObject({ name: 'Main meter', intervalMinutes: 15 });
    expect(list.json.meters[0].importProfile.meters[0].meterId).toBe('Main meter');
  });

  it('answers "already imported" for the same bytes and writes nothing more', async () => {
    const r = await uploadFile(energy, path(), { name: 'april-again.csv', content: csv('2026-04-01T00:00:00Z', 96 * 30) }, { mapping: JSON.stringify(mapping) });
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe('already_imported');
  });

  it('refuses an overlap unless replace is asked, then replaces the range', async () => {
    const over = csv('2026-04-30T00:00:00Z', 96 * 2, 200, 0);
    const r = await uploadFile(energy, path(), { name: 'overlap.csv', content: over }, { mapping: JSON.stringify(mapping) });
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe('overlap');
    expect(r.json.error.overlap[0]).toMatchObject({ meter: 'Main meter', intervals: 96 });
    const before = (await finance.get(`/api/sites/${siteId}/findings?from=2026-04-01&to=2026-04-30`)).json.periods[0].metrics.kwh;
    expect(before).toBeCloseTo(288_000, 6);
    const ok = await uploadFile(energy, path(), { name: 'overlap.csv', content: over }, { mapping: JSON.stringify(mapping), replace: 'true' });
    expect(ok.status).toBe(201);
    const f = (await finance.get(`/api/sites/${siteId}/findings`)).json.periods;
    expect(f.find((p: { id: string }) => p.id === '2026-04').metrics.kwh).toBeCloseTo(100 * 96 * 29 + 200 * 96, 6);
    expect(f.find((p: { id: string }) => p.id === '2026-05').metrics.kwh).toBeCloseTo(200 * 96, 6);
  });

  it('rejects a bad row with 422 naming the row, and stores no interval', async () => {
    const bad = csv('2026-06-01T00:00:00Z', 10).replace(/\n2026-06-01T00:30:00Z,100,/, '\n2026-06-01T00:30:00Z,1o0,');
    const r = await uploadFile(energy, path(), { name: 'bad.csv', content: bad }, { mapping: JSON.stringify(mapping) });
    expect(r.status).toBe(422);
    expect(r.json.error.problems[0]).toMatchObject({ row: 4, value: '1o0' });
    expect(r.json.error.totalProblems).toBe(1);
    const f = (await finance.get(`/api/sites/${siteId}/findings?from=2026-06-01&to=2026-06-30`)).json.periods[0];
    expect(f.metrics.presentIntervals).toBe(0);
    const detail = await finance.get(`${path()}/imports/${r.json.error.importId}`);
    expect(detail.json.import.status).toBe('rejected');
  });

  it.each([
    ['no mapping', {}, 400],
    ['mapping not JSON', { mapping: '{oops' }, 400],
    ['mapping missing dateOrder', { mapping: JSON.stringify({ ...mapping, timestamp: { ...mapping.timestamp, format: 'date-time' } }) }, 400],
  ])('%s -> %i', async (_l, fields, status) => {
    const r = await uploadFile(energy, path(), { name: 'x.csv', content: csv('2026-07-01T00:00:00Z', 4) }, fields as Record<string, string>);
    expect(r.status).toBe(status);
  });

  it('refuses a binary file (422, file-binary) and Finance with 403', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]);
    const r = await uploadFile(energy, path(), { name: 'photo.png', content: png, type: 'image/png' }, { mapping: JSON.stringify(mapping) });
    expect(r.status).toBe(422);
    expect(r.json.error.problems[0].code).toBe('file-binary');
    expect((await uploadFile(finance, path(), { name: 'a.csv', content: csv('2026-08-01T00:00:00Z', 4) }, { mapping: JSON.stringify(mapping) })).status).toBe(403);
  });
});
