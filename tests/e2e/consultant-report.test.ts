import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { readFileSync } from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, Page } from 'playwright-core';
import { launch, SHOTS, signInPage } from '../support/browser';
import { as, DEMO } from '../support/http';
import { uploadFile } from '../support/upload';
import { demoMeterCsv, demoMeterMapping } from '../../src/lib/demo/meter-csv';
import { EXAMPLE_TARIFFS } from '../../src/lib/demo/tariffs';

let browser: Browser;
const base = inject('baseUrl');
const WAIT = { timeout: 20_000 };

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** axe on the page as it stands: no serious or critical violation (WCAG rules as axe-core ships them). */
async function axe(page: Page, name: string) {
  const r = await new AxeBuilder({ page }).analyze();
  const bad = r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(bad.map((v) => `${name}: ${v.id} (${v.nodes.length}) ${v.nodes[0]?.target.join(' ')}`)).toEqual([]);
}

describe('Consultant audits a client site and issues a Savings report in Chromium', () => {
  it('pays the Site audit, issues the report from a saved plan, opens the print page and downloads the PDF; every screen passes axe', async () => {
    // Set-up through the API as the same consultant, in the client workspace only they belong to.
    const api = await as(DEMO.consultant);
    const harrow = (await api.get('/api/workspaces')).json.workspaces.find((w: { name: string }) => w.name === 'Harrow Dairy Cooperative');
    await api.put('/api/workspaces/active', { workspaceId: harrow.id });
    const siteId = (await api.post('/api/sites', { name: `Harrow whey plant ${Date.now()}`, timeZone: 'America/Chicago', currency: 'USD', serviceVoltageV: 480, transformerKva: 1500, transformerImpedancePct: 5.75 })).json.site.id;
    expect((await uploadFile(api, `/api/sites/${siteId}/meter-data`, { name: 'year.csv', content: demoMeterCsv('brackwater') }, { mapping: JSON.stringify(demoMeterMapping('brackwater')) })).status).toBe(201);
    expect((await api.post(`/api/sites/${siteId}/tariffs`, EXAMPLE_TARIFFS[0]!.tariff)).status).toBe(201);
    const plan = await api.post(`/api/sites/${siteId}/plans`, { name: 'Switched 300 kvar, 6 steps', bank: { kind: 'switched', totalKvar: 300, steps: 6, targetPf: 0.97 }, costs: { perKvar: 55, fixedInstallation: 6000, omPctOfCapex: 1 }, finance: { discountRate: 0.08, lifeYears: 15 } });
    expect(plan.status, JSON.stringify(plan.json)).toBe(201);

    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.consultant, DEMO.password);
    await page.waitForURL(`${base}/`);
    // Switch this browser session to the client workspace (the switcher itself is exercised in the purchase journey).
    const switched = await page.request.put(`${base}/api/workspaces/active`, { data: { workspaceId: harrow.id }, headers: { origin: base } });
    expect(switched.status()).toBe(200);
    await page.goto(`${base}/`);
    expect(await page.locator('h1').textContent()).toContain('Harrow Dairy Cooperative');
    await expect.poll(() => page.getByRole('link', { name: /Harrow whey plant/ }).count(), WAIT).toBe(1);
    await expect.poll(() => page.locator('tbody').textContent(), WAIT).toContain('$');
    await axe(page, 'portfolio');
    await page.screenshot({ path: `${SHOTS}/consultant-portfolio.png`, fullPage: true });

    const sections = page.getByRole('navigation', { name: 'Site sections' });
    await page.getByRole('link', { name: /Harrow whey plant/ }).click();
    await expect.poll(() => page.getByTestId('headline').textContent(), WAIT).toMatch(/paid \$[\d,]+ in power-factor charges/);
    await axe(page, 'overview');
    await page.screenshot({ path: `${SHOTS}/consultant-overview.png`, fullPage: true });
    for (const [link, ready] of [['Findings', 'Quadrant cloud'], ['Meter data', 'Meters and import history'], ['Bills', 'Billed against computed']] as const) {
      await sections.getByRole('link', { name: link }).click();
      await expect.poll(() => page.getByRole('heading', { name: ready }).count(), WAIT).toBe(1);
      await page.waitForLoadState('networkidle');
      await axe(page, link);
    }

    // The report needs the paid Site audit: the Report page says so, Purchases sells it.
    await sections.getByRole('link', { name: 'Report' }).click();
    await expect.poll(() => page.getByText(/is a Draft: its findings become final/).count(), WAIT).toBe(1);
    await axe(page, 'report (draft)');
    await page.getByRole('link', { name: 'Go to Purchases' }).click();
    await page.waitForURL(`${base}/purchases`);
    await page.getByLabel(/Harrow whey plant/).check();
    await page.getByRole('button', { name: 'Pay for 1 Site audit' }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByLabel('Expiry (MM/YY)').fill('09/31');
    await page.getByLabel('CVC').fill('271');
    await page.getByRole('button', { name: /^Pay / }).click();
    await page.waitForURL(/\/purchases\?checkout=paid/);
    await expect.poll(async () => (await api.get(`/api/sites/${siteId}`)).json.site.auditState, WAIT).toBe('audited');

    await page.goto(`${base}/sites/${siteId}/report`);
    await page.getByLabel('Recommended plan').selectOption({ label: /Switched 300 kvar/ } as never).catch(async () => {
      const value = await page.locator('#r-plan option', { hasText: 'Switched 300 kvar' }).getAttribute('value');
      await page.getByLabel('Recommended plan').selectOption(value!);
    });
    await page.getByRole('button', { name: 'Issue report' }).click();
    await expect.poll(() => page.getByRole('status').textContent(), WAIT).toMatch(/^Issued /);
    await expect.poll(() => page.getByRole('link', { name: 'Open' }).count(), WAIT).toBe(1);
    await axe(page, 'report (issued)');
    expect((await api.get(`/api/sites/${siteId}`)).json.site.auditState).toBe('reported');

    await page.getByRole('link', { name: 'Open' }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Cautions' }).count(), WAIT).toBe(1);
    expect(await page.getByText('Capacitor banks must be designed and installed by qualified persons').count()).toBeGreaterThan(0);
    await axe(page, 'print page');
    await page.screenshot({ path: `${SHOTS}/report-print.png`, fullPage: true });
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()]);
    const pdf = readFileSync((await download.path())!);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.subarray(-8).toString()).toContain('%%EOF');
    // Opened: the document's page tree lists its pages (cover, findings, plan, payback, cautions).
    const pages = (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;
    expect(pages).toBeGreaterThanOrEqual(4);
    expect(download.suggestedFilename()).toMatch(/^Savings report Harrow whey plant .*\.pdf$/);
    await ctx.close();
  });
});
