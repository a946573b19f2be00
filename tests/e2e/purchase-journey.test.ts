import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, SHOTS, signInPage } from '../support/browser';
import { as, DEMO } from '../support/http';
import { waitForMail } from '../support/mailbox';

let browser: Browser;
const base = inject('baseUrl');
/** How long a step may take to appear (page load, hydration, the webhook); a ceiling, not a speed check. */
const WAIT = { timeout: 20_000 };

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('Consultant buys Site audits in Chromium', () => {
  it('chooses two Draft sites, is declined once, pays with the test card, returns to Paid, sees them Audited and gets the receipt', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.consultant, DEMO.password);
    await page.waitForURL(`${base}/`);

    // The consultant's session may open on the other client: switch to Northgate Ceramics.
    const switcher = page.locator('#workspace-switcher');
    const northgate = await switcher.locator('option', { hasText: 'Northgate Ceramics' }).getAttribute('value');
    if ((await switcher.inputValue()) !== northgate) {
      await switcher.selectOption(northgate!);
      await expect.poll(() => page.locator('h1').textContent(), WAIT).toContain('Northgate Ceramics');
    }

    await page.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Purchases' }).click();
    await page.waitForURL(`${base}/purchases`);
    // The demo history: Brackwater Kiln Works was paid already and is not offered again.
    await expect.poll(() => page.getByRole('button', { name: 'View receipt VLR-20260112-KLN4WB' }).count(), WAIT).toBe(1);
    expect(await page.getByLabel('Brackwater Kiln Works').count()).toBe(0);
    await page.getByLabel('Tarn Valley Glaze Plant').check();
    await page.getByLabel('Kestrel Bay Packaging').check();
    await expect.poll(() => page.locator('tfoot').first().textContent(), WAIT).toContain('Total for 2 Site auditsUS$580.00');
    await page.screenshot({ path: `${SHOTS}/purchases-choose.png`, fullPage: true });
    await page.getByRole('button', { name: 'Pay for 2 Site audits' }).click();

    // The payment fake's hosted page.
    await page.waitForURL(/\/checkout\/cs_test_/);
    expect(await page.getByText('Site audit: Tarn Valley Glaze Plant').count()).toBe(1);
    expect(await page.getByText('Site audit: Kestrel Bay Packaging').count()).toBe(1);
    await page.getByLabel('Card number').fill('4000 0000 0000 0002');
    await page.getByLabel('Expiry (MM/YY)').fill('09/31');
    await page.getByLabel('CVC').fill('271');
    await page.getByRole('button', { name: 'Pay US$580.00' }).click();
    await expect.poll(() => page.getByRole('alert').textContent(), WAIT).toContain('Your card was declined.');
    await page.screenshot({ path: `${SHOTS}/checkout-declined.png`, fullPage: true });
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByLabel('Expiry (MM/YY)').fill('09/31');
    await page.getByLabel('CVC').fill('271');
    await page.getByRole('button', { name: 'Pay US$580.00' }).click();

    // Back on Purchases: pending until the webhook has arrived, then Paid with the receipt number.
    await page.waitForURL(/\/purchases\?checkout=paid&purchase=pur_/);
    await expect.poll(() => page.getByRole('status').first().textContent(), WAIT).toMatch(/^Paid: 2 Site audits for Kestrel Bay Packaging and Tarn Valley Glaze Plant\. The sites are now Audited\. Receipt VLR-\d{8}-[A-Z2-9]{6} was sent to consultant@fieldline\.example\.$/);
    const receiptNumber = (await page.getByRole('status').first().textContent())!.match(/VLR-\d{8}-[A-Z2-9]{6}/)![0];
    await page.getByRole('button', { name: `View receipt ${receiptNumber}` }).click();
    const receipt = page.getByRole('region', { name: `Receipt ${receiptNumber}` });
    await expect.poll(() => receipt.textContent(), WAIT).toContain('Site audit, Kestrel Bay PackagingUS$290.00');
    expect(await receipt.textContent()).toContain('Total paidUS$580.00');
    // Paid sites are no longer offered for purchase.
    expect(await page.getByLabel('Tarn Valley Glaze Plant').count()).toBe(0);
    expect(await page.getByLabel('Kestrel Bay Packaging').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/purchases-paid.png`, fullPage: true });

    // The Portfolio shows both sites Audited.
    await page.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Portfolio' }).click();
    await page.waitForURL(`${base}/`);
    for (const name of ['Tarn Valley Glaze Plant', 'Kestrel Bay Packaging', 'Brackwater Kiln Works']) {
      await expect.poll(() => page.getByRole('row').filter({ has: page.getByRole('link', { name }) }).textContent(), { ...WAIT, message: name }).toContain('Audited');
    }
    await page.screenshot({ path: `${SHOTS}/portfolio-audited.png`, fullPage: true });

    // The receipt arrived over SMTP in the sink.
    const mail = await waitForMail(DEMO.consultant, new RegExp(`receipt ${receiptNumber}`));
    expect(mail.subject).toBe(`Varledger receipt ${receiptNumber}: 2 Site audits paid`);
    expect(mail.text).toContain('Site audit, Tarn Valley Glaze Plant: US$290.00');
    expect(mail.text).toContain('Site audit, Kestrel Bay Packaging: US$290.00');
    expect(mail.text).toContain('Total paid: US$580.00');
    expect(mail.text).toContain('"Northgate Ceramics"');
    expect(mail.html).toContain(receiptNumber);
    await ctx.close();
  });

  it('an Owner who goes back from the hosted page sees the checkout cancelled, nothing charged, and the site still offered', async () => {
    const owner = await as(DEMO.owner);
    const created = await owner.post('/api/sites', { name: 'Cancel Journey Annex', timeZone: 'Europe/London', currency: 'GBP' });
    expect(created.status).toBe(201);
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    await signInPage(page, base, DEMO.owner, DEMO.password);
    await page.waitForURL(`${base}/`);
    await page.goto(`${base}/purchases`);
    await page.getByLabel('Cancel Journey Annex').check();
    await page.getByRole('button', { name: 'Pay for 1 Site audit' }).click();
    await page.waitForURL(/\/checkout\/cs_test_/);
    await page.getByRole('button', { name: 'Cancel and go back' }).click();
    await page.waitForURL(/\/purchases\?checkout=cancelled&purchase=pur_/);
    await expect.poll(() => page.getByRole('status').first().textContent(), WAIT).toBe('Checkout cancelled: nothing was charged for the Site audit of Cancel Journey Annex. Choose sites again when you are ready.');
    await expect.poll(() => page.getByRole('row').filter({ hasText: 'Cancel Journey Annex' }).filter({ hasText: 'Cancelled' }).count(), WAIT).toBe(1);
    expect(await page.getByLabel('Cancel Journey Annex').count()).toBe(1);
    const purchaseId = new URL(page.url()).searchParams.get('purchase')!;
    expect((await owner.get(`/api/purchases/${purchaseId}`)).json.purchase.status).toBe('cancelled');
    expect((await owner.get(`/api/sites/${created.json.site.id}`)).json.site.auditState).toBe('draft');
    await page.screenshot({ path: `${SHOTS}/purchases-cancelled.png`, fullPage: true });
    await ctx.close();
  });
});
