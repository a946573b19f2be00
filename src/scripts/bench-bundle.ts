/**
 * Client JavaScript per page: every script a page loads from /_astro/, gzipped, summed, against
 * the 250 KB budget. Runs the built server on a temporary copy of the demo and loads each page in
 * Debian's Chromium as the demo Owner. Prints figures; asserts nothing.
 * Run: npm run build && npx tsx src/scripts/bench-bundle.ts
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createServer } from 'node:net';
import { gzipSync } from 'node:zlib';
import { chromium } from 'playwright-core';
import { openDb } from '../lib/db/client';
import { applyMigrations } from '../lib/db/migrate';
import { seedDemo } from '../lib/demo/seed';
import { seedDemoData } from '../lib/demo/seed-data';
import { DEMO_PASSWORD } from '../lib/demo/scenario';
import { startAppServer } from './lib/app-server';

const BUDGET_KB = 250;
const freePort = () => new Promise<number>((res) => { const s = createServer(); s.listen(0, '127.0.0.1', () => { const p = (s.address() as { port: number }).port; s.close(() => res(p)); }); });

const dir = mkdtempSync(join(tmpdir(), 'varledger-bundle-'));
process.env.DATA_DIR = dir;
const url = `file:${join(dir, 'b.db')}`;
const { db, ready } = openDb(url);
await ready;
await applyMigrations(db);
await seedDemo(db);
await seedDemoData(db);
db.$client.close();
const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const app = await startAppServer({ HOST: '127.0.0.1', PORT: String(port), APP_URL: base, DATABASE_URL: url, DATA_DIR: dir, MAIL_SINK: 'off', PAYMENT_FAKE: 'off', NODE_ENV: 'test' }, { quiet: true });
const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
try {
  const page = await browser.newPage();
  const scripts = new Map<string, number>();
  page.on('response', async (r) => {
    const u = new URL(r.url());
    if (u.pathname.startsWith('/_astro/') && u.pathname.endsWith('.js') && !scripts.has(u.pathname)) {
      try { scripts.set(u.pathname, gzipSync(await r.body()).length); } catch { /* redirected or aborted */ }
    }
  });
  await page.goto(`${base}/sign-in`);
  await page.fill('input[name=email]', 'owner@northgate.example');
  await page.fill('input[name=password]', DEMO_PASSWORD);
  await page.click('button:has-text("Sign in")');
  await page.waitForURL(`${base}/`);
  const siteHref = await page.locator('a[href^="/sites/"]').first().getAttribute('href');
  const pages: [string, string][] = [['Portfolio', '/'], ['Members', '/members'], ['Purchases', '/purchases'], ['Payback', '/payback'], ['Site overview', siteHref!], ['Meter data', `${siteHref}/meter-data`], ['Bills', `${siteHref}/bills`], ['Tariff', `${siteHref}/tariff`], ['Findings', `${siteHref}/findings`], ['Correction', `${siteHref}/correction`], ['Report', `${siteHref}/report`]];
  console.log(`Client JavaScript per page (gzipped), budget ${BUDGET_KB} KB`);
  for (const [name, path] of pages) {
    scripts.clear();
    const res = await page.goto(`${base}${path}`, { waitUntil: 'networkidle' });
    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight));
    await page.waitForLoadState('networkidle');
    const kb = [...scripts.values()].reduce((s, b) => s + b, 0) / 1024;
    console.log(`${name.padEnd(14)} ${String(res?.status()).padEnd(4)} ${kb.toFixed(1).padStart(7)} KB in ${String(scripts.size).padStart(2)} files  ${kb <= BUDGET_KB ? 'within budget' : 'OVER BUDGET'}`);
  }
} finally {
  await browser.close();
  await app.stop();
  rmSync(dir, { recursive: true, force: true });
}
