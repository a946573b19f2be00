/** Debian's Chromium driven by playwright-core (never a downloaded browser). */
import { chromium, type Browser, type Page } from 'playwright-core';
import { existsSync, mkdirSync } from 'node:fs';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const SHOTS = 'test-results/screenshots';

export async function launch(): Promise<Browser> {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium not found at ${CHROMIUM}: install Debian's chromium package (apt-get install -y chromium).`);
  mkdirSync(SHOTS, { recursive: true });
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-dev-shm-usage'],
  });
}

/** Signs in through the sign-in page as a person would; returns once the page has left /sign-in. */
export async function signInPage(page: Page, base: string, email: string, password: string) {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}
