import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, SHOTS } from '../support/browser';
import { linkIn, waitForMail } from '../support/mailbox';
import { uniqueEmail } from '../support/accounts';

let browser: Browser;
const WAIT = { timeout: 20_000 };
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('onboarding journey in Chromium', () => {
  it('signs up, verifies by mail, creates a workspace and a site, invites Finance who then sees it read-only', async () => {
    const ownerEmail = uniqueEmail('journey-owner');
    const financeEmail = uniqueEmail('journey-finance');
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await ctx.newPage();

    // Sign up.
    await page.goto(`${base}/sign-up`);
    await page.getByLabel('Your name').fill('Maren Holt');
    await page.getByLabel('Work e-mail').fill(ownerEmail);
    await page.getByLabel('Password').fill('journey-password-1');
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => page.getByRole('status').textContent(), WAIT).toContain(ownerEmail);

    // Verify from the mail in the local sink.
    const verify = await waitForMail(ownerEmail, /Confirm your e-mail/);
    await page.goto(linkIn(verify, base));
    await expect.poll(() => page.locator('h1').textContent(), WAIT).toBe('Address confirmed');
    await page.getByRole('link', { name: 'Create your first workspace' }).click();

    // Create a workspace, then a site.
    await page.getByLabel('Workspace name').fill('Holt Bakeries');
    await page.getByRole('button', { name: 'Create workspace' }).click();
    await page.waitForURL(`${base}/`);
    await expect.poll(() => page.getByText('Holt Bakeries has no sites yet.').count(), WAIT).toBe(1);
    await page.screenshot({ path: `${SHOTS}/portfolio-empty.png`, fullPage: true });
    await page.getByRole('button', { name: 'Add site' }).click();
    await page.getByLabel('Site name').fill('Holt Ovens North');
    await page.getByLabel('Time zone (IANA)').fill('Europe/Berlin');
    await page.getByLabel('Currency').fill('EUR');
    await page.getByLabel('Transformer rating (kVA)').fill('800');
    await page.getByRole('button', { name: 'Add site' }).last().click();
    await expect.poll(() => page.getByRole('link', { name: 'Holt Ovens North' }).count(), WAIT).toBe(1);

    // Invite a Finance member.
    await page.goto(`${base}/members`);
    await page.getByLabel('E-mail').fill(financeEmail);
    await page.getByLabel('Role', { exact: true }).selectOption('finance');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => page.getByRole('status').textContent(), WAIT).toContain(`Invitation sent to ${financeEmail} as Finance`);
    await page.screenshot({ path: `${SHOTS}/members-invited.png`, fullPage: true });

    // The invitee, in a fresh context: open the invitation, create an account, verify, accept.
    const invite = await waitForMail(financeEmail, /invited you to Holt Bakeries/);
    const inviteLink = linkIn(invite, `${base}/invitations/`);
    const fctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const fpage = await fctx.newPage();
    await fpage.goto(inviteLink);
    await fpage.getByRole('link', { name: 'Create account' }).click();
    await fpage.getByLabel('Your name').fill('Jonas Reckon');
    await fpage.getByLabel('Work e-mail').fill(financeEmail);
    await fpage.getByLabel('Password').fill('finance-password-1');
    await fpage.getByRole('button', { name: 'Create account' }).click();
    await expect.poll(() => fpage.getByRole('status').textContent(), WAIT).toContain(financeEmail);
    const fverify = await waitForMail(financeEmail, /Confirm your e-mail/);
    await fpage.goto(linkIn(fverify, base));
    await fpage.getByRole('link', { name: 'Continue' }).click();
    await fpage.waitForURL(inviteLink);
    await expect.poll(() => fpage.getByText('as Finance').count(), WAIT).toBe(1);
    await fpage.getByRole('button', { name: 'Join Holt Bakeries' }).click();
    // Finance lands on its home, the payback table; the Portfolio is in the top bar.
    await fpage.waitForURL(`${base}/payback`);
    await fpage.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Portfolio' }).click();
    await fpage.waitForURL(`${base}/?portfolio=1`);

    // Finance sees the site but no control to change it.
    await expect.poll(() => fpage.getByRole('link', { name: 'Holt Ovens North' }).count(), WAIT).toBe(1);
    expect(await fpage.getByText('You are Finance in this workspace.').count()).toBe(1);
    expect(await fpage.getByRole('button', { name: 'Add site' }).count()).toBe(0);
    expect(await fpage.getByRole('button', { name: /^Edit / }).count()).toBe(0);
    expect(await fpage.getByRole('button', { name: /^Delete / }).count()).toBe(0);
    await fpage.screenshot({ path: `${SHOTS}/portfolio-finance.png`, fullPage: true });

    // And the server agrees: a write from the Finance session is refused.
    const status = await fpage.evaluate(async () => (await fetch('/api/sites', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Nope', timeZone: 'UTC' }) })).status);
    expect(status).toBe(403);
    await ctx.close();
    await fctx.close();
  });
});
