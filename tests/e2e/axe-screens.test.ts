import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import AxeBuilder from '@axe-core/playwright';
import type { Browser } from 'playwright-core';
import { launch, SHOTS, signInPage } from '../support/browser';
import { DEMO } from '../support/http';

let browser: Browser;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** Screens not covered by the role journeys: the sign-in pages, Members, Purchases, Activity, the workspace form, 404. */
describe('axe on the remaining screens (no serious or critical violation)', () => {
  it('signed out and signed in as the Owner, at 1280 px and at a 390 px phone width', async () => {
    for (const width of [1280, 390]) {
      const ctx = await browser.newContext({ viewport: { width, height: 900 } });
      const page = await ctx.newPage();
      const check = async (name: string) => {
        await page.waitForLoadState('networkidle');
        const r = await new AxeBuilder({ page }).analyze();
        const bad = r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${name}@${width}: ${v.id} ${v.nodes[0]?.target.join(' ')}`);
        expect(bad).toEqual([]);
      };
      for (const path of ['/sign-in', '/sign-up', '/reset-password', '/verify']) {
        await page.goto(`${base}${path}`);
        await check(path);
      }
      await signInPage(page, base, DEMO.owner, DEMO.password);
      await page.waitForURL(`${base}/`);
      for (const path of ['/members', '/purchases', '/activity', '/activity?kind=tariff', '/workspaces/new', '/sites/site_does_not_exist']) {
        await page.goto(`${base}${path}`);
        await check(path);
      }
      await page.goto(`${base}/members`);
      await page.screenshot({ path: `${SHOTS}/members-${width}.png`, fullPage: true });
      await ctx.close();
    }
  });
});
