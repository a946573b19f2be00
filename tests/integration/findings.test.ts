import { beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { DateTime } from 'luxon';
import { as, Client, DEMO } from '../support/http';
import { openDb } from '../../src/lib/db/client';
import { ensureMeter, storeSeries } from '../../src/lib/db/intervals';
import { meter } from '../../src/lib/db/schema';
import { eq } from 'drizzle-orm';
import type { IntervalSeries } from '../../src/lib/domain/series/interval-series';

/** A constant load: 1000 kW and 750 kvar lagging in every 15-minute interval of March 2026, Chicago time. */
function constantMarch(zone: string): IntervalSeries {
  const from = DateTime.fromISO('2026-03-01', { zone }).toMillis();
  const to = DateTime.fromISO('2026-04-01', { zone }).toMillis();
  const n = (to - from) / 900_000;
  const s = { intervalMinutes: 15, reactiveSource: 'registers' as const, length: n, startMs: new Float64Array(n), kwh: new Float64Array(n).fill(250), kvarhLag: new Float64Array(n).fill(187.5), kvarhLead: new Float64Array(n), flags: new Uint8Array(n) };
  for (let i = 0; i < n; i++) s.startMs[i] = from + i * 900_000;
  return s;
}

let owner: Client;
let finance: Client;
let siteId: string;

beforeAll(async () => {
  [owner, finance] = await Promise.all([as(DEMO.owner), as(DEMO.finance)]);
  const orgId = (await owner.get('/api/me')).json.workspace.id;
  siteId = (await owner.post('/api/sites', { name: 'Findings check site', timeZone: 'America/Chicago', currency: 'USD' })).json.site.id;
  const { db, ready } = openDb(inject('databaseUrl'));
  await ready;
  const m = await ensureMeter(db, orgId, siteId, 'Main meter');
  await db.update(meter).set({ intervalMinutes: 15, reactiveSource: 'registers' }).where(eq(meter.id, m.id));
  await db.transaction((tx) => storeSeries(tx, orgId, m.id, 'imp_test', constantMarch('America/Chicago')));
  db.$client.close();
  const tariff = {
    name: 'Worked check',
    currency: 'USD',
    effectiveFrom: '2020-01-01',
    rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 0.4 }],
  };
  expect((await owner.post(`/api/sites/${siteId}/tariffs`, tariff)).status).toBe(201);
});

describe('GET /api/sites/{siteId}/findings', () => {
  it('computes the worked kvar-demand check on a constant load (worked example: 1000 kW, 750 kvar, k = 1/3, $0.40/kvar; formula-derived)', async () => {
    const r = await finance.get(`/api/sites/${siteId}/findings`);
    expect(r.status).toBe(200);
    const f = r.json;
    expect(f.status).toBe('draft');
    expect(f.periods).toHaveLength(1);
    const march = f.periods[0];
    expect(march.id).toBe('2026-03');
    // March in a US zone has the spring-forward day: 743 hours, 2972 quarter-hours (common practice).
    expect(march.metrics.hours).toBe(743);
    expect(march.metrics.expectedIntervals).toBe(2972);
    expect(march.metrics.presentIntervals).toBe(2972);
    expect(march.metrics.kwh).toBeCloseTo(743_000, 6);
    expect(march.metrics.peakKw).toBeCloseTo(1000, 6);
    expect(march.metrics.peakKvar).toBeCloseTo(750, 6);
    expect(march.metrics.peakKva).toBeCloseTo(1250, 6);
    expect(march.metrics.pfAvgLagging).toBeCloseTo(0.8, 6);
    expect(march.metrics.peakPf).toBeCloseTo(0.8, 6);
    // 750 - 1000/3 = 416.67 billable kvar x $0.40 = $166.67.
    expect(march.rules[0].quantities.billableKvar).toBeCloseTo(416.667, 2);
    expect(march.pfCharge).toBeCloseTo(166.67, 2);
    expect(march.rules[0].explanation).toMatch(/billable 416\.67 kvar × \$0\.40\/kvar = \$166\.67/);
    expect(f.totals.pfCharge).toBeCloseTo(166.67, 2);
  });

  it('validates the query and scopes by workspace', async () => {
    const bad = await owner.get(`/api/sites/${siteId}/findings?from=March`);
    expect(bad.status).toBe(400);
    expect(bad.json.error.fields).toHaveProperty('from');
    expect((await owner.get(`/api/sites/${siteId}/findings?colour=red`)).status).toBe(400);
    expect((await owner.get(`/api/sites/${siteId}/findings?basis=billing`)).status).toBe(422);
    expect((await owner.get(`/api/sites/${siteId}/findings?tariffId=trf_none`)).status).toBe(404);
    expect((await new Client().get(`/api/sites/${siteId}/findings`)).status).toBe(401);
  });

  it('a range outside the data gives no periods', async () => {
    const r = await owner.get(`/api/sites/${siteId}/findings?from=2025-01-01&to=2025-01-31`);
    expect(r.status).toBe(200);
    expect(r.json.periods).toHaveLength(1);
    expect(r.json.periods[0].metrics.presentIntervals).toBe(0);
  });
});
