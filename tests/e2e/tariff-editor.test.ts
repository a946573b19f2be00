import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import AxeBuilder from '@axe-core/playwright';
import { launch, SHOTS, signInPage } from '../support/browser';
import { DEMO } from '../support/http';

let browser: Browser;
const base = inject('baseUrl');
const NEW_NAME = 'PF rider, revised demand rate (journey)';

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function signIn(page: Page, email: string) {
  // Each role has its own landing page; the journeys start from the Portfolio.
  await signInPage(page, base, email, DEMO.password);
  await page.goto(`${base}/`);
}

async function openTariff(page: Page, site = 'Brackwater Kiln Works') {
  await page.getByRole('link', { name: site }).first().click();
  await page.getByRole('navigation', { name: 'Site sections' }).getByRole('link', { name: 'Tariff' }).click();
  await expect.poll(() => page.getByRole('heading', { name: /^Versions/ }).count(), { timeout: 15_000 }).toBe(1);
}

async function seriousViolations(page: Page) {
  const result = await new AxeBuilder({ page }).analyze();
  return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`);
}

const totalOf = (page: Page) => page.getByTestId('preview-total').textContent();

describe('tariff editor in Chromium', () => {
  it('an Energy manager copies the current version, changes a rate, sees the preview move, saves it and finds it listed', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, DEMO.energy);
    await openTariff(page);
    await page.screenshot({ path: `${SHOTS}/tariff-versions.png`, fullPage: true });
    const before = await page.getByRole('article', { name: /, from \d{4}-\d\d-\d\d$/ }).count();
    expect(before).toBeGreaterThan(0);

    await page.getByRole('button', { name: 'Copy the current version' }).click();
    // The copy is compared with the version it came from: the same figures, so no change.
    await expect.poll(() => page.getByTestId('preview-change').textContent(), { timeout: 20_000 }).toBe('no change');
    const original = await totalOf(page);
    expect(original).toMatch(/^\$[\d,]+\.\d\d$/);
    expect(await page.getByRole('table').getByRole('row').count()).toBe(12 + 2);

    // Raise the demand rate of the PF-adjusted billing demand rule: the preview total rises.
    const rule1 = page.getByRole('article', { name: /^Rule 1:/ });
    await rule1.getByLabel('Demand rate').fill('21.3');
    await expect.poll(() => totalOf(page), { timeout: 20_000 }).not.toBe(original);
    await expect.poll(() => page.getByTestId('preview-change').textContent()).toMatch(/^\+\$[\d,]+\.\d\d more$/);

    // A value outside the engine's bounds is refused next to its field, and the preview waits.
    await rule1.getByLabel('Target PF').fill('1.4');
    await expect.poll(() => rule1.getByText('Must be 1 or less.').count()).toBe(1);
    await expect.poll(() => page.getByText('Fix the fields marked in the form to update the preview.').count()).toBe(1);
    await rule1.getByLabel('Target PF').fill('0.9');
    await expect.poll(() => rule1.getByText('Must be 1 or less.').count()).toBe(0);

    // Add a rule of another type, limited to a night window that runs past midnight.
    await page.getByRole('button', { name: 'Add a rule' }).click();
    await page.getByRole('group', { name: 'Rule types' }).getByRole('button', { name: /^Excess reactive energy/ }).click();
    const rule3 = page.getByRole('article', { name: /^Rule 3:/ });
    expect(await rule3.getByLabel('Allowance PF').inputValue()).toBe('0.9');
    await rule3.getByLabel('Only in a time-of-use window').check();
    await rule3.getByRole('button', { name: 'Add time range' }).click();
    await rule3.getByLabel('From', { exact: true }).fill('22:00');
    await rule3.getByLabel('To', { exact: true }).fill('06:00');
    await expect.poll(() => rule3.getByText('Runs past midnight: 22:00 to 24:00, then 00:00 to 06:00.').count()).toBe(1);
    await rule3.getByLabel('Rate per kvarh').fill('0.01');

    // Reorder: duplicate rule 2, remove the copy again, then move the new rule up to second place.
    await page.getByRole('button', { name: 'Duplicate rule 2' }).click();
    await expect.poll(() => page.getByRole('article', { name: /^Rule 3: Leading kvarh while idle \(copy\)$/ }).count()).toBe(1);
    await page.getByRole('button', { name: 'Remove rule 3' }).click();
    await expect.poll(() => page.getByRole('article', { name: /^Rule \d:/ }).count()).toBe(3);
    await page.getByRole('button', { name: 'Move rule 3 up' }).click();
    await expect.poll(() => page.getByRole('article', { name: /^Rule 2: Excess reactive energy$/ }).count()).toBe(1);

    await page.getByLabel('Version name').fill(NEW_NAME);
    await page.getByLabel('In force from').fill('2030-01-01');
    await expect.poll(() => page.getByText('Up to date with the form.').count(), { timeout: 20_000 }).toBe(1);

    const violations = await seriousViolations(page);
    expect(violations, violations.join('\n')).toEqual([]);
    await page.screenshot({ path: `${SHOTS}/tariff-editor.png`, fullPage: true });

    await page.getByRole('button', { name: 'Save version' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: `Saved “${NEW_NAME}”, in force from 2030-01-01.` }).count(), { timeout: 15_000 }).toBe(1);
    const saved = page.getByRole('article', { name: `${NEW_NAME}, from 2030-01-01` });
    await expect.poll(() => saved.count()).toBe(1);
    await expect.poll(() => saved.getByText(/\$21\.30\/kW/).count()).toBe(1);
    await expect.poll(() => saved.getByText(/Only in: 22:00-06:00/).count()).toBe(1);
    expect(await saved.getByRole('listitem').nth(1).textContent()).toMatch(/^2\.Excess reactive energy/);
    expect(await page.getByRole('article', { name: /, from \d{4}-\d\d-\d\d$/ }).count()).toBe(before + 1);
    await page.screenshot({ path: `${SHOTS}/tariff-saved.png`, fullPage: true });

    // The server's own check lands next to the field: a second version on the same date.
    await page.getByRole('button', { name: 'Copy the current version' }).click();
    await page.getByLabel('In force from').fill('2030-01-01');
    await page.getByRole('button', { name: 'Save version' }).click();
    await expect.poll(() => page.locator('#tf-effectiveFrom-err').textContent(), { timeout: 15_000 }).toBe('Already used by another version.');
    // Changed fields are not thrown away without a confirmation.
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('button', { name: 'Discard' }).click();

    // Edit the saved version: its name changes in the list.
    await page.getByRole('button', { name: `Edit ${NEW_NAME} from 2030-01-01` }).click();
    await page.getByLabel('Version name').fill(`${NEW_NAME}, edited`);
    await page.getByRole('button', { name: 'Save version' }).click();
    await expect.poll(() => page.getByRole('article', { name: `${NEW_NAME}, edited, from 2030-01-01` }).count(), { timeout: 15_000 }).toBe(1);

    // Delete the journey's version again, after a confirmation.
    await page.getByRole('button', { name: `Delete ${NEW_NAME}, edited from 2030-01-01` }).click();
    await page.getByRole('button', { name: 'Yes, delete' }).click();
    await expect.poll(() => page.getByRole('article', { name: /from 2030-01-01$/ }).count(), { timeout: 15_000 }).toBe(0);
    expect(await page.getByRole('article', { name: /, from \d{4}-\d\d-\d\d$/ }).count()).toBe(before);
    await ctx.close();
  });

  it('starts a new version from an invented example in the site currency', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, DEMO.energy);
    await openTariff(page);
    // Fields the example leaves out show the engine's defaults once they apply.
    await page.getByLabel('From an example tariff').selectOption({ label: 'Billing demand raised by target PF / actual PF' });
    await page.getByRole('button', { name: 'New version from this example' }).click();
    const ratio = page.getByRole('article', { name: /^Rule 1:/ });
    expect(await ratio.getByLabel('Rounding of points').count()).toBe(0);
    await ratio.getByLabel('Adjustment formula').selectOption('per-point');
    expect(await ratio.getByLabel('Rounding of points').inputValue()).toBe('up');
    expect(await ratio.getByLabel('Increase per PF point').inputValue()).toBe('1');
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('button', { name: 'Discard' }).click();

    await page.getByLabel('From an example tariff').selectOption({ label: 'Percentage surcharge in tiers, with a credit' });
    await page.getByRole('button', { name: 'New version from this example' }).click();
    expect(await page.getByLabel('Currency').inputValue()).toBe('USD');
    const rule1 = page.getByRole('article', { name: /^Rule 1:/ });
    expect(await rule1.getByLabel('Threshold PF').inputValue()).toBe('0.95');
    expect(await rule1.getByRole('group', { name: 'Surcharge tiers' }).getByLabel('Percent per step').count()).toBe(2);
    await expect.poll(() => page.getByTestId('preview-total').count(), { timeout: 20_000 }).toBe(1);
    await page.screenshot({ path: `${SHOTS}/tariff-from-example.png`, fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: `${SHOTS}/tariff-editor-phone.png`, fullPage: true });
    await page.getByRole('button', { name: 'Cancel' }).click();
    await ctx.close();
  });

  it('a Consultant on a client site without meter data sees the preview say what to upload', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, DEMO.consultant);
    await page.getByRole('combobox', { name: 'Workspace', exact: true }).selectOption({ label: 'Harrow Dairy Cooperative (Consultant)' });
    await expect.poll(() => page.getByRole('link', { name: 'Harrow Creamery' }).count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await openTariff(page, 'Harrow Creamery');
    await page.getByRole('button', { name: 'Copy the current version' }).click();
    await expect.poll(() => page.getByText('No meter data for this site yet: upload meter data to preview charges.').count(), { timeout: 20_000 }).toBe(1);
    expect(await page.getByRole('link', { name: 'Go to Meter data' }).count()).toBe(1);
    await page.screenshot({ path: `${SHOTS}/tariff-preview-empty.png` });
    await page.getByRole('button', { name: 'Cancel' }).click();
    await ctx.close();
  });

  it('Finance reads the versions without edit controls', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, DEMO.finance);
    await openTariff(page);
    expect(await page.getByRole('article', { name: /, from \d{4}-\d\d-\d\d$/ }).count()).toBeGreaterThan(0);
    expect(await page.getByRole('button', { name: /^(Edit|Delete|Copy)/ }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Start a new version' }).count()).toBe(0);
    const violations = await seriousViolations(page);
    expect(violations, violations.join('\n')).toEqual([]);
    await ctx.close();
  });
});
