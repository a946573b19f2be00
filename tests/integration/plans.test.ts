import { beforeAll, describe, expect, inject, it } from 'vitest';
import { irr as refIrr, npv as refNpv } from 'financial';
import { eq } from 'drizzle-orm';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { ownerOfNewWorkspace } from '../support/accounts';
import { openDb } from '../../src/lib/db/client';
import { auditEvent } from '../../src/lib/db/schema';

// Invented data, January 2026 in UTC, 15-minute intervals.
// Constant site: 400 kW at PF 0.80 lagging (100 kWh and 75 kvarh per quarter-hour).
// Light-load site: the same by day, 40 kW / 30 kvar from 00:00 to 06:00 (6 h a day, 186 h in the month).
function csv(night: boolean) {
  const t0 = Date.parse('2026-01-01T00:00:00Z');
  const lines = ['Start,kWh,kvarh lag,kvarh lead'];
  for (let i = 0; i < 31 * 96; i++) {
    const light = night && i % 96 < 24;
    lines.push(`${new Date(t0 + i * 900_000).toISOString()},${light ? 10 : 100},${light ? 7.5 : 75},0`);
  }
  return lines.join('\n') + '\n';
}
const meterMapping = {
  version: 1, delimiter: ',', decimalSeparator: '.',
  timestamp: { column: 'Start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'Main meter', active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'kvarh lag', lead: 'kvarh lead', unit: 'kvarh' } }],
};
// Excess kvar demand above k = tan(acos 0.95) = 0.3287 kvar per kW, coincident, 8.00 per kvar (invented rate).
const tariff = { name: 'Reactive demand above 0.95 (invented)', currency: 'USD', effectiveFrom: '2020-01-01', rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: Math.tan(Math.acos(0.95)) }, kvarSource: 'coincident', ratePerKvar: 8 }] };

async function siteWith(c: Client, name: string, opts: { data?: 'constant' | 'night' | null; tariff?: boolean } = {}) {
  const siteId = (await c.post('/api/sites', { name, timeZone: 'UTC', currency: 'USD', serviceVoltageV: 480, transformerKva: 1500, transformerImpedancePct: 5.75 })).json.site.id as string;
  if (opts.data !== null) {
    const up = await uploadFile(c, `/api/sites/${siteId}/meter-data`, { name: `${name}.csv`, content: csv(opts.data === 'night') }, { mapping: JSON.stringify(meterMapping) });
    expect(up.status, JSON.stringify(up.json)).toBe(201);
  }
  if (opts.tariff !== false) expect((await c.post(`/api/sites/${siteId}/tariffs`, tariff)).status).toBe(201);
  return siteId;
}

const spec = (over: Record<string, unknown> = {}) => ({
  name: 'Check plan',
  bank: { kind: 'fixed', kvar: 168.4 },
  costs: { perKvar: 40, fixedInstallation: 3000, omPctOfCapex: 1 },
  finance: { discountRate: 0.08, lifeYears: 15 },
  ...over,
});

let energy: Client, finance: Client;
let constantSite: string, nightSite: string;
beforeAll(async () => {
  [energy, finance] = await Promise.all([as(DEMO.energy), as(DEMO.finance)]);
  constantSite = await siteWith(energy, 'Plans constant load');
  nightSite = await siteWith(energy, 'Plans light nights', { data: 'night' });
});

describe('POST /api/sites/{siteId}/plans/evaluate', () => {
  it('a Fixed bank of P × 0.421 kvar takes a constant 400 kW load from 0.80 to 0.95 (IEEE Std 141 multiplier table, 0.80 -> 0.95: 0.421)', async () => {
    const r = await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: 400 * 0.421 } }));
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    const ev = r.json.evaluation;
    expect(ev.pf.before).toBeCloseTo(0.8, 6);
    // Printed tables subtract rounded tangents: tolerance 0.001 (IEEE Std 141 ch. 8 multiplier table, common practice).
    expect(Math.abs(ev.pf.after - 0.95)).toBeLessThan(0.001);
    expect(ev.leading.goesLeading).toBe(false);
    expect(ev.leading.hours).toBe(0);
    // Before: (300 - 0.3287 × 400) kvar × 8.00 = 1,348.23 a month (formula-derived).
    expect(ev.months).toHaveLength(1);
    expect(ev.months[0].before).toBeCloseTo((300 - 400 * Math.tan(Math.acos(0.95))) * 8, 2);
    expect(ev.months[0].rules[0].ruleId).toBe('kvar');
    expect(ev.months[0].after).toBeLessThan(ev.months[0].before * 0.01);
    // Screening from the site's 1500 kVA, 5.75 % transformer (IEEE Std 141 and common practice: h = sqrt(kVA_sc / kvar); dV% = kvar × Z% / kVA, from memory).
    expect(ev.screening.resonance.order).toBeCloseTo(Math.sqrt(1500 / 0.0575 / 168.4), 2);
    expect(ev.screening.voltageRise.risePct).toBeCloseTo((168.4 * 5.75) / 1500, 3);
    expect(ev.cautions.map((c: { id: string }) => c.id)).toEqual(expect.arrayContaining(['qualified-persons', 'harmonic-resonance', 'switching-transients', 'voltage-rise', 'protection-discharge', 'estimates']));
  });

  it('the exact Qc = P (tan φ1 − tan φ2) gives 0.950 to four decimals (formula-derived)', async () => {
    const qc = 400 * (Math.tan(Math.acos(0.8)) - Math.tan(Math.acos(0.95)));
    expect(qc).toBeCloseTo(168.53, 2);
    const ev = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: qc } }))).json.evaluation;
    expect(ev.pf.after).toBeCloseTo(0.95, 4);
    const sizing = await finance.get(`/api/sites/${constantSite}/plans/sizing?targetPf=0.95&maxKvar=300`);
    expect(sizing.status, JSON.stringify(sizing.json)).toBe(200);
    expect(sizing.json.sizing.textbook.kvar).toBeCloseTo(qc, 1);
    expect(sizing.json.sizing.textbook.peakKw).toBeCloseTo(400, 6);
  });

  it('a Fixed bank over-corrects at light load and reports the leading hours; a Switched bank does not', async () => {
    const fixed = (await finance.post(`/api/sites/${nightSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: 200 } }))).json.evaluation;
    // 30 - 200 = -170 kvar in every light-load interval: 6 h a day × 31 days = 186 h leading (hand count).
    expect(fixed.leading.goesLeading).toBe(true);
    expect(fixed.leading.hours).toBeCloseTo(186, 6);
    expect(fixed.leading.kvarh).toBeCloseTo(170 * 186, 3);
    // Worst leading PF: 40 / sqrt(40² + 170²) = 0.2290 (formula-derived).
    expect(fixed.leading.worstLeadPf).toBeCloseTo(40 / Math.hypot(40, 170), 4);
    expect(fixed.leading.overCorrectedMonths).toEqual(['January 2026']);
    expect(fixed.leading.message).toMatch(/leading/);
    const switched = (await finance.post(`/api/sites/${nightSite}/plans/evaluate`, spec({ bank: { kind: 'switched', totalKvar: 200, steps: 8, targetPf: 0.95 } }))).json.evaluation;
    expect(switched.leading.hours).toBe(0);
    expect(switched.plan.stepsKvar).toEqual(Array(8).fill(25));
    expect(switched.screening.steps).toHaveLength(8);
  });

  it('economics agree with the financial package (a port of numpy-financial) npv and irr', async () => {
    const ev = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: 150 }, costs: { perKvar: 45, fixedInstallation: 2500, omPctOfCapex: 2 }, finance: { discountRate: 0.09, lifeYears: 12 } }))).json.evaluation;
    const e = ev.economics;
    expect(e.capex).toBeCloseTo(150 * 45 + 2500, 6);
    expect(e.omPerYear).toBeCloseTo(0.02 * e.capex, 6);
    // January only: scaled to a year by 8766 / 744 hours.
    expect(ev.annualFactor).toBeCloseTo(8766 / 744, 9);
    expect(e.annualSaving).toBeCloseTo(ev.totals.saving * (8766 / 744), 6);
    const net = e.annualSaving - e.omPerYear;
    const flows = [-e.capex, ...Array(12).fill(net)];
    expect(e.npv).toBeCloseTo(refNpv(0.09, flows), 4);
    expect(e.irr).toBeCloseTo(refIrr(flows), 6);
    expect(e.paybackYears).toBeCloseTo(e.capex / net, 9);
    const low = e.sensitivity.find((s: { savingsFactor: number }) => s.savingsFactor === 0.8);
    expect(low.npv).toBeCloseTo(refNpv(0.09, [-e.capex, ...Array(12).fill(0.8 * e.annualSaving - e.omPerYear)]), 4);
  });

  it('shows the optional benefit lines apart and counts them only when asked (formula-derived: 1 − (PF1/PF2)², 0.80 -> 0.95 cuts losses 29.09 %; kW/PF1 − kW/PF2, 1000 kW releases 197.4 kVA)', async () => {
    const qc = 400 * (Math.tan(Math.acos(0.8)) - Math.tan(Math.acos(0.95)));
    const benefits = { lineLossCostPerYear: 10_000, releasedCapacityValuePerKvaYear: 20 };
    const shown = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: qc }, benefits }))).json.evaluation.economics;
    const counted = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: qc }, benefits: { ...benefits, countInFigures: true } }))).json.evaluation.economics;
    const plain = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: qc } }))).json.evaluation.economics;
    expect(shown.optional).toHaveLength(2);
    expect(shown.optional[0].label).toMatch(/Line-loss reduction 29\.09 % \(optional\)/);
    expect(shown.optional[0].perYear).toBeCloseTo(2909, 0);
    // 400 kW is 0.4 × the 1000 kW example: 500 − 421.05 = 78.95 kVA released (shown as 78.9) × 20 a kVA-year.
    expect(shown.optional[1].label).toMatch(/Released capacity 78\.9 kVA \(optional\)/);
    expect(shown.optional[1].perYear).toBeCloseTo(0.4 * 197.37 * 20, 0);
    expect(shown.optionalCounted).toBe(false);
    expect(shown.npv).toBeCloseTo(plain.npv, 6);
    expect(counted.optionalCounted).toBe(true);
    expect(counted.netAnnual - plain.netAnnual).toBeCloseTo(shown.optionalPerYear, 6);
  });

  it('payback is "not paid back" (null) when savings do not cover O&M', async () => {
    const r = await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ costs: { perKvar: 1000, fixedInstallation: 100_000, omPctOfCapex: 50 } }));
    const e = r.json.evaluation.economics;
    expect(e.omPerYear).toBeGreaterThan(e.annualSaving);
    expect(e.paybackYears).toBeNull();
    expect(e.npv).toBeLessThan(-e.capex);
    expect(r.json.evaluation.notes.join(' ')).toMatch(/not paid back/);
  });

  it('answers 400 naming each bad field, including a 500 % discount rate and negative kvar', async () => {
    const r = await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'fixed', kvar: -50 }, finance: { discountRate: 5, lifeYears: 15 } }));
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields)).toEqual(expect.arrayContaining(['bank.kvar', 'finance.discountRate']));
    expect(r.json.error.fields['finance.discountRate']).toMatch(/fraction/);
    const sw = await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ bank: { kind: 'switched', targetPf: 1.2 } }));
    expect(sw.status).toBe(400);
    expect(Object.keys(sw.json.error.fields)).toEqual(expect.arrayContaining(['bank.targetPf', 'bank.totalKvar', 'bank.steps']));
    const extra = await finance.post(`/api/sites/${constantSite}/plans/evaluate`, { ...spec(), colour: 'red' });
    expect(extra.json.error.fields).toHaveProperty('colour');
    const badQuery = await finance.get(`/api/sites/${constantSite}/plans/sizing?discountRate=5`);
    expect(badQuery.status).toBe(400);
    expect(badQuery.json.error.fields).toHaveProperty('discountRate');
  });

  it('answers 422 with a sentence for a site without meter data or without a tariff', async () => {
    const noData = await siteWith(energy, 'Plans no data', { data: null });
    const a = await finance.post(`/api/sites/${noData}/plans/evaluate`, spec());
    expect(a.status).toBe(422);
    expect(a.json.error.message).toMatch(/no meter data yet/);
    const noTariff = await siteWith(energy, 'Plans no tariff', { tariff: false });
    const b = await finance.get(`/api/sites/${noTariff}/plans/sizing`);
    expect(b.status).toBe(422);
    expect(b.json.error.message).toMatch(/no tariff entered/);
  });
});

describe('GET /api/sites/{siteId}/plans/sizing', () => {
  it('lists Fixed and Switched candidates with exactly one best NPV and one shortest payback marked', async () => {
    const r = await finance.get(`/api/sites/${nightSite}/plans/sizing?targetPf=0.95&fixedPerKvar=30&switchedPerKvar=60&fixedInstallation=2000`);
    const t = r.json.sizing;
    // Highest lagging kvar 300 -> sizes 25..300 in 25 kvar steps; Fixed plus Switched with 4, 6 and 8 steps.
    expect(t.sizesKvar).toEqual([25, 50, 75, 100, 125, 150, 175, 200, 225, 250, 275, 300]);
    expect(t.rows).toHaveLength(12 * 4);
    expect(t.rows.filter((x: { bestNpv: boolean }) => x.bestNpv)).toHaveLength(1);
    expect(t.rows.filter((x: { shortestPayback: boolean }) => x.shortestPayback)).toHaveLength(1);
    const best = t.rows[t.bestNpvIndex];
    expect(Math.max(...t.rows.map((x: { npv: number }) => x.npv))).toBe(best.npv);
    expect(t.rows.find((x: { kind: string; kvar: number }) => x.kind === 'fixed' && x.kvar === 200).leadingHours).toBeCloseTo(186, 6);
  });
});

describe('saved plans', () => {
  it('saves, lists, renames (summary recomputed) and deletes; Finance reads but may not write; another workspace gets 404', async () => {
    const created = await energy.post(`/api/sites/${constantSite}/plans`, spec({ name: 'Roles check' }));
    expect(created.status, JSON.stringify(created.json)).toBe(201);
    const plan = created.json.plan;
    expect(plan.summary).toMatchObject({ kind: 'fixed', kvar: 168.4, currency: 'USD', leadingHours: 0 });
    const evaluated = (await finance.post(`/api/sites/${constantSite}/plans/evaluate`, spec({ name: 'Roles check' }))).json.evaluation;
    expect(plan.summary.npv).toBeCloseTo(evaluated.economics.npv, 6);
    expect(plan.summary.capex).toBeCloseTo(168.4 * 40 + 3000, 6);

    expect((await energy.post(`/api/sites/${constantSite}/plans`, spec({ name: 'Roles check' }))).status).toBe(409);
    const list = await finance.get(`/api/sites/${constantSite}/plans`);
    expect(list.json.plans.map((p: { name: string }) => p.name)).toContain('Roles check');
    expect((await finance.get(`/api/sites/${constantSite}/plans/${plan.id}`)).json.plan.spec.bank.kvar).toBe(168.4);

    expect((await finance.post(`/api/sites/${constantSite}/plans`, spec({ name: 'By finance' }))).status).toBe(403);
    expect((await finance.put(`/api/sites/${constantSite}/plans/${plan.id}`, spec({ name: 'By finance' }))).status).toBe(403);
    expect((await finance.del(`/api/sites/${constantSite}/plans/${plan.id}`)).status).toBe(403);

    const put = await energy.put(`/api/sites/${constantSite}/plans/${plan.id}`, spec({ name: 'Roles check, 100 kvar', bank: { kind: 'fixed', kvar: 100 } }));
    expect(put.status, JSON.stringify(put.json)).toBe(200);
    expect(put.json.plan.name).toBe('Roles check, 100 kvar');
    expect(put.json.plan.summary.kvar).toBe(100);
    expect(put.json.plan.summary.capex).toBeCloseTo(100 * 40 + 3000, 6);

    const other = await ownerOfNewWorkspace('plans-other');
    expect((await other.client.get(`/api/sites/${constantSite}/plans/${plan.id}`)).status).toBe(404);
    expect((await other.client.get(`/api/sites/${constantSite}/plans`)).status).toBe(404);
    expect((await other.client.post(`/api/sites/${constantSite}/plans/evaluate`, spec())).status).toBe(404);
    expect((await new Client().get(`/api/sites/${constantSite}/plans`)).status).toBe(401);

    expect((await energy.del(`/api/sites/${constantSite}/plans/${plan.id}`)).status).toBe(204);
    expect((await finance.get(`/api/sites/${constantSite}/plans/${plan.id}`)).status).toBe(404);

    const { db, ready } = openDb(inject('databaseUrl'));
    await ready;
    const events = await db.select().from(auditEvent).where(eq(auditEvent.subjectId, plan.id));
    db.$client.close();
    expect(events.map((e) => e.action).sort()).toEqual(['plan.created', 'plan.deleted', 'plan.updated']);
  });
});
