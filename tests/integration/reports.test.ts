import { beforeAll, describe, expect, it } from 'vitest';
import { ownerOfNewWorkspace, uniqueEmail } from '../support/accounts';
import { Client } from '../support/http';
import { uploadFile } from '../support/upload';
import { linkIn, waitForMail } from '../support/mailbox';
import { payOnHostedPage } from '../support/payments';
import { constantLoadCsv, constantLoadMapping } from '../support/constant-load';

// Invented data: a constant 400 kW / 240 kvar load (PF 0.857 lagging), UTC stamps, 100 days.
const tariff = { name: 'Reactive demand (invented)', currency: 'USD', effectiveFrom: '2020-01-01', rules: [{ type: 'excess-kvar-demand', id: 'kvar', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 4 }] };
const plan = { name: 'Switched 200 kvar', bank: { kind: 'switched', totalKvar: 200, steps: 4, targetPf: 0.97 }, costs: { perKvar: 45, fixedInstallation: 3000, omPctOfCapex: 1 }, finance: { discountRate: 0.08, lifeYears: 15 } };

let owner: Awaited<ReturnType<typeof ownerOfNewWorkspace>>;
let finance: Client;
let financeEmail: string;
let siteId: string;
let planId: string;

beforeAll(async () => {
  owner = await ownerOfNewWorkspace('reporter');
  siteId = (await owner.client.post('/api/sites', { name: 'Report check site', timeZone: 'UTC', currency: 'USD', transformerKva: 1000, transformerImpedancePct: 5.3, serviceVoltageV: 480 })).json.site.id;
  expect((await uploadFile(owner.client, `/api/sites/${siteId}/meter-data`, { name: 'm.csv', content: constantLoadCsv('2026-01-01T00:00:00Z', 100) }, { mapping: JSON.stringify(constantLoadMapping) })).status).toBe(201);
  expect((await owner.client.post(`/api/sites/${siteId}/tariffs`, tariff)).status).toBe(201);
  const saved = await owner.client.post(`/api/sites/${siteId}/plans`, plan);
  expect(saved.status, JSON.stringify(saved.json)).toBe(201);
  planId = saved.json.plan.id;
  // A Finance member, invited and accepted through the real flows, to receive the report mail.
  financeEmail = uniqueEmail('report-finance');
  const inv = await owner.client.post('/api/invitations', { email: financeEmail, role: 'finance' });
  finance = new Client();
  await finance.post('/api/auth/sign-up/email', { name: 'Fay Nance', email: financeEmail, password: 'finance-pass-1', callbackURL: '/verify?verified=1' });
  await finance.follow(linkIn(await waitForMail(financeEmail, /Confirm your e-mail/), finance.base));
  expect((await finance.post(`/api/invitations/${inv.json.invitation.id}/accept`)).status).toBe(200);
});

describe('Savings reports', () => {
  it('answers 402 while the site is a Draft, and nothing is issued', async () => {
    const r = await owner.client.post(`/api/sites/${siteId}/reports`, { planId });
    expect(r.status).toBe(402);
    expect(r.json.error.code).toBe('audit_required');
    expect((await owner.client.get(`/api/sites/${siteId}/reports`)).json.reports).toEqual([]);
  });

  it('after the Site audit is paid through checkout, issues the report (201), sets Reported and e-mails Finance', async () => {
    const buy = await owner.client.post('/api/purchases', { siteIds: [siteId] });
    expect(buy.status, JSON.stringify(buy.json)).toBe(201);
    expect((await payOnHostedPage(buy.json.checkoutUrl)).status).toBe(303);
    await expect.poll(async () => (await owner.client.get(`/api/sites/${siteId}`)).json.site.auditState, { timeout: 20_000 }).toBe('audited');

    const r = await owner.client.post(`/api/sites/${siteId}/reports`, { planId, title: 'Savings report for the check site' });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.notified).toEqual([financeEmail]);
    expect((await owner.client.get(`/api/sites/${siteId}`)).json.site.auditState).toBe('reported');
    const mail = await waitForMail(financeEmail, /^Savings report issued for Report check site$/);
    expect(linkIn(mail, `${owner.client.base}/sites/${siteId}/reports/`)).toContain(r.json.report.id);

    const one = await finance.get(`/api/sites/${siteId}/reports/${r.json.report.id}`);
    const snap = one.json.report.snapshot;
    expect(snap.cautions.length).toBeGreaterThanOrEqual(5);
    expect(snap.methodNotes.map((n: { title: string }) => n.title)).toContain('Capacitor needed');
    expect(snap.plan.name).toBe('Switched 200 kvar');
    // The report's saving is the plan's own evaluation: before minus after, both from the engine.
    expect(snap.plan.evaluation.totals.saving).toBeCloseTo(snap.plan.evaluation.totals.before - snap.plan.evaluation.totals.after, 6);

    const pdf = await finance.request('GET', `/api/sites/${siteId}/reports/${r.json.report.id}/pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.res.headers.get('content-type')).toBe('application/pdf');
    expect(String(pdf.json).startsWith('%PDF-')).toBe(true);
  });

  it('refuses Finance (403), a plan of another site (404), bad input (400), and another workspace (404)', async () => {
    expect((await finance.post(`/api/sites/${siteId}/reports`, { planId })).status).toBe(403);
    expect((await owner.client.post(`/api/sites/${siteId}/reports`, { planId: 'plan_nope' })).status).toBe(404);
    const bad = await owner.client.post(`/api/sites/${siteId}/reports`, { planId, colour: 'red' });
    expect(bad.status).toBe(400);
    expect(bad.json.error.fields).toHaveProperty('colour');
    const other = await ownerOfNewWorkspace('report-other');
    expect((await other.client.get(`/api/sites/${siteId}/reports`)).status).toBe(404);
  });
});
