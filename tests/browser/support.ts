import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const BASE_URL = `http://127.0.0.1:${process.env.BROWSER_TEST_PORT ?? 3210}`;
export const SCREENSHOTS = path.resolve(import.meta.dirname, '../../screenshots');
mkdirSync(SCREENSHOTS, { recursive: true });

/** The demo scenario's sign-ins (apps/api/src/db/demo-scenario.ts). */
export const DEMO = {
  password: 'corvane-demo-2026',
  admin: 'noor.haddad@corvane.example',
  manager: 'grace.okafor@corvane.example',
  lead: 'tomasz.wren@corvane.example',
  siteAdmin: 'ines.carvalho@corvane.example',
  technician: 'dale.pruitt@corvane.example',
};

export const PHONE = { width: 390, height: 844 };
export const DESKTOP = { width: 1440, height: 900 };

/** Debian's Chromium, headless, with the flags this machine's closed network needs; never a downloaded browser. */
export function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function newPage(browser: Browser, viewport = DESKTOP): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport, baseURL: BASE_URL });
  const page = await context.newPage();
  return { context, page };
}

export async function signIn(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO.password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

export async function shot(page: Page, name: string): Promise<void> {
  // Let colour transitions (navigation highlights) settle so the picture shows the resting state.
  await page.waitForTimeout(300);
  // A full-page picture taken while scrolled draws the sticky top bar mid-page.
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });
}
