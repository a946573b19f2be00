/**
 * The findings cache through the real server: after each kind of change the next findings
 * response carries the new values (compared as values, never as timings), including a change
 * made through a second server instance on the same database file, and two workspaces never
 * see each other's findings.
 *
 * Data: invented constant loads, one row per quarter-hour, in Europe/Dublin (UTC+0 in January,
 * IANA tz database) so local days are UTC days. Expected figures are formula-derived:
 * kWh = intervals x kWh per interval; excess kvarh = max(0, kvarh - k x kWh) x rate (the
 * ratio-allowance kvarh charge, common practice).
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { Client } from '../support/http';
import { ownerOfNewWorkspace } from '../support/accounts';
import { uploadFile } from '../support/upload';
import { constantLoadMapping } from '../support/constant-load';
import { deliveredEvent, payOnHostedPage, testDb } from '../support/payments';
import { freePort } from '../support/global-setup';
import { startAppServer, type AppServer } from '../../src/scripts/lib/app-server';
import { purchase } from '../../src/lib/db/schema';
import { eq } from 'drizzle-orm';

/** `days` of quarter-hours from `fromIso` (UTC), every one `kwh` and `kvarhLag`. */
function constantCsv(fromIso: string, days: number, kwh: number, kvarhLag: number): string {
  const t0 = Date.parse(fromIso);
  const lines = ['Start,kWh,kvarh lag,kvarh lead'];
  for (let i = 0; i < days * 96; i++) lines.push(`${new Date(t0 + i * 900_000).toISOString()},${kwh},${kvarhLag},0`);
  return lines.join('\n') + '\n';
}

const tariffAt = (ratePerKvarh: number) => ({
  name: 'Cache check tariff',
  currency: 'EUR',
  effectiveFrom: '2020-01-01',
  rules: [{ type: 'excess-kvarh', id: 'kvarh', allowance: { basis: 'ratio', kvarPerKw: 0.5 }, pricing: { kind: 'flat', ratePerKvarh } }],
});

type Findings = { status: string; zone: string; periods: { id: string; start: string; pfCharge: number | null; metrics: { kwh: number; presentIntervals: number } }[]; totals: { kwh: number; kvarhLag: number; pfCharge: number }; notes: string[] };

let a: Awaited<ReturnType<typeof ownerOfNewWorkspace>>;
let b: Awaited<ReturnType<typeof ownerOfNewWorkspace>>;
let siteA: string;
let siteB: string;
let tariffId: string;
const db = testDb();

async function findings(c: Client, siteId: string, query = ''): Promise<Findings> {
  const r = await c.get(`/api/sites/${siteId}/findings${query}`);
  expect(r.status, JSON.stringify(r.json)).toBe(200);
  return r.json as Findings;
}
async function upload(c: Client, siteId: string, csv: string, name: string, replace = false) {
  const r = await uploadFile(c, `/api/sites/${siteId}/meter-data`, { name, content: csv }, { mapping: JSON.stringify(constantLoadMapping), ...(replace ? { replace: 'true' } : {}) });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
}
async function newSite(c: Client, name: string) {
  const r = await c.post('/api/sites', { name, timeZone: 'Europe/Dublin', currency: 'EUR' });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json.site.id as string;
}

beforeAll(async () => {
  await db.ready;
  [a, b] = await Promise.all([ownerOfNewWorkspace('cache-a'), ownerOfNewWorkspace('cache-b')]);
  // The same site name in both workspaces, so only the workspace and site ids tell them apart.
  siteA = await newSite(a.client, 'Cache check site');
  siteB = await newSite(b.client, 'Cache check site');
});
afterAll(() => db.db.$client.close());

describe('findings after each kind of change (the cache never answers with older data)', () => {
  it('an empty site, then a first import', async () => {
    const empty = await findings(a.client, siteA);
    expect(empty.totals.kwh).toBe(0);
    expect(empty.notes.join(' ')).toMatch(/No interval data yet/);
    expect((await findings(a.client, siteA)).totals.kwh).toBe(0); // served again, still empty

    await upload(a.client, siteA, constantCsv('2026-01-05T00:00:00Z', 2, 100, 60), 'two-days.csv');
    const f = await findings(a.client, siteA);
    // 2 days x 96 intervals x 100 kWh = 19,200 kWh (formula-derived).
    expect(f.totals.kwh).toBeCloseTo(19_200, 6);
    expect(f.periods.map((p) => p.metrics.presentIntervals)).toEqual([192]);
  });

  it('a second import beside the first', async () => {
    await findings(a.client, siteA);
    await upload(a.client, siteA, constantCsv('2026-01-07T00:00:00Z', 1, 100, 60), 'third-day.csv');
    // 3 x 96 x 100 = 28,800 kWh (formula-derived).
    expect((await findings(a.client, siteA)).totals.kwh).toBeCloseTo(28_800, 6);
  });

  it('a replacing import over the first two days', async () => {
    await upload(a.client, siteA, constantCsv('2026-01-05T00:00:00Z', 2, 40, 30), 'two-days-again.csv', true);
    const f = await findings(a.client, siteA);
    // 2 x 96 x 40 + 96 x 100 = 7,680 + 9,600 = 17,280 kWh; kvarh 2 x 96 x 30 + 96 x 60 = 11,520 (formula-derived).
    expect(f.totals.kwh).toBeCloseTo(17_280, 6);
    expect(f.totals.kvarhLag).toBeCloseTo(11_520, 6);
    expect(f.periods[0]!.pfCharge).toBeNull();
  });

  it('a tariff created, edited and edited again through the portfolio too', async () => {
    const created = await a.client.post(`/api/sites/${siteA}/tariffs`, tariffAt(0.1));
    expect(created.status, JSON.stringify(created.json)).toBe(201);
    tariffId = created.json.tariff.id;
    // Billable = 11,520 - 0.5 x 17,280 = 2,880 kvarh; x EUR 0.10 = 288.00 (formula-derived).
    expect((await findings(a.client, siteA)).totals.pfCharge).toBeCloseTo(288, 6);

    expect((await a.client.put(`/api/sites/${siteA}/tariffs/${tariffId}`, tariffAt(0.25))).status).toBe(200);
    // 2,880 kvarh x EUR 0.25 = 720.00 (formula-derived).
    expect((await findings(a.client, siteA)).totals.pfCharge).toBeCloseTo(720, 6);
    // The Portfolio reads the same findings: one month of data, annualised x 12 = 8,640.
    const row = (await a.client.get('/api/portfolio')).json.rows.find((r: { site: { id: string } }) => r.site.id === siteA);
    expect(row.annualPfCost).toBeCloseTo(8_640, 6);
  });

  it('a tariff edit made through another server instance on the same database', async () => {
    expect((await findings(a.client, siteA)).totals.pfCharge).toBeCloseTo(720, 6);
    const port = await freePort();
    const url = `http://127.0.0.1:${port}`;
    let other: AppServer | undefined;
    try {
      other = await startAppServer({ HOST: '127.0.0.1', PORT: String(port), APP_URL: url, DATABASE_URL: inject('databaseUrl'), DATA_DIR: inject('dataDir'), NODE_ENV: 'test', MAIL_SINK: 'off' }, { quiet: true });
      class OtherInstance extends Client {
        override readonly base = url;
      }
      const c2 = await new OtherInstance().signIn(a.email, a.password);
      const put = await c2.put(`/api/sites/${siteA}/tariffs/${tariffId}`, tariffAt(0.5));
      expect(put.status, JSON.stringify(put.json)).toBe(200);
    } finally {
      await other?.stop();
    }
    // 2,880 kvarh x EUR 0.50 = 1,440.00 (formula-derived), seen by the first instance.
    expect((await findings(a.client, siteA)).totals.pfCharge).toBeCloseTo(1_440, 6);
  });

  it('a tariff deleted', async () => {
    expect((await a.client.del(`/api/sites/${siteA}/tariffs/${tariffId}`)).status).toBe(204);
    const f = await findings(a.client, siteA);
    expect(f.totals.pfCharge).toBe(0);
    expect(f.periods[0]!.pfCharge).toBeNull();
    expect(f.notes.join(' ')).toMatch(/No tariff is entered/);
  });

  it('bills added: the billing periods follow them', async () => {
    expect((await a.client.get(`/api/sites/${siteA}/findings?basis=billing`)).status).toBe(422);
    expect((await a.client.post(`/api/sites/${siteA}/bills`, { periodStart: '2026-01-05', periodEnd: '2026-01-06', kwh: 7_680 })).status).toBe(201);
    const one = await findings(a.client, siteA, '?basis=billing');
    // Jan 5-6 inclusive: 2 x 96 x 40 = 7,680 kWh (formula-derived).
    expect(one.periods.map((p) => [p.id, p.metrics.kwh])).toEqual([['2026-01-05..2026-01-06', 7_680]]);
    expect((await a.client.post(`/api/sites/${siteA}/bills`, { periodStart: '2026-01-07', periodEnd: '2026-01-08', kwh: 9_600 })).status).toBe(201);
    const two = await findings(a.client, siteA, '?basis=billing');
    // Jan 7-8: 96 x 100 = 9,600 kWh (Jan 8 has no data).
    expect(two.periods.map((p) => [p.id, p.metrics.kwh])).toEqual([
      ['2026-01-05..2026-01-06', 7_680],
      ['2026-01-07..2026-01-08', 9_600],
    ]);
  });

  it('a site edit: a new time zone moves the month boundaries', async () => {
    expect((await findings(a.client, siteA)).periods[0]!.start).toBe('2026-01-01T00:00:00+00:00');
    expect((await a.client.patch(`/api/sites/${siteA}`, { timeZone: 'America/Chicago' })).status).toBe(200);
    const f = await findings(a.client, siteA);
    expect(f.zone).toBe('America/Chicago');
    // Chicago is UTC-6 in January (IANA tz database).
    expect(f.periods[0]!.start).toBe('2026-01-01T00:00:00-06:00');
    expect(f.totals.kwh).toBeCloseTo(17_280, 6);
  });

  it('a paid Site audit turns the findings from draft to final', async () => {
    expect((await findings(a.client, siteA)).status).toBe('draft');
    const bought = await a.client.post('/api/purchases', { siteIds: [siteA] });
    expect(bought.status, JSON.stringify(bought.json)).toBe(201);
    expect((await payOnHostedPage(bought.json.checkoutUrl)).status).toBe(303);
    const sessionId = (await db.db.query.purchase.findFirst({ where: eq(purchase.id, bought.json.purchase.id) }))!.checkoutSessionId!;
    await deliveredEvent(sessionId, 'checkout.session.completed');
    const f = await findings(a.client, siteA);
    expect(f.status).toBe('final');
    expect(f.totals.kwh).toBeCloseTo(17_280, 6);
  });
});

describe('two workspaces', () => {
  it('each sees its own findings for the same query, and never the other one’s site', async () => {
    await upload(b.client, siteB, constantCsv('2026-01-05T00:00:00Z', 1, 70, 20), 'b-day.csv');
    const [fa, fb, fa2] = [await findings(a.client, siteA), await findings(b.client, siteB), await findings(a.client, siteA)];
    expect(fa.totals.kwh).toBeCloseTo(17_280, 6);
    // 96 x 70 = 6,720 kWh (formula-derived).
    expect(fb.totals.kwh).toBeCloseTo(6_720, 6);
    expect(fb.status).toBe('draft');
    expect(fa2.totals.kwh).toBeCloseTo(17_280, 6);
    expect((await b.client.get(`/api/sites/${siteA}/findings`)).status).toBe(404);
    expect((await a.client.get(`/api/sites/${siteB}/findings`)).status).toBe(404);
    const rowsB = (await b.client.get('/api/portfolio')).json.rows as { site: { id: string } }[];
    expect(rowsB.map((r) => r.site.id)).toEqual([siteB]);
  });
});
