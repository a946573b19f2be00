import { beforeAll, describe, expect, it } from 'vitest';
import { as, Client, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { ownerOfNewWorkspace } from '../support/accounts';
import { RULE_TYPES, tariffRuleSchema } from '../../src/lib/domain/tariff/rule-registry';
import { initialValue, unionOption } from '../../src/components/islands/tariff/schema-walk';
import { constantLoadCsv, constantLoadMapping } from '../support/constant-load';

// Invented data: a constant 400 kW / 240 kvar load (100 kWh and 60 kvarh per quarter-hour), UTC stamps,
// from 2026-01-01 for 59 days: January (31 days) and February (28 days) 2026 in full.
// Saved tariff: excess kvar demand, k = 1/3, $0.40/kvar: (240 - 400/3) x 0.40 = $42.67 a month
// (formula-derived: charge = rate × max(0, Q − k × P), the excess reactive demand clause).
const saved = { name: 'Saved reactive demand (invented)', currency: 'USD', effectiveFrom: '2020-01-01', rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 0.4 }] };

// Draft tariff, two rules, checked by hand:
// 1. PF-adjusted billing demand, ratio formula (clause shape 1: BD = D x target / PF), target 0.90, $10/kW.
//    Average PF = 400 / sqrt(400² + 240²) = 400 / 466.4762 = 0.857493; BD = 400 x 0.90 / 0.857493 = 0.90 x 466.4762
//    = 419.8286 kW; PF-related demand 19.8286 kW x $10 = $198.29 each month.
// 2. Excess reactive energy (clause shape 4: rate x max(0, kvarh - k x kWh)), k = 0.5 kvarh/kWh, $0.01/kvarh.
//    January: 31 x 96 x 60 = 178,560 kvarh - 0.5 x 297,600 kWh = 29,760 kvarh x $0.01 = $297.60.
//    February: 28 x 96 x 60 = 161,280 kvarh - 0.5 x 268,800 kWh = 26,880 kvarh x $0.01 = $268.80.
const draft = {
  name: 'Draft with two clauses (invented)',
  currency: 'USD',
  effectiveFrom: '2027-01-01',
  rules: [
    { type: 'pf-billing-demand', id: 'bd', targetPf: 0.9, formula: 'ratio', demandRatePerKw: 10 },
    { type: 'excess-kvarh', id: 'kvarh', allowance: { basis: 'ratio', kvarPerKw: 0.5 }, pricing: { kind: 'flat', ratePerKvarh: 0.01 } },
  ],
};
const BD_MONTH = (0.9 * Math.hypot(400, 240) - 400) * 10;

let energy: Client, finance: Client;
let siteId: string;
beforeAll(async () => {
  [energy, finance] = await Promise.all([as(DEMO.energy), as(DEMO.finance)]);
  siteId = (await energy.post('/api/sites', { name: 'Tariff preview check', timeZone: 'UTC', currency: 'USD' })).json.site.id;
  const up = await uploadFile(energy, `/api/sites/${siteId}/meter-data`, { name: 'preview.csv', content: constantLoadCsv('2026-01-01T00:00:00Z', 59) }, { mapping: JSON.stringify(constantLoadMapping) });
  expect(up.status, JSON.stringify(up.json)).toBe(201);
  expect((await energy.post(`/api/sites/${siteId}/tariffs`, saved)).status).toBe(201);
});

describe('tariff preview', () => {
  it('prices the draft on the months of data, per rule, beside the saved tariff', async () => {
    const r = await energy.post(`/api/sites/${siteId}/tariffs/preview`, draft);
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    const p = r.json.preview;
    expect(p.hasData).toBe(true);
    expect(p.currency).toBe('USD');
    expect(p.months.map((m: { label: string }) => m.label)).toHaveLength(2);
    expect(p.months[0].start).toMatch(/^2026-01-01T00:00:00/);
    expect(p.months[1].start).toMatch(/^2026-02-01T00:00:00/);
    expect(BD_MONTH).toBeCloseTo(198.29, 2);
    const [jan, feb] = p.months;
    expect(jan.rules.find((x: { ruleId: string }) => x.ruleId === 'bd').amount).toBeCloseTo(198.29, 2);
    expect(jan.rules.find((x: { ruleId: string }) => x.ruleId === 'kvarh').amount).toBeCloseTo(297.6, 6);
    expect(feb.rules.find((x: { ruleId: string }) => x.ruleId === 'kvarh').amount).toBeCloseTo(268.8, 6);
    expect(jan.pfCharge).toBeCloseTo(198.29 + 297.6, 2);
    expect(feb.pfCharge).toBeCloseTo(198.29 + 268.8, 2);
    expect(p.total).toBeCloseTo(2 * BD_MONTH + 297.6 + 268.8, 6);
    expect(p.byRule.find((x: { ruleId: string }) => x.ruleId === 'bd').total).toBeCloseTo(2 * BD_MONTH, 6);
    // Saved: (240 - 400/3) x 0.40 = 42.6667 a month.
    expect(jan.savedPfCharge).toBeCloseTo(42.67, 2);
    expect(p.saved.total).toBeCloseTo(2 * (240 - 400 / 3) * 0.4, 6);
  });

  it('compares with one named saved version and writes nothing', async () => {
    const list = (await energy.get(`/api/sites/${siteId}/tariffs`)).json.tariffs;
    expect(list).toHaveLength(1);
    const r = await energy.post(`/api/sites/${siteId}/tariffs/preview?compareTo=${list[0].id}`, { ...draft, effectiveFrom: '2020-01-01' });
    expect(r.status).toBe(200);
    expect(r.json.preview.saved.label).toContain('Saved reactive demand (invented)');
    expect(r.json.preview.saved.total).toBeCloseTo(85.33, 2);
    expect((await energy.get(`/api/sites/${siteId}/tariffs`)).json.tariffs).toHaveLength(1);
    expect((await energy.post(`/api/sites/${siteId}/tariffs/preview?compareTo=tar_nothing`, draft)).status).toBe(404);
  });

  it('accepts a new rule of every type as the editor starts it', async () => {
    const rules = RULE_TYPES.map((t) => ({ ...(initialValue(unionOption(tariffRuleSchema, t.type)!) as { type: string }), id: `new-${t.type}` }));
    expect(rules.map((r) => r.type)).toEqual(RULE_TYPES.map((t) => t.type));
    const r = await energy.post(`/api/sites/${siteId}/tariffs/preview`, { name: 'Every rule type', currency: 'USD', effectiveFrom: '2026-01-01', rules });
    expect(r.status, JSON.stringify(r.json)).toBe(200);
    expect(r.json.preview.months[0].rules.map((x: { ruleId: string }) => x.ruleId)).toEqual(rules.map((x) => x.id));
  });

  it('answers 400 naming the bad field', async () => {
    const bad = { ...draft, rules: [{ ...draft.rules[0], targetPf: 1.4 }, draft.rules[1]] };
    const r = await energy.post(`/api/sites/${siteId}/tariffs/preview`, bad);
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields)).toContain('rules.0.targetPf');
    const noDate = await energy.post(`/api/sites/${siteId}/tariffs/preview`, { ...draft, effectiveFrom: undefined });
    expect(noDate.status).toBe(400);
    expect(Object.keys(noDate.json.error.fields)).toContain('effectiveFrom');
  });

  it('says so when the site has no meter data', async () => {
    const bare = (await energy.post('/api/sites', { name: 'Tariff preview, no data', timeZone: 'UTC', currency: 'USD' })).json.site.id;
    const r = await energy.post(`/api/sites/${bare}/tariffs/preview`, draft);
    expect(r.status).toBe(200);
    expect(r.json.preview.hasData).toBe(false);
    expect(r.json.preview.months).toEqual([]);
    expect(r.json.preview.notes.join(' ')).toMatch(/upload a meter export/);
  });

  it('lets Finance preview but not save; another workspace gets 404', async () => {
    const r = await finance.post(`/api/sites/${siteId}/tariffs/preview`, draft);
    expect(r.status).toBe(200);
    expect(r.json.preview.total).toBeCloseTo(2 * BD_MONTH + 297.6 + 268.8, 6);
    expect((await finance.post(`/api/sites/${siteId}/tariffs`, draft)).status).toBe(403);
    const other = await ownerOfNewWorkspace('tariff-preview-other');
    expect((await other.client.post(`/api/sites/${siteId}/tariffs/preview`, draft)).status).toBe(404);
    expect((await new Client().post(`/api/sites/${siteId}/tariffs/preview`, draft)).status).toBe(401);
  });
});
