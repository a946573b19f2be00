import { beforeAll, describe, expect, it } from 'vitest';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { ownerOfNewWorkspace } from '../support/accounts';
import { constantLoadCsv, constantLoadMapping } from '../support/constant-load';

// Invented data: a constant 400 kW / 240 kvar load (100 kWh and 60 kvarh per quarter-hour), UTC stamps.
// Excess kvar demand, k = 1/3, $0.40/kvar: 240 - 400/3 = 106.67 kvar -> $42.67 a period (formula-derived: charge = rate × max(0, Q − k × P)).
const tariff = { name: 'Reactive demand (invented)', currency: 'USD', effectiveFrom: '2020-01-01', rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 0.4 }] };
const PERIODS = [['2026-01-05', '2026-02-04', 31], ['2026-02-05', '2026-03-04', 28], ['2026-03-05', '2026-04-04', 31]] as const;

async function siteWithData(c: Client, name: string) {
  const siteId = (await c.post('/api/sites', { name, timeZone: 'UTC', currency: 'USD' })).json.site.id;
  const up = await uploadFile(c, `/api/sites/${siteId}/meter-data`, { name: `${name}.csv`, content: constantLoadCsv('2026-01-01T00:00:00Z', 100) }, { mapping: JSON.stringify(constantLoadMapping) });
  expect(up.status, JSON.stringify(up.json)).toBe(201);
  expect((await c.post(`/api/sites/${siteId}/tariffs`, tariff)).status).toBe(201);
  return siteId;
}

let energy: Client, finance: Client;
beforeAll(async () => {
  [energy, finance] = await Promise.all([as(DEMO.energy), as(DEMO.finance)]);
});

describe('bills and reconciliation', () => {
  it('finds a mis-billed PF charge and sums it as disputable', async () => {
    const siteId = await siteWithData(energy, 'Bills check A');
    for (const [i, [from, to, days]] of PERIODS.entries()) {
      const r = await energy.post(`/api/sites/${siteId}/bills`, { periodStart: from, periodEnd: to, kwh: days * 9600, billedDemand: 400, billedDemandUnit: 'kW', pfCharge: i === 1 ? 142.67 : 42.67, currency: 'USD' });
      expect(r.status, JSON.stringify(r.json)).toBe(201);
    }
    const rec = await finance.get(`/api/sites/${siteId}/reconciliation`);
    expect(rec.status).toBe(200);
    expect(rec.json.bills).toHaveLength(3);
    expect(rec.json.bills.map((b: { compared: boolean }) => b.compared)).toEqual([true, true, true]);
    expect(rec.json.bills[0].pfCharge.computed).toBeCloseTo(42.67, 2);
    expect(rec.json.bills.map((b: { pfCharge: { flagged: boolean } }) => b.pfCharge.flagged)).toEqual([false, true, false]);
    expect(rec.json.disputable).toBeCloseTo(100, 1);
    expect(rec.json.multiplier.suspected).toBe(false);
    expect(rec.json.bills[0].kwh.computed).toBeCloseTo(31 * 9600, 6);
  });

  it('finds a steady 1.25 kWh ratio from a bill-history CSV and names the implied multiplier', async () => {
    const siteId = await siteWithData(energy, 'Bills check B');
    const history = ['Bill from,Bill to,Energy (kWh),PF charge ($)', ...PERIODS.map(([f, t, d]) => `${f},${t},"${(d * 9600 * 1.25).toLocaleString('en-US')}",42.67`)].join('\n');
    const mapping = { version: 1, delimiter: ',', decimalSeparator: '.', thousandsSeparator: ',', dateFormat: 'iso', columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Energy (kWh)', pfCharge: 'PF charge ($)' }, currency: 'USD' };
    const imp = await uploadFile(energy, `/api/sites/${siteId}/bills/import`, { name: 'history.csv', content: history }, { mapping: JSON.stringify(mapping) });
    expect(imp.status, JSON.stringify(imp.json)).toBe(201);
    expect(imp.json.bills).toHaveLength(3);
    const rec = (await finance.get(`/api/sites/${siteId}/reconciliation`)).json;
    expect(rec.multiplier.suspected).toBe(true);
    expect(rec.multiplier.impliedMultiplier).toBeCloseTo(1.25, 6);
    expect(rec.disputable).toBe(0);
    // The same history again overlaps: 409 and nothing added.
    const again = await uploadFile(energy, `/api/sites/${siteId}/bills/import`, { name: 'history.csv', content: history }, { mapping: JSON.stringify(mapping) });
    expect(again.status).toBe(409);
    expect((await finance.get(`/api/sites/${siteId}/bills`)).json.bills).toHaveLength(3);
  });

  it('says a bill period without interval data is not compared', async () => {
    const siteId = await siteWithData(energy, 'Bills check C');
    await energy.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-06-01', periodEnd: '2026-06-30', kwh: 1000 });
    const rec = (await finance.get(`/api/sites/${siteId}/reconciliation`)).json;
    expect(rec.bills[0].compared).toBe(false);
    expect(rec.bills[0].notes[0]).toMatch(/No interval data/);
  });

  it('validates the bill form and keeps a bad CSV out entirely', async () => {
    const siteId = (await energy.post('/api/sites', { name: 'Bills check D', timeZone: 'UTC' })).json.site.id;
    const bad = await energy.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-02-10', periodEnd: '2026-02-01', kwh: -5, powerFactor: 1.2 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.error.fields)).toEqual(expect.arrayContaining(['kwh', 'powerFactor']));
    const history = 'Bill from,Bill to,Energy (kWh)\n2026-01-01,2026-01-31,1000\n2026-02-01,2026-02-28,lots\n';
    const mapping = { version: 1, delimiter: ',', decimalSeparator: '.', dateFormat: 'iso', columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Energy (kWh)' } };
    const r = await uploadFile(energy, `/api/sites/${siteId}/bills/import`, { name: 'h.csv', content: history }, { mapping: JSON.stringify(mapping) });
    expect(r.status).toBe(422);
    expect(r.json.error.problems[0].row).toBe(3);
    expect((await finance.get(`/api/sites/${siteId}/bills`)).json.bills).toHaveLength(0);
    expect((await finance.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-01-01', periodEnd: '2026-01-31', kwh: 1 })).status).toBe(403);
  });

  it('stores a bill document checked by its bytes and serves it only to the workspace', async () => {
    const siteId = (await energy.post('/api/sites', { name: 'Bills check E', timeZone: 'UTC' })).json.site.id;
    const billId = (await energy.post(`/api/sites/${siteId}/bills`, { periodStart: '2026-01-01', periodEnd: '2026-01-31', kwh: 1000 })).json.bill.id;
    const pdf = new TextEncoder().encode('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
    const up = await uploadFile(energy, `/api/sites/${siteId}/bills/${billId}/document`, { name: '../../etc/January bill.pdf', content: pdf, type: 'application/pdf' });
    expect(up.status).toBe(201);
    expect(up.json.document).toMatchObject({ contentType: 'application/pdf', fileName: 'January bill.pdf' });
    const fakePdf = await uploadFile(energy, `/api/sites/${siteId}/bills/${billId}/document`, { name: 'bill.pdf', content: 'MZ this is not a pdf', type: 'application/pdf' });
    expect(fakePdf.status).toBe(415);
    const got = await finance.get(`/api/sites/${siteId}/bills/${billId}/document`);
    expect(got.status).toBe(200);
    expect(got.res.headers.get('content-type')).toBe('application/pdf');
    expect(String(got.json)).toContain('%PDF-1.4');
    const other = await ownerOfNewWorkspace('bill-doc-other');
    expect((await other.client.get(`/api/sites/${siteId}/bills/${billId}/document`)).status).toBe(404);
    expect((await new Client().get(`/api/sites/${siteId}/bills/${billId}/document`)).status).toBe(401);
  });
});
