import { beforeAll, describe, expect, it } from 'vitest';
import { as, Client, DEMO } from '../support/http';
import { ownerOfNewWorkspace } from '../support/accounts';
import { EXAMPLE_TARIFFS } from '../../src/lib/demo/tariffs';

let owner: Client, finance: Client, energy: Client;
let siteId: string;
const example = EXAMPLE_TARIFFS[0]!.tariff;

beforeAll(async () => {
  [owner, finance, energy] = await Promise.all([as(DEMO.owner), as(DEMO.finance), as(DEMO.energy)]);
  const created = await owner.post('/api/sites', { name: 'Tariff test site', timeZone: 'America/Chicago' });
  siteId = created.json.site.id;
});

describe('tariff versions', () => {
  it('an Energy manager adds versions; everyone reads them in date order', async () => {
    const v1 = await energy.post(`/api/sites/${siteId}/tariffs`, example);
    expect(v1.status).toBe(201);
    expect(v1.json.tariff.definition.rules[0].type).toBe('pf-billing-demand');
    const v2 = await energy.post(`/api/sites/${siteId}/tariffs`, { ...example, effectiveFrom: '2026-01-01', name: 'Revised' });
    expect(v2.status).toBe(201);
    const list = await finance.get(`/api/sites/${siteId}/tariffs`);
    expect(list.json.tariffs.map((t: { effectiveFrom: string }) => t.effectiveFrom)).toEqual(['2025-01-01', '2026-01-01']);
    expect((await energy.post(`/api/sites/${siteId}/tariffs`, example)).status).toBe(409);
  });

  it('rejects a bad rule with 400 naming its path', async () => {
    const bad = { ...example, effectiveFrom: '2027-01-01', rules: [{ ...example.rules[0], targetPf: 1.4 }] };
    const r = await energy.post(`/api/sites/${siteId}/tariffs`, bad);
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields).join(' ')).toContain('rules.0.targetPf');
    const unknownType = { ...example, effectiveFrom: '2027-01-01', rules: [{ id: 'x', type: 'made-up' }] };
    expect((await energy.post(`/api/sites/${siteId}/tariffs`, unknownType)).status).toBe(400);
  });

  it('Finance cannot write; another workspace gets 404', async () => {
    expect((await finance.post(`/api/sites/${siteId}/tariffs`, { ...example, effectiveFrom: '2028-01-01' })).status).toBe(403);
    const other = await ownerOfNewWorkspace('tariff-other');
    expect((await other.client.get(`/api/sites/${siteId}/tariffs`)).status).toBe(404);
    expect((await other.client.post(`/api/sites/${siteId}/tariffs`, { ...example, effectiveFrom: '2028-01-01' })).status).toBe(404);
  });

  it('updates and deletes a version', async () => {
    const list = (await owner.get(`/api/sites/${siteId}/tariffs`)).json.tariffs;
    const id = list[1].id;
    const put = await owner.put(`/api/sites/${siteId}/tariffs/${id}`, { ...example, effectiveFrom: '2026-02-01', name: 'Revised again' });
    expect(put.status).toBe(200);
    expect(put.json.tariff).toMatchObject({ name: 'Revised again', effectiveFrom: '2026-02-01' });
    expect((await owner.del(`/api/sites/${siteId}/tariffs/${id}`)).status).toBe(204);
    expect((await owner.get(`/api/sites/${siteId}/tariffs/${id}`)).status).toBe(404);
  });
});
