import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { launch, SHOTS, signInPage } from '../support/browser';
import { DEMO } from '../support/http';
import { demoBillCsv, demoMeterCsv } from '../../src/lib/demo/meter-csv';

let browser: Browser;
const WAIT = { timeout: 20_000 };
const base = inject('baseUrl');
const dir = mkdtempSync(join(tmpdir(), 'varledger-journey-'));

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('Energy manager imports meter data and bills in Chromium', () => {
  it('maps a day-first local-time export, imports it, reads the quality report, imports bills and sees the multiplier warning', async () => {
    // The invented Tarn Valley export: semicolons, decimal commas, title lines, day-first local time, interval-ending.
    const meterFile = join(dir, 'tarn-valley-2025.csv');
    writeFileSync(meterFile, demoMeterCsv('tarn-valley'));
    const billFile = join(dir, 'tarn-valley-bills.csv');
    writeFileSync(billFile, demoBillCsv('tarn-valley'));

    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.energy, DEMO.password);
    await page.waitForURL(`${base}/`);

    await page.getByRole('button', { name: 'Add site' }).click();
    await page.getByLabel('Site name').fill('Journey glaze line');
    await page.getByLabel('Time zone (IANA)').fill('Europe/London');
    await page.getByLabel('Currency').fill('GBP');
    await page.getByRole('button', { name: 'Add site' }).last().click();
    await page.getByRole('link', { name: 'Journey glaze line' }).click();
    await page.getByRole('navigation', { name: 'Site sections' }).getByRole('link', { name: 'Meter data' }).click();

    await page.getByLabel('Meter export file').setInputFiles(meterFile);
    await expect.poll(() => page.getByText('Check the columns').count(), WAIT).toBe(1);
    expect(await page.getByLabel('Delimiter').inputValue()).toBe(';');
    expect(await page.getByLabel('Decimal separator').inputValue()).toBe(',');
    await page.getByLabel('Date order').selectOption('dmy');
    await page.getByRole('button', { name: 'Preview the first rows' }).click();
    await expect.poll(() => page.getByText('First rows as they will be read, 30-minute intervals').count(), WAIT).toBe(1);
    await page.screenshot({ path: `${SHOTS}/meter-mapping.png`, fullPage: true });
    await page.getByRole('button', { name: 'Import the whole file' }).click();
    await expect.poll(() => page.getByText(/^Imported 17,520 intervals/).count(), { timeout: 30_000 }).toBe(1);
    await expect.poll(() => page.getByRole('region', { name: /Data quality of/ }).count(), WAIT).toBe(1);
    await page.screenshot({ path: `${SHOTS}/meter-quality.png`, fullPage: true });

    await page.getByRole('navigation', { name: 'Site sections' }).getByRole('link', { name: 'Bills' }).click();
    await page.getByLabel('Bill history (CSV, one row per bill)').setInputFiles(billFile);
    await page.getByLabel('Date format').selectOption('dmy');
    await page.getByLabel('Decimal separator').selectOption(',');
    await page.getByLabel('Billed demand unit').selectOption('kVA');
    await page.getByRole('button', { name: 'Import bills' }).click();
    await expect.poll(() => page.getByText('Imported 12 bills.').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByText(/Billed kWh is a steady 1\.250 × the interval kWh over \d+ bills/).count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByText('differs ▲').count()).toBeGreaterThan(0);
    await page.screenshot({ path: `${SHOTS}/bills-reconciliation.png`, fullPage: true });
    await ctx.close();
  });
});
