/**
 * The role-by-route matrix: every API route, called through the real server as anonymous,
 * Owner, Energy manager, Consultant, Finance, and the Owner of another workspace, against the
 * status each should get. The rows are written out by hand from the role table the product
 * promises (README "Roles"); the route list comes from the OpenAPI document's source (ROUTES)
 * and from the files under src/pages/api, so a new route without a row fails this test.
 *
 * Everything runs in a workspace made for this file (invented names), so no demo data changes.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { ROUTES } from '../../src/lib/api/openapi';
import { as, Client, DEMO } from '../support/http';
import { ownerOfNewWorkspace, uniqueEmail, verifiedUser } from '../support/accounts';
import { linkIn, waitForMail } from '../support/mailbox';
import { uploadFile } from '../support/upload';
import { payOnHostedPage } from '../support/payments';
import { constantLoadCsv, constantLoadMapping } from '../support/constant-load';

const ACTORS = ['anonymous', 'owner', 'energy', 'consultant', 'finance', 'other'] as const;
type Actor = (typeof ACTORS)[number];
type Member = Exclude<Actor, 'anonymous' | 'other'>;
const MEMBERS: Member[] = ['owner', 'energy', 'consultant', 'finance'];

// Invented fixtures (a constant 400 kW / 240 kvar load; an excess-kvar rule at 1/3 kvar per kW).
const tariff = (from = '2020-01-01') => ({ name: 'Matrix tariff (invented)', currency: 'USD', effectiveFrom: from, rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 4 }] });
const plan = (name = 'Matrix plan') => ({ name, bank: { kind: 'fixed', kvar: 150 }, costs: { perKvar: 40, fixedInstallation: 3000, omPctOfCapex: 1 }, finance: { discountRate: 0.08, lifeYears: 15 } });
const billHistoryMapping = { version: 1, delimiter: ',', decimalSeparator: '.', dateFormat: 'iso', columns: { periodStart: 'Bill from', periodEnd: 'Bill to', kwh: 'Energy (kWh)' }, currency: 'USD' };
const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
const meterCsv = (days = 10) => constantLoadCsv('2026-01-01T00:00:00Z', days);

type Fx = {
  c: Record<Actor, Client>;
  workspaceId: string;
  otherWorkspaceId: string;
  siteId: string;
  tariffId: string;
  billId: string;
  planId: string;
  reportId: string;
  importId: string;
  purchaseId: string;
  memberIds: Record<Member, string>;
  spareMemberId: string;
  otherInvitationId: string;
  /** ids that must never appear in what the other workspace's Owner is sent */
  secret: string[];
};
let fx: Fx;

/** Signs up a fresh verified person, invites them with `role` and accepts; returns their client. */
async function joinAs(owner: Client, tag: string, role: string) {
  const u = await verifiedUser(tag);
  const inv = await owner.post('/api/invitations', { email: u.email, role });
  if (inv.status !== 201) throw new Error(`invite ${tag}: ${inv.status} ${JSON.stringify(inv.json)}`);
  const acc = await u.client.post(`/api/invitations/${inv.json.invitation.id}/accept`);
  if (acc.status !== 200) throw new Error(`accept ${tag}: ${acc.status} ${JSON.stringify(acc.json)}`);
  return u;
}

const ok = (r: { status: number; json: any }, status: number, what: string) => {
  if (r.status !== status) throw new Error(`${what}: ${r.status} ${JSON.stringify(r.json)}`);
  return r.json;
};

async function newSite(name: string, opts: { data?: boolean; tariff?: boolean } = {}) {
  const o = fx.c.owner;
  const id = ok(await o.post('/api/sites', { name, timeZone: 'UTC', currency: 'USD', serviceVoltageV: 480, transformerKva: 1000, transformerImpedancePct: 5.5 }), 201, 'site').site.id as string;
  if (opts.data) ok(await uploadFile(o, `/api/sites/${id}/meter-data`, { name: `${name}.csv`, content: meterCsv() }, { mapping: JSON.stringify(constantLoadMapping) }), 201, 'import');
  if (opts.tariff) ok(await o.post(`/api/sites/${id}/tariffs`, tariff()), 201, 'tariff');
  return id;
}

beforeAll(async () => {
  const owner = await ownerOfNewWorkspace('matrix-owner');
  const [energy, consultant, finance, spare] = [
    await joinAs(owner.client, 'matrix-energy', 'energy_manager'),
    await joinAs(owner.client, 'matrix-consultant', 'consultant'),
    await joinAs(owner.client, 'matrix-finance', 'finance'),
    await joinAs(owner.client, 'matrix-spare', 'finance'),
  ];
  const other = await ownerOfNewWorkspace('matrix-other');
  ok(await other.client.post('/api/sites', { name: 'Elsewhere Mill', timeZone: 'UTC' }), 201, 'other site');
  const c: Record<Actor, Client> = { anonymous: new Client(), owner: owner.client, energy: energy.client, consultant: consultant.client, finance: finance.client, other: other.client };
  fx = { c, workspaceId: owner.workspaceId, otherWorkspaceId: other.workspaceId } as Fx;

  // The main site: 10 days of data, a tariff, a bill with its document, a plan, paid and reported.
  fx.siteId = await newSite('Matrix Foundry', { data: false });
  const imp = ok(await uploadFile(owner.client, `/api/sites/${fx.siteId}/meter-data`, { name: 'foundry.csv', content: meterCsv() }, { mapping: JSON.stringify(constantLoadMapping) }), 201, 'import');
  fx.importId = imp.import.id;
  fx.tariffId = ok(await owner.client.post(`/api/sites/${fx.siteId}/tariffs`, tariff()), 201, 'tariff').tariff.id;
  fx.billId = ok(await owner.client.post(`/api/sites/${fx.siteId}/bills`, { periodStart: '2026-01-01', periodEnd: '2026-01-10', kwh: 96_000 }), 201, 'bill').bill.id;
  ok(await uploadFile(owner.client, `/api/sites/${fx.siteId}/bills/${fx.billId}/document`, { name: 'january.pdf', content: PDF, type: 'application/pdf' }), 201, 'document');
  fx.planId = ok(await owner.client.post(`/api/sites/${fx.siteId}/plans`, plan()), 201, 'plan').plan.id;
  const buy = ok(await owner.client.post('/api/purchases', { siteIds: [fx.siteId] }), 201, 'purchase');
  fx.purchaseId = buy.purchase.id;
  expect((await payOnHostedPage(buy.checkoutUrl)).status).toBe(303);
  for (let i = 0; (await owner.client.get(`/api/sites/${fx.siteId}`)).json.site.auditState !== 'audited'; i++) {
    if (i > 200) throw new Error('the paid Site audit was not granted within 20 s');
    await new Promise((r) => setTimeout(r, 100));
  }
  fx.reportId = ok(await owner.client.post(`/api/sites/${fx.siteId}/reports`, { planId: fx.planId, title: 'Matrix savings report' }), 201, 'report').report.id;

  const members = ok(await owner.client.get('/api/members'), 200, 'members').members as { id: string; email: string }[];
  const idOf = (email: string) => members.find((m) => m.email === email)!.id;
  fx.memberIds = { owner: idOf(owner.email), energy: idOf(energy.email), consultant: idOf(consultant.email), finance: idOf(finance.email) };
  fx.spareMemberId = idOf(spare.email);
  // An invitation addressed to the other workspace's Owner: only they may read it.
  const otherMe = ok(await other.client.get('/api/me'), 200, 'me');
  fx.otherInvitationId = ok(await owner.client.post('/api/invitations', { email: otherMe.user.email, role: 'finance' }), 201, 'invite other').invitation.id;
  fx.secret = [fx.workspaceId, fx.siteId, fx.tariffId, fx.billId, fx.planId, fx.reportId, fx.importId, fx.purchaseId];
}, 240_000);

type Req = { path: string; body?: unknown; raw?: { body: string; headers: Record<string, string> } };
type Row = {
  route: string;
  expect: Record<Actor, number>;
  call: (actor: Actor) => Req | Promise<Req>;
  /** after the call: what must (still) hold, e.g. a refused delete left the thing in place */
  after?: (actor: Actor, status: number) => Promise<void>;
};

/** 401 anonymous; `okStatus` for the roles granted; 403 for the other members; `other` as given. */
function grant(okStatus: number, roles: Member[] | 'all', other: number): Record<Actor, number> {
  const granted = roles === 'all' ? MEMBERS : roles;
  return { anonymous: 401, other, ...Object.fromEntries(MEMBERS.map((m) => [m, granted.includes(m) ? okStatus : 403])) } as Record<Actor, number>;
}
const everyone = (status: number): Record<Actor, number> => Object.fromEntries(ACTORS.map((a) => [a, status])) as Record<Actor, number>;
const signedIn = (status: number, anonymous = 401): Record<Actor, number> => ({ ...everyone(status), anonymous });
const EDITORS: Member[] = ['owner', 'energy', 'consultant'];
const BUYERS: Member[] = ['owner', 'consultant'];
const s = () => `/api/sites/${fx.siteId}`;


const ROWS: Row[] = [
  { route: 'GET /api/health', expect: everyone(200), call: () => ({ path: '/api/health' }) },
  { route: 'GET /api/openapi.json', expect: everyone(200), call: () => ({ path: '/api/openapi.json' }) },
  { route: 'GET /api/auth/get-session (better-auth catch-all)', expect: everyone(200), call: () => ({ path: '/api/auth/get-session' }) },
  { route: 'GET /api/me', expect: signedIn(200), call: () => ({ path: '/api/me' }) },
  { route: 'GET /api/workspaces', expect: signedIn(200), call: () => ({ path: '/api/workspaces' }) },
  {
    route: 'POST /api/workspaces',
    expect: signedIn(201),
    call: (a) => ({ path: '/api/workspaces', body: { name: `Side workspace of ${a}` } }),
    // Creating a workspace makes it active: switch back so the next rows run where they should.
    after: async (a, status) => {
      if (status === 201) ok(await fx.c[a].put('/api/workspaces/active', { workspaceId: a === 'other' ? fx.otherWorkspaceId : fx.workspaceId }), 200, 'switch back');
    },
  },
  { route: 'PUT /api/workspaces/active', expect: { ...signedIn(200), other: 404 }, call: () => ({ path: '/api/workspaces/active', body: { workspaceId: fx.workspaceId } }) },
  { route: 'GET /api/members', expect: signedIn(200), call: () => ({ path: '/api/members' }) },
  { route: 'PATCH /api/members/{memberId}', expect: grant(200, ['owner'], 404), call: () => ({ path: `/api/members/${fx.spareMemberId}`, body: { role: 'finance' } }) },
  {
    route: 'DELETE /api/members/{memberId}',
    expect: grant(204, ['owner'], 404),
    call: () => ({ path: `/api/members/${fx.spareMemberId}` }),
    after: async (a, status) => {
      const ids = (await fx.c.owner.get('/api/members')).json.members.map((m: { id: string }) => m.id);
      expect(ids.includes(fx.spareMemberId), `spare member after ${a}'s delete (${status})`).toBe(status !== 204);
    },
  },
  { route: 'GET /api/invitations', expect: grant(200, ['owner'], 200), call: () => ({ path: '/api/invitations' }) },
  { route: 'POST /api/invitations', expect: grant(201, ['owner'], 201), call: () => ({ path: '/api/invitations', body: { email: uniqueEmail('matrix-invitee'), role: 'energy_manager' } }) },
  // Only the person an invitation is addressed to may read or accept it; to everyone else it does not exist.
  { route: 'GET /api/invitations/{invitationId}', expect: { ...signedIn(404), other: 200 }, call: () => ({ path: `/api/invitations/${fx.otherInvitationId}` }) },
  {
    route: 'DELETE /api/invitations/{invitationId}',
    expect: grant(204, ['owner'], 404),
    call: async (a) => {
      const id = a === 'owner' ? ok(await fx.c.owner.post('/api/invitations', { email: uniqueEmail('matrix-cancel'), role: 'finance' }), 201, 'invite').invitation.id : fx.otherInvitationId;
      return { path: `/api/invitations/${id}` };
    },
  },
  // Accepting is for the addressee only; the other Owner accepting would join the workspace, so it is called with a stranger's invitation.
  {
    route: 'POST /api/invitations/{invitationId}/accept',
    expect: signedIn(404),
    call: async () => ({ path: `/api/invitations/${ok(await fx.c.owner.post('/api/invitations', { email: uniqueEmail('matrix-stranger'), role: 'finance' }), 201, 'invite').invitation.id}/accept` }),
  },

  { route: 'GET /api/sites', expect: signedIn(200), call: () => ({ path: '/api/sites' }) },
  { route: 'POST /api/sites', expect: { ...grant(201, EDITORS, 201) }, call: (a) => ({ path: '/api/sites', body: { name: `Created by ${a}`, timeZone: 'UTC' } }) },
  { route: 'GET /api/sites/{siteId}', expect: grant(200, 'all', 404), call: () => ({ path: s() }) },
  { route: 'PATCH /api/sites/{siteId}', expect: grant(200, EDITORS, 404), call: () => ({ path: s(), body: { address: '1 Matrix Lane (invented)' } }) },
  {
    route: 'DELETE /api/sites/{siteId}',
    expect: grant(204, ['owner'], 404),
    call: async (a) => ({ path: `/api/sites/${a === 'owner' ? await newSite('Doomed site') : fx.siteId}` }),
    after: async (a) => expect((await fx.c.owner.get(s())).status, `main site after ${a}'s delete`).toBe(200),
  },

  { route: 'GET /api/sites/{siteId}/tariffs', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/tariffs` }) },
  { route: 'POST /api/sites/{siteId}/tariffs', expect: grant(201, EDITORS, 404), call: (a) => ({ path: `${s()}/tariffs`, body: tariff(`2021-0${1 + ACTORS.indexOf(a)}-01`) }) },
  { route: 'GET /api/sites/{siteId}/tariffs/{tariffId}', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/tariffs/${fx.tariffId}` }) },
  { route: 'PUT /api/sites/{siteId}/tariffs/{tariffId}', expect: grant(200, EDITORS, 404), call: () => ({ path: `${s()}/tariffs/${fx.tariffId}`, body: tariff() }) },
  {
    route: 'DELETE /api/sites/{siteId}/tariffs/{tariffId}',
    expect: grant(204, EDITORS, 404),
    call: async (a) => {
      const id = EDITORS.includes(a as Member) ? ok(await fx.c.owner.post(`${s()}/tariffs`, tariff(`2022-0${1 + ACTORS.indexOf(a)}-01`)), 201, 'tariff').tariff.id : fx.tariffId;
      return { path: `${s()}/tariffs/${id}` };
    },
    after: async (a) => expect((await fx.c.owner.get(`${s()}/tariffs/${fx.tariffId}`)).status, `main tariff after ${a}'s delete`).toBe(200),
  },
  { route: 'POST /api/sites/{siteId}/tariffs/preview', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/tariffs/preview`, body: tariff() }) },

  { route: 'GET /api/sites/{siteId}/findings', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/findings` }) },
  { route: 'GET /api/sites/{siteId}/intervals', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/intervals` }) },
  { route: 'GET /api/sites/{siteId}/reconciliation', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/reconciliation` }) },

  { route: 'GET /api/sites/{siteId}/meter-data', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/meter-data` }) },
  {
    route: 'POST /api/sites/{siteId}/meter-data',
    expect: grant(201, EDITORS, 404),
    call: async (a) => {
      const form = new FormData();
      form.append('mapping', JSON.stringify(constantLoadMapping));
      form.append('file', new Blob([meterCsv(2 + ACTORS.indexOf(a))], { type: 'text/csv' }), `${a}.csv`);
      const site = EDITORS.includes(a as Member) ? await newSite(`Upload by ${a}`) : fx.siteId;
      return { path: `/api/sites/${site}/meter-data`, body: form };
    },
  },
  { route: 'GET /api/sites/{siteId}/meter-data/imports/{importId}', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/meter-data/imports/${fx.importId}` }) },
  { route: 'POST /api/sites/{siteId}/meter-data/preview', expect: grant(200, EDITORS, 404), call: () => ({ path: `${s()}/meter-data/preview`, body: { head: meterCsv(1), truncated: false } }) },

  { route: 'GET /api/sites/{siteId}/bills', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/bills` }) },
  { route: 'POST /api/sites/{siteId}/bills', expect: grant(201, EDITORS, 404), call: (a) => ({ path: `${s()}/bills`, body: { periodStart: `2025-0${1 + ACTORS.indexOf(a)}-01`, periodEnd: `2025-0${1 + ACTORS.indexOf(a)}-20`, kwh: 1000 } }) },
  {
    route: 'POST /api/sites/{siteId}/bills/import',
    expect: grant(201, EDITORS, 404),
    call: (a) => {
      const m = 1 + ACTORS.indexOf(a);
      const form = new FormData();
      form.append('mapping', JSON.stringify(billHistoryMapping));
      form.append('file', new Blob([`Bill from,Bill to,Energy (kWh)\n2024-0${m}-01,2024-0${m}-20,1000\n`], { type: 'text/csv' }), 'history.csv');
      return { path: `${s()}/bills/import`, body: form };
    },
  },
  {
    route: 'DELETE /api/sites/{siteId}/bills/{billId}',
    expect: grant(204, EDITORS, 404),
    call: async (a) => {
      const m = 1 + ACTORS.indexOf(a);
      const id = EDITORS.includes(a as Member) ? ok(await fx.c.owner.post(`${s()}/bills`, { periodStart: `2023-0${m}-01`, periodEnd: `2023-0${m}-20`, kwh: 10 }), 201, 'bill').bill.id : fx.billId;
      return { path: `${s()}/bills/${id}` };
    },
    after: async (a) => expect((await fx.c.owner.get(`${s()}/bills`)).json.bills.some((b: { id: string }) => b.id === fx.billId), `main bill after ${a}'s delete`).toBe(true),
  },
  { route: 'GET /api/sites/{siteId}/bills/{billId}/document', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/bills/${fx.billId}/document` }) },
  {
    route: 'POST /api/sites/{siteId}/bills/{billId}/document',
    expect: grant(201, EDITORS, 404),
    call: () => {
      const form = new FormData();
      form.append('file', new Blob([PDF], { type: 'application/pdf' }), 'again.pdf');
      return { path: `${s()}/bills/${fx.billId}/document`, body: form };
    },
  },

  { route: 'POST /api/sites/{siteId}/plans/evaluate', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/plans/evaluate`, body: plan() }) },
  { route: 'GET /api/sites/{siteId}/plans/sizing', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/plans/sizing?targetPf=0.95&maxKvar=300` }) },
  { route: 'GET /api/sites/{siteId}/plans', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/plans` }) },
  { route: 'POST /api/sites/{siteId}/plans', expect: grant(201, EDITORS, 404), call: (a) => ({ path: `${s()}/plans`, body: plan(`Plan by ${a}`) }) },
  { route: 'GET /api/sites/{siteId}/plans/{planId}', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/plans/${fx.planId}` }) },
  { route: 'PUT /api/sites/{siteId}/plans/{planId}', expect: grant(200, EDITORS, 404), call: () => ({ path: `${s()}/plans/${fx.planId}`, body: plan() }) },
  {
    route: 'DELETE /api/sites/{siteId}/plans/{planId}',
    expect: grant(204, EDITORS, 404),
    call: async (a) => ({ path: `${s()}/plans/${EDITORS.includes(a as Member) ? ok(await fx.c.owner.post(`${s()}/plans`, plan(`Short-lived ${a}`)), 201, 'plan').plan.id : fx.planId}` }),
    after: async (a) => expect((await fx.c.owner.get(`${s()}/plans/${fx.planId}`)).status, `main plan after ${a}'s delete`).toBe(200),
  },
  { route: 'GET /api/payback', expect: signedIn(200), call: () => ({ path: '/api/payback' }) },
  { route: 'GET /api/payback/export', expect: signedIn(200), call: () => ({ path: '/api/payback/export?format=csv' }) },
  { route: 'GET /api/portfolio', expect: signedIn(200), call: () => ({ path: '/api/portfolio' }) },

  { route: 'GET /api/sites/{siteId}/reports', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/reports` }) },
  { route: 'POST /api/sites/{siteId}/reports', expect: grant(201, BUYERS, 404), call: (a) => ({ path: `${s()}/reports`, body: { planId: fx.planId, title: `Report by ${a}` } }) },
  { route: 'GET /api/sites/{siteId}/reports/{reportId}', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/reports/${fx.reportId}` }) },
  { route: 'GET /api/sites/{siteId}/reports/{reportId}/pdf', expect: grant(200, 'all', 404), call: () => ({ path: `${s()}/reports/${fx.reportId}/pdf` }) },

  { route: 'GET /api/purchases', expect: signedIn(200), call: () => ({ path: '/api/purchases' }) },
  {
    route: 'POST /api/purchases',
    expect: grant(201, BUYERS, 404),
    call: async (a) => ({ path: '/api/purchases', body: { siteIds: [BUYERS.includes(a as Member) ? await newSite(`To buy by ${a}`) : await newSiteShared()] } }),
  },
  { route: 'GET /api/purchases/{purchaseId}', expect: grant(200, 'all', 404), call: () => ({ path: `/api/purchases/${fx.purchaseId}` }) },
  {
    route: 'POST /api/purchases/{purchaseId}/cancel',
    expect: grant(200, BUYERS, 404),
    call: async (a) => {
      const site = await newSite(`To cancel by ${a}`);
      const id = ok(await fx.c.owner.post('/api/purchases', { siteIds: [site] }), 201, 'purchase').purchase.id;
      return { path: `/api/purchases/${id}/cancel` };
    },
  },
  // The provider's webhook takes no session: without a valid signature everyone gets 400.
  { route: 'POST /api/payments/webhook', expect: everyone(400), call: () => ({ path: '/api/payments/webhook', raw: { body: '{"id":"evt_matrix","type":"checkout.session.completed"}', headers: { 'content-type': 'application/json' } } }) },

  { route: 'GET /api/activity', expect: grant(200, ['owner'], 200), call: () => ({ path: '/api/activity' }) },
];

let sharedDraft: string | null = null;
/** One Draft site for the calls that are refused anyway. */
async function newSiteShared() {
  sharedDraft ??= await newSite('Refused purchase target');
  return sharedDraft;
}

function apiFiles(dir = 'src/pages/api'): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? apiFiles(p) : [p];
  });
}
const fileToPath = (file: string) => `/${relative('src/pages', file).replace(/\.(ts|js)$/, '').replace(/\/index$/, '')}`.replace(/\[\.\.\.[^\]]+\]/, '*').replace(/\[([^\]]+)\]/g, '{$1}');
const rowPath = (route: string) => route.split(' ')[1]!;
const rowKey = (route: string) => route.split(' ').slice(0, 2).join(' ');

describe('role-by-route matrix', () => {
  it('has exactly one row for every documented route and covers every file under src/pages/api', () => {
    const documented = ROUTES.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    const rows = ROWS.map((r) => rowKey(r.route)).filter((k) => !k.includes('/api/auth/'));
    expect(new Set(rows).size, 'a route has two rows').toBe(rows.length);
    expect(rows.sort()).toEqual(documented);
    for (const file of apiFiles()) {
      const p = fileToPath(file);
      const covered = p.endsWith('/*') ? ROWS.some((r) => rowPath(r.route).startsWith(p.slice(0, -1))) : ROWS.some((r) => rowPath(r.route) === p);
      expect(covered, `${file} has no row in the matrix`).toBe(true);
    }
  });

  const cells = { total: 0 };
  it.each(ROWS.map((r) => [r.route, r] as const))('%s', async (_name, row) => {
    const seen: Partial<Record<Actor, number>> = {};
    // Owner last among the members: a delete it is allowed must not remove what others are refused.
    for (const actor of ['anonymous', 'other', 'finance', 'energy', 'consultant', 'owner'] as const) {
      const req = await row.call(actor);
      const method = row.route.split(' ')[0]!;
      const r = req.raw
        ? await fx.c[actor].request(method, req.path, req.raw.body, req.raw.headers)
        : await fx.c[actor].request(method, req.path, req.body);
      seen[actor] = r.status;
      cells.total++;
      if (r.status >= 400) {
        // Every refusal is our JSON error shape (the auth catch-all aside, which is better-auth's).
        expect(r.json?.error?.code, `${actor} ${row.route} → ${r.status} without an error code: ${JSON.stringify(r.json)}`).toEqual(expect.any(String));
      }
      if (actor === 'other' && r.status < 300 && typeof r.json === 'object') {
        const text = JSON.stringify(r.json);
        for (const id of fx.secret) expect(text.includes(id), `${row.route} sent the other workspace's Owner ${id}`).toBe(false);
      }
      await row.after?.(actor, r.status);
    }
    expect(seen).toEqual(row.expect);
  });

  it('counted every cell', () => {
    // 6 actors per route; printed for the README's figures.
    expect(cells.total).toBe(ROWS.length * ACTORS.length);
    console.log(`route-matrix: ${ROWS.length} routes x ${ACTORS.length} callers = ${cells.total} calls checked`);
  });
});

describe('isolation', () => {
  it('ids are random, and an id from another workspace answers exactly like one that never existed', async () => {
    // Our ids: a readable prefix and 96 random bits (src/lib/db/ids.ts); workspace ids are better-auth's 32 random characters.
    for (const id of fx.secret) expect(id, 'ids are long random strings, not counters').toMatch(/^([a-z]+_[A-Za-z0-9_-]{16}|[A-Za-z0-9]{32})$/);
    const other = fx.c.other;
    const foreign = await other.get(`/api/sites/${fx.siteId}`);
    const never = await other.get(`/api/sites/site_${'A'.repeat(16)}`);
    expect(foreign.status).toBe(404);
    expect(never.status).toBe(404);
    expect(foreign.json.error.code).toBe(never.json.error.code);
    expect(foreign.json.error.message).toBe(never.json.error.message);
    // Sequential guesses near a real id find nothing either.
    const tail = fx.siteId.slice(-1);
    const near = fx.siteId.slice(0, -1) + (tail === 'A' ? 'B' : 'A');
    expect((await fx.c.owner.get(`/api/sites/${near}`)).status).toBe(404);
  });

  it('bill documents and report PDFs are served only to members of their workspace', async () => {
    const doc = `${s()}/bills/${fx.billId}/document`;
    const pdf = `${s()}/reports/${fx.reportId}/pdf`;
    for (const path of [doc, pdf]) {
      const member = await fx.c.finance.request('GET', path);
      expect(member.status).toBe(200);
      expect(member.res.headers.get('content-type')).toMatch(/pdf/);
      expect(member.res.headers.get('cache-control')).toMatch(/no-store|private/);
      expect((await fx.c.other.request('GET', path)).status).toBe(404);
      expect((await fx.c.anonymous.request('GET', path)).status).toBe(401);
    }
  });

  it('a member removed from the workspace loses access at once', async () => {
    const gone = await joinAs(fx.c.owner, 'matrix-leaver', 'energy_manager');
    expect((await gone.client.get(s())).status).toBe(200);
    const id = (await fx.c.owner.get('/api/members')).json.members.find((m: { email: string }) => m.email === gone.email).id;
    expect((await fx.c.owner.del(`/api/members/${id}`)).status).toBe(204);
    const after = await gone.client.get(s());
    expect([404, 409]).toContain(after.status);
    expect((await gone.client.get(`${s()}/bills/${fx.billId}/document`)).status).not.toBe(200);
  });
});

describe('activity record (Owners)', () => {
  it('lists who changed the tariff, imported data, bought the audit and issued the report, newest first, only for this workspace', async () => {
    const r = await fx.c.owner.get('/api/activity?limit=200');
    expect(r.status).toBe(200);
    const entries = r.json.entries as { action: string; actor: { email: string } | null; site: { id: string; name: string | null } | null; summary: string; at: string }[];
    const actions = new Set(entries.map((e) => e.action));
    for (const a of ['tariff.created', 'tariff.updated', 'tariff.deleted', 'meter-data.imported', 'bill.added', 'plan.created', 'purchase.started', 'purchase.paid', 'report.issued', 'member.invited', 'member.removed']) expect(actions, a).toContain(a);
    const times = entries.map((e) => Date.parse(e.at));
    expect(times).toEqual([...times].sort((a, b) => b - a));
    const imported = entries.find((e) => e.action === 'meter-data.imported' && e.site?.id === fx.siteId)!;
    expect(imported.actor).not.toBeNull();
    expect(imported.summary).toMatch(/^Imported 960 intervals at Matrix Foundry/);
    // Another workspace's record holds nothing of this one.
    const theirs = JSON.stringify((await fx.c.other.get('/api/activity?limit=200')).json);
    for (const id of fx.secret.slice(1)) expect(theirs.includes(id)).toBe(false);
  });

  it('filters by kind, pages with a cursor, and refuses an unknown kind naming the parameter', async () => {
    const tariffs = (await fx.c.owner.get('/api/activity?kind=tariff')).json.entries as { action: string }[];
    expect(tariffs.length).toBeGreaterThan(0);
    expect(tariffs.every((e) => e.action.startsWith('tariff.'))).toBe(true);
    const first = (await fx.c.owner.get('/api/activity?limit=3')).json;
    expect(first.entries).toHaveLength(3);
    const second = (await fx.c.owner.get(`/api/activity?limit=3&before=${encodeURIComponent(first.next)}`)).json;
    expect(second.entries).toHaveLength(3);
    expect(second.entries.map((e: { id: string }) => e.id)).not.toContain(first.entries[2].id);
    const bad = await fx.c.owner.get('/api/activity?kind=everything');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.error.fields)).toContain('kind');
  });

  it('the seeded demo has its history: tariffs entered, meter data and bills imported, plans saved, the audit paid', async () => {
    const demoOwner = await as(DEMO.owner);
    const entries = (await demoOwner.get('/api/activity?limit=200')).json.entries as { action: string; summary: string; at: string }[];
    const actions = new Set(entries.map((e) => e.action));
    for (const a of ['tariff.created', 'meter-data.imported', 'bill.imported', 'plan.created', 'purchase.paid']) expect(actions, a).toContain(a);
    const paid = entries.find((e) => e.action === 'purchase.paid')!;
    expect(paid.summary).toBe('Paid for Site audits (receipt VLR-20260112-KLN4WB).');
    expect(paid.at).toBe('2026-01-12T15:42:00.000Z');
    expect((paid as unknown as { site: { name: string } }).site.name).toBe('Brackwater Kiln Works');
  });

  it('the Activity page shows the record to the Owner and sends other roles home', async () => {
    const page = await fx.c.owner.request('GET', '/activity');
    expect(page.status).toBe(200);
    expect(page.json).toContain('Matrix Foundry');
    expect(page.json).toMatch(/Issued the Savings report/);
    const denied = await fx.c.energy.request('GET', '/activity');
    expect(denied.status).toBe(302);
    expect(denied.res.headers.get('location')).toBe('/?denied=1');
  });
});
