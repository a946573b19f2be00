import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, Page } from 'playwright-core';
import { launch, SHOTS, signInPage } from '../support/browser';
import { DEMO } from '../support/http';

let browser: Browser;
const base = inject('baseUrl');
const tag = Date.now().toString(36);
const FIXED = `Journey fixed ${tag}`;
const SWITCHED = `Journey switched ${tag}`;
let siteId = '';

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** Accessibility check: no serious or critical axe violations on the page as shown. */
async function axeSerious(page: Page) {
  const r = await new AxeBuilder({ page }).analyze();
  return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}`);
}

describe('Correction and Payback in Chromium', () => {
  it('a Consultant builds and saves a Fixed and a Switched plan on Brackwater Kiln Works and sees the cautions', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.consultant, DEMO.password);
    // The consultant belongs to two workspaces: make Northgate Ceramics the active one.
    const workspaces = (await (await page.request.get(`${base}/api/workspaces`)).json()).workspaces as { id: string; name: string }[];
    const northgate = workspaces.find((w) => w.name === 'Northgate Ceramics')!;
    expect((await page.request.put(`${base}/api/workspaces/active`, { data: { workspaceId: northgate.id }, headers: { origin: base } })).status()).toBe(200);
    const sites = (await (await page.request.get(`${base}/api/sites`)).json()).sites as { id: string; name: string }[];
    siteId = sites.find((s) => s.name === 'Brackwater Kiln Works')!.id;

    await page.goto(`${base}/sites/${siteId}`);
    await page.getByRole('navigation', { name: 'Site sections' }).getByRole('link', { name: 'Correction' }).click();
    await page.waitForURL(`${base}/sites/${siteId}/correction`);
    // The seeded plans are listed.
    await expect.poll(() => page.getByRole('table', { name: 'Saved plans' }).getByText('Kiln hall fixed 150 kvar').count()).toBe(1);

    // Sizing search, then a Fixed bank of at least 150 kvar from the table.
    await page.getByRole('button', { name: 'Run sizing search' }).click();
    const sizing = page.getByRole('table', { name: 'Sizing candidates' });
    await expect.poll(() => sizing.locator('tbody tr').count(), { timeout: 30_000 }).toBeGreaterThan(20);
    expect(await sizing.locator('tr[data-best-npv]').getByText('★ Best NPV').count()).toBe(1);
    expect(await sizing.locator('tr[data-shortest-payback]').getByText('◆ Shortest payback').count()).toBe(1);
    expect(await page.getByTestId('textbook').textContent()).toMatch(/Qc = P \(tan φ1 − tan φ2\)/);
    const fixedButtons = sizing.getByRole('button', { name: /^Use this size: Fixed bank, \d+ kvar$/ });
    const labels = await fixedButtons.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
    const pick = labels.find((l) => Number(/(\d+) kvar/.exec(l)![1]) >= 150)!;
    await page.getByRole('button', { name: pick, exact: true }).click();
    await page.screenshot({ path: `${SHOTS}/correction-sizing.png`, fullPage: true });
    await page.getByLabel('Plan name').fill(FIXED);
    await expect.poll(() => page.getByRole('heading', { name: `Evaluation: ${FIXED}` }).count(), { timeout: 20_000 }).toBe(1);
    // A Fixed bank this large runs the plant leading at light load (the seeded 150 kvar plan does).
    await expect.poll(() => page.getByTestId('leading-warning').count()).toBe(1);
    expect(await page.getByTestId('resonance').textContent()).toMatch(/Resonance near harmonic/);
    const cautions = page.getByRole('region', { name: /Cautions/ });
    for (const t of ['Qualified persons', 'Harmonic resonance', 'Switching transients', 'Voltage rise at light load', 'Protection and discharge', 'Estimates, not a design']) expect(await cautions.getByText(t).count()).toBe(1);
    expect(await cautions.textContent()).toMatch(/licensed engineer/);
    await page.screenshot({ path: `${SHOTS}/correction-fixed.png`, fullPage: true });
    await page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => page.getByText(`Saved the plan “${FIXED}”.`).count()).toBe(1);

    // A Switched bank typed into the builder.
    await page.getByRole('button', { name: 'New plan', exact: true }).click();
    const builder = page.getByRole('form', { name: 'Plan builder' });
    await builder.getByLabel('Plan name').fill(SWITCHED);
    await builder.getByLabel('Switched bank (n steps)').check();
    await builder.getByLabel('Total size').fill('250');
    await builder.getByLabel('Number of equal steps').fill('5');
    await builder.getByLabel('Controller target PF').fill('0.96');
    await builder.getByLabel('Discount rate').fill('5');
    await expect.poll(() => builder.getByText('Discount rate is a fraction: 0.08 means 8 %; at most 1 (100 %).').count()).toBe(1);
    await builder.getByLabel('Discount rate').fill('0.07');
    await expect.poll(() => page.getByRole('heading', { name: `Evaluation: ${SWITCHED}` }).count(), { timeout: 20_000 }).toBe(1);
    await page.getByRole('button', { name: 'Save plan' }).click();
    await expect.poll(() => page.getByText(`Saved the plan “${SWITCHED}”.`).count()).toBe(1);
    await expect.poll(() => page.getByRole('table', { name: 'Saved plans' }).getByText(SWITCHED).count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/correction-switched.png`, fullPage: true });
    expect(await axeSerious(page)).toEqual([]);

    // A copy under the same name is refused (409, the name field says why); renamed and deleted under another name.
    await page.getByRole('button', { name: 'Save as a new plan' }).click();
    await expect.poll(() => builder.getByText('Already used on this site.').count()).toBe(1);
    const COPY = `Journey copy ${tag}`;
    await builder.getByLabel('Plan name').fill(COPY);
    await page.getByRole('button', { name: 'Save as a new plan' }).click();
    await expect.poll(() => page.getByText(`Saved the plan “${COPY}”.`).count()).toBe(1);
    const saved = page.getByRole('table', { name: 'Saved plans' });
    await page.getByRole('button', { name: `Rename ${COPY}` }).click();
    await page.getByLabel(`New name for ${COPY}`).fill(`${COPY} renamed`);
    await page.getByRole('button', { name: 'Save name' }).click();
    await expect.poll(() => saved.getByText(`${COPY} renamed`, { exact: true }).count()).toBe(1);
    await page.getByRole('button', { name: `Delete ${COPY} renamed` }).click();
    await page.getByRole('button', { name: 'Delete for good' }).click();
    await expect.poll(() => page.getByText(`Deleted the plan “${COPY} renamed”.`).count()).toBe(1);
    await expect.poll(() => saved.getByText(`${COPY} renamed`).count()).toBe(0);
    expect(await saved.getByText(SWITCHED).count()).toBe(1);
    await ctx.close();
  });

  it('Finance opens Payback, sees both plans, downloads XLSX and CSV, and has no edit controls on Correction', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.finance, DEMO.password); // Finance lands on Payback
    if (!page.url().endsWith('/payback')) await page.getByRole('link', { name: 'Payback', exact: true }).click();
    await page.waitForURL(`${base}/payback`);
    const table = page.getByRole('table', { name: 'Payback of saved plans' });
    await expect.poll(() => table.getByText(FIXED).count()).toBe(1);
    expect(await table.getByText(SWITCHED).count()).toBe(1);
    expect(await table.getByRole('row').filter({ hasText: SWITCHED }).getByText('Switched bank (5 steps)').count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/payback.png`, fullPage: true });
    expect(await axeSerious(page)).toEqual([]);

    const [xlsx] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download XLSX' }).click()]);
    expect(xlsx.suggestedFilename()).toBe('varledger-payback-northgate-ceramics.xlsx');
    const wb = new ExcelJS.Workbook();
    const bytes = readFileSync((await xlsx.path())!);
    await wb.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const ws = wb.getWorksheet('Payback')!;
    const header = (ws.getRow(1).values as unknown[]).slice(1);
    const planCol = header.indexOf('Plan') + 1;
    const names: unknown[] = [];
    ws.eachRow((row, n) => { if (n > 1) names.push(row.getCell(planCol).value); });
    expect(names).toEqual(expect.arrayContaining([FIXED, SWITCHED]));

    const [csv] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()]);
    expect(csv.suggestedFilename()).toBe('varledger-payback-northgate-ceramics.csv');
    const text = readFileSync((await csv.path())!, 'utf8').replace(/^\uFEFF/, '');
    const lines = text.trim().split(/\r\n/);
    expect(lines[0]).toContain('Capex (currency)');
    expect(lines.filter((l) => l.startsWith('Brackwater Kiln Works,Journey')).length).toBe(2);

    await page.goto(`${base}/sites/${siteId}/correction`);
    await expect.poll(() => page.getByRole('table', { name: 'Saved plans' }).getByText(FIXED).count()).toBe(1);
    await page.getByRole('button', { name: `Open ${FIXED}` }).click();
    await expect.poll(() => page.getByRole('heading', { name: `Evaluation: ${FIXED}` }).count(), { timeout: 20_000 }).toBe(1);
    expect(await page.getByText('Read-only: your role sees plans').count()).toBe(1);
    for (const name of [/^Save/, /^Rename/, /^Delete/, /^Use this size/, 'New plan']) expect(await page.getByRole('button', { name }).count()).toBe(0);
    expect(await page.getByLabel('Plan name').isDisabled()).toBe(true);
    expect(await page.getByRole('region', { name: /Cautions/ }).count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/correction-finance.png`, fullPage: true });
    expect(await axeSerious(page)).toEqual([]);
    const denied = await page.request.post(`${base}/api/sites/${siteId}/plans`, { data: { name: 'By finance', bank: { kind: 'fixed', kvar: 50 }, costs: { perKvar: 30, fixedInstallation: 1000 }, finance: { discountRate: 0.08, lifeYears: 10 } }, headers: { origin: base } });
    expect(denied.status()).toBe(403);
    // Reading on a phone: the page still shows the cautions and the saved plans.
    await page.setViewportSize({ width: 390, height: 844 });
    expect(await page.getByRole('region', { name: /Cautions/ }).isVisible()).toBe(true);
    await page.screenshot({ path: `${SHOTS}/correction-phone.png`, fullPage: true });
    await page.goto(`${base}/payback`);
    await expect.poll(() => page.getByRole('table', { name: 'Payback of saved plans' }).getByText(FIXED).count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/payback-phone.png`, fullPage: true });
    await ctx.close();
  });
});
