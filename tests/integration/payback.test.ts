import { beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { ownerOfNewWorkspace } from '../support/accounts';

// Invented: a constant 400 kW / 300 kvar load for January 2026 (UTC), and an excess-kvar-demand tariff.
function csv() {
  const t0 = Date.parse('2026-01-01T00:00:00Z');
  const lines = ['Start,kWh,kvarh lag,kvarh lead'];
  for (let i = 0; i < 31 * 96; i++) lines.push(`${new Date(t0 + i * 900_000).toISOString()},100,75,0`);
  return lines.join('\n') + '\n';
}
const meterMapping = {
  version: 1, delimiter: ',', decimalSeparator: '.',
  timestamp: { column: 'Start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'Main meter', active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'kvarh lag', lead: 'kvarh lead', unit: 'kvarh' } }],
};
const tariff = (currency: string) => ({ name: 'Reactive demand (invented)', currency, effectiveFrom: '2020-01-01', rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 6 }] });
const plan = (name: string, bank: Record<string, unknown>) => ({ name, bank, costs: { perKvar: 50, fixedInstallation: 2500, omPctOfCapex: 1 }, finance: { discountRate: 0.08, lifeYears: 15 } });

/** A minimal CSV reader for the export (quoted fields, doubled quotes). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  const t = text.replace(/^\uFEFF/, '');
  for (let i = 0; i < t.length; i++) {
    const ch = t[i]!;
    if (quoted) {
      if (ch === '"' && t[i + 1] === '"') { field += '"'; i++; }
      else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') { row.push(field); field = ''; }
    else if (ch === '\n') { row.push(field.replace(/\r$/, '')); rows.push(row); row = []; field = ''; }
    else field += ch;
  }
  return rows;
}

let owner: Client;
let plans: any[] = [];
const WS_NAME = 'Pärk & "Mills" / Export';

beforeAll(async () => {
  owner = (await ownerOfNewWorkspace('payback')).client;
  const ws = await owner.post('/api/workspaces', { name: WS_NAME });
  expect(ws.status).toBe(201);
  expect((await owner.put('/api/workspaces/active', { workspaceId: ws.json.workspace.id })).status).toBe(200);
  for (const [name, currency] of [['=Payback USD plant', 'USD'], ['Payback GBP plant', 'GBP']] as const) {
    const siteId = (await owner.post('/api/sites', { name, timeZone: 'UTC', currency })).json.site.id;
    expect((await uploadFile(owner, `/api/sites/${siteId}/meter-data`, { name: 'm.csv', content: csv() }, { mapping: JSON.stringify(meterMapping) })).status).toBe(201);
    expect((await owner.post(`/api/sites/${siteId}/tariffs`, tariff(currency))).status).toBe(201);
    for (const p of [plan('+Fixed 160', { kind: 'fixed', kvar: 160 }), plan('Switched 200 in 4', { kind: 'switched', totalKvar: 200, steps: 4, targetPf: 0.95 })]) {
      const r = await owner.post(`/api/sites/${siteId}/plans`, p);
      expect(r.status, JSON.stringify(r.json)).toBe(201);
      plans.push({ ...r.json.plan, siteName: name });
    }
  }
});

describe('GET /api/payback', () => {
  it('shows each saved plan with the figures of its stored summary, totals per currency', async () => {
    const r = await owner.get('/api/payback');
    expect(r.status).toBe(200);
    expect(r.json.workspace.name).toBe(WS_NAME);
    expect(r.json.rows).toHaveLength(4);
    for (const p of plans) {
      const row = r.json.rows.find((x: { planId: string }) => x.planId === p.id);
      const s = p.summary;
      expect(row).toMatchObject({ siteName: p.siteName, planName: p.name, kind: s.kind, kvar: s.kvar, capex: s.capex, annualSaving: s.annualSaving, omPerYear: s.omPerYear, paybackYears: s.paybackYears, npv: s.npv, irr: s.irr, currency: s.currency, paybackLow: s.sensitivity.low.paybackYears, npvHigh: s.sensitivity.high.npv });
    }
    expect(r.json.rows.map((x: { type: string }) => x.type).sort()).toEqual(['Fixed bank', 'Fixed bank', 'Switched bank (4 steps)', 'Switched bank (4 steps)']);
    // Capex: 160 × 50 + 2500 = 10,500 and 200 × 50 + 2500 = 12,500 per currency (arithmetic).
    expect(r.json.totals).toEqual([
      expect.objectContaining({ currency: 'GBP', plans: 2, kvar: 360, capex: 23_000 }),
      expect.objectContaining({ currency: 'USD', plans: 2, kvar: 360, capex: 23_000 }),
    ]);
    const usd = plans.filter((p) => p.summary.currency === 'USD');
    expect(r.json.totals[1].npv).toBeCloseTo(usd[0].summary.npv + usd[1].summary.npv, 6);
    expect((await new Client().get('/api/payback')).status).toBe(401);
  });

  it('exports CSV with units in the headers, escaped formula-looking text and a safe file name', async () => {
    const r = await owner.request('GET', '/api/payback/export?format=csv');
    expect(r.status).toBe(200);
    expect(r.res.headers.get('content-type')).toMatch(/^text\/csv/);
    expect(r.res.headers.get('content-disposition')).toBe('attachment; filename="varledger-payback-park-mills-export.csv"');
    const rows = parseCsv(String(r.json));
    expect(rows[0]).toEqual(expect.arrayContaining(['Size (kvar)', 'Capex (currency)', 'Annual saving (currency/year)', 'Payback (years)', 'IRR (%)', 'NPV at 80 % savings (currency)']));
    expect(rows).toHaveLength(5);
    const col = (h: string) => rows[0]!.indexOf(h);
    const usdFixed = rows.find((x) => x[col('Plan')] === "'+Fixed 160")!;
    expect(usdFixed[col('Site')]).toBe("'=Payback USD plant");
    const p = plans.find((x) => x.name === '+Fixed 160' && x.summary.currency === 'USD');
    expect(Number(usdFixed[col('Capex (currency)')])).toBeCloseTo(p.summary.capex, 2);
    expect(Number(usdFixed[col('NPV (currency)')])).toBeCloseTo(p.summary.npv, 2);
    expect((await owner.get('/api/payback/export?format=pdf')).status).toBe(400);
  });

  it('exports XLSX that exceljs reads back with the same figures and the escaped cells', async () => {
    const res = await fetch(`${owner.base}/api/payback/export?format=xlsx`, { headers: { cookie: (owner as any).cookieHeader() } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toContain('varledger-payback-park-mills-export.xlsx');
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    const ws = wb.getWorksheet('Payback')!;
    const header = (ws.getRow(1).values as unknown[]).slice(1);
    expect(header).toContain('Capex (currency)');
    expect(ws.rowCount).toBe(5);
    const col = (h: string) => header.indexOf(h) + 1;
    const rows = [2, 3, 4, 5].map((i) => ws.getRow(i));
    const usdFixed = rows.find((row) => row.getCell(col('Plan')).value === "'+Fixed 160" && row.getCell(col('Currency')).value === 'USD')!;
    expect(usdFixed.getCell(col('Site')).value).toBe("'=Payback USD plant");
    const p = plans.find((x) => x.name === '+Fixed 160' && x.summary.currency === 'USD');
    expect(usdFixed.getCell(col('Capex (currency)')).value).toBeCloseTo(p.summary.capex, 6);
    expect(usdFixed.getCell(col('Annual saving (currency/year)')).value).toBeCloseTo(p.summary.annualSaving, 6);
    expect(usdFixed.getCell(col('IRR (%)')).value).toBeCloseTo(p.summary.irr * 100, 6);
    const totals = wb.getWorksheet('Totals by currency')!;
    expect(totals.getRow(2).getCell(1).value).toBe('GBP');
    expect(totals.getRow(2).getCell(4).value).toBe(23_000);
  });

  it('the demo Finance user sees the seeded plans of two plants in their own currencies', async () => {
    const finance = await as(DEMO.finance);
    const r = await finance.get('/api/payback');
    expect(r.status).toBe(200);
    const demo = r.json.rows.filter((x: { siteName: string }) => ['Brackwater Kiln Works', 'Tarn Valley Glaze Plant'].includes(x.siteName));
    expect(demo.length).toBeGreaterThanOrEqual(4);
    expect(new Set(demo.filter((x: { siteName: string }) => x.siteName === 'Tarn Valley Glaze Plant').map((x: { currency: string }) => x.currency))).toEqual(new Set(['GBP']));
    expect(demo.some((x: { type: string }) => x.type === 'Switched bank (5 steps), detuned')).toBe(true);
  });
});
