import { beforeAll, describe, expect, it } from 'vitest';
import { as, Client, DEMO } from '../support/http';
import { ownerOfNewWorkspace } from '../support/accounts';

const valid = { name: 'Test Foundry', timeZone: 'America/Denver', utility: 'Mesa Power', accountNumber: 'MP-1', serviceVoltageV: 480, transformerKva: 1000, transformerImpedancePct: 5.3, currency: 'usd' };

let owner: Client, energy: Client, finance: Client, consultant: Client;
let demoSiteId: string;

beforeAll(async () => {
  [owner, energy, finance, consultant] = await Promise.all([as(DEMO.owner), as(DEMO.energy), as(DEMO.finance), as(DEMO.consultant)]);
  // The consultant's session opens on one of two workspaces; put everyone on Northgate.
  const ws = (await owner.get('/api/me')).json.workspace.id;
  await consultant.put('/api/workspaces/active', { workspaceId: ws });
  demoSiteId = (await owner.get('/api/sites')).json.sites[0].id;
});

describe('site CRUD as the Owner', () => {
  it('creates, reads, renames and deletes a site', async () => {
    const created = await owner.post('/api/sites', valid);
    expect(created.status).toBe(201);
    const site = created.json.site;
    expect(site).toMatchObject({ name: 'Test Foundry', currency: 'USD', auditState: 'draft', transformerKva: 1000 });
    expect(site.id).toMatch(/^site_[A-Za-z0-9_-]{16}$/);

    expect((await owner.get(`/api/sites/${site.id}`)).json.site.name).toBe('Test Foundry');
    const renamed = await owner.patch(`/api/sites/${site.id}`, { name: 'Test Foundry East' });
    expect(renamed.status).toBe(200);
    expect(renamed.json.site.name).toBe('Test Foundry East');
    expect((await owner.get('/api/sites')).json.sites.map((s: { name: string }) => s.name)).toContain('Test Foundry East');

    expect((await owner.del(`/api/sites/${site.id}`)).status).toBe(204);
    expect((await owner.get(`/api/sites/${site.id}`)).status).toBe(404);
  });

  it('refuses a second site with the same name (409 naming the field)', async () => {
    const r = await owner.post('/api/sites', { ...valid, name: 'Brackwater Kiln Works' });
    expect(r.status).toBe(409);
    expect(r.json.error.fields).toHaveProperty('name');
  });
});

describe('bad input answers 4xx naming the field, and writes nothing', () => {
  it.each([
    ['unknown time zone', { ...valid, timeZone: 'Mars/Olympus' }, 'timeZone'],
    ['missing name', { ...valid, name: '' }, 'name'],
    ['voltage as text', { ...valid, serviceVoltageV: '480' }, 'serviceVoltageV'],
    ['negative transformer', { ...valid, transformerKva: -5 }, 'transformerKva'],
    ['impedance out of range', { ...valid, transformerImpedancePct: 60 }, 'transformerImpedancePct'],
    ['made-up currency', { ...valid, currency: 'ZZZ' }, 'currency'],
    ['unknown field', { ...valid, colour: 'red' }, 'colour'],
  ])('%s', async (_label, body, field) => {
    const before = (await owner.get('/api/sites')).json.sites.length;
    const r = await owner.post('/api/sites', body);
    expect(r.status).toBe(400);
    expect(r.json.error.code).toBe('invalid_input');
    expect(Object.keys(r.json.error.fields)).toContain(field);
    expect((await owner.get('/api/sites')).json.sites.length).toBe(before);
  });

  it('malformed JSON is 400 and a non-JSON body is 415', async () => {
    const bad = await owner.request('POST', '/api/sites', '{"name": ', { 'content-type': 'application/json' });
    expect(bad.status).toBe(400);
    expect(bad.json.error.code).toBe('invalid_json');
    const form = await owner.request('POST', '/api/sites', 'name=x', { 'content-type': 'application/x-www-form-urlencoded' });
    expect(form.status).toBe(415);
  });

  it('an empty PATCH is 400', async () => {
    const r = await owner.patch(`/api/sites/${demoSiteId}`, {});
    expect(r.status).toBe(400);
  });
});

describe('role rules', () => {
  it('Finance reads sites but gets 403 on every write', async () => {
    expect((await finance.get('/api/sites')).status).toBe(200);
    expect((await finance.get(`/api/sites/${demoSiteId}`)).status).toBe(200);
    expect((await finance.post('/api/sites', { ...valid, name: 'Finance site' })).status).toBe(403);
    expect((await finance.patch(`/api/sites/${demoSiteId}`, { name: 'Renamed by finance' })).status).toBe(403);
    expect((await finance.del(`/api/sites/${demoSiteId}`)).status).toBe(403);
    expect((await finance.post('/api/invitations', { email: 'x@test.example', role: 'finance' })).status).toBe(403);
    const r = await finance.post('/api/sites', valid);
    expect(r.json.error.code).toBe('forbidden');
  });

  it('an Energy manager and a Consultant create and edit but may not delete sites', async () => {
    for (const [c, name] of [[energy, 'EM site'], [consultant, 'Consultant site']] as const) {
      const r = await c.post('/api/sites', { ...valid, name });
      expect(r.status).toBe(201);
      expect((await c.patch(`/api/sites/${r.json.site.id}`, { utility: 'Other Utility' })).status).toBe(200);
      expect((await c.del(`/api/sites/${r.json.site.id}`)).status).toBe(403);
      expect((await owner.del(`/api/sites/${r.json.site.id}`)).status).toBe(204);
    }
  });

  it('a member of another workspace gets 404 on this workspace’s site ids, and sees none of its sites', async () => {
    const other = await ownerOfNewWorkspace('other');
    expect((await other.client.get(`/api/sites/${demoSiteId}`)).status).toBe(404);
    expect((await other.client.patch(`/api/sites/${demoSiteId}`, { name: 'Hijacked' })).status).toBe(404);
    expect((await other.client.del(`/api/sites/${demoSiteId}`)).status).toBe(404);
    expect((await other.client.get('/api/sites')).json.sites).toEqual([]);
    expect((await owner.get(`/api/sites/${demoSiteId}`)).json.site.name).not.toBe('Hijacked');
  });

  it.each([
    ['GET', '/api/sites'],
    ['POST', '/api/sites'],
    ['GET', '/api/sites/site_x'],
    ['PATCH', '/api/sites/site_x'],
    ['DELETE', '/api/sites/site_x'],
    ['GET', '/api/me'],
    ['GET', '/api/members'],
    ['POST', '/api/invitations'],
    ['POST', '/api/workspaces'],
  ])('anonymous %s %s is 401', async (method, path) => {
    const r = await new Client().request(method, path, method === 'GET' || method === 'DELETE' ? undefined : valid);
    expect(r.status).toBe(401);
    expect(r.json.error.code).toBe('unauthorized');
  });

  it('a state-changing request from another origin is refused with 403', async () => {
    const r = await owner.request('POST', '/api/sites', { ...valid, name: 'Cross-site' }, { origin: 'http://evil.example' });
    expect(r.status).toBe(403);
    expect(r.json.error.code).toBe('bad_origin');
  });
});
