import { existsSync, mkdirSync, readFileSync, readdirSync } from 'node:fs';
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

/** Where the local mail catcher keeps what it receives (the same folder global-setup gives the app). */
export const MAIL_DIR =
  process.env.MAIL_CATCHER_DIR ??
  path.resolve(import.meta.dirname, '../../.data', `mail-browser-${process.env.BROWSER_TEST_PORT ?? 3210}`);

type CaughtMail = { to: string[]; subject: string; text: string; html: string | null; receivedAt: string };

/** Waits for the newest mail to `to` (matching `where`) in the catcher's folder (one JSON file per message). */
export async function waitForMail(
  to: string,
  where: (mail: CaughtMail) => boolean = () => true,
  timeoutMs = 20_000,
): Promise<CaughtMail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const names = existsSync(MAIL_DIR) ? readdirSync(MAIL_DIR).filter((n) => n.endsWith('.json')) : [];
    const found = names
      .sort()
      .reverse()
      .map((n) => JSON.parse(readFileSync(path.join(MAIL_DIR, n), 'utf8')) as CaughtMail)
      .find((m) => m.to.includes(to) && where(m));
    if (found) return found;
    if (Date.now() > until) throw new Error(`no mail to ${to} reached ${MAIL_DIR} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** The link (with its secret in the fragment) to `page` in a caught mail. */
export function linkIn(mail: CaughtMail, page: 'invitation' | 'reset-password'): string {
  const match = new RegExp(`https?://[^\\s]+/${page}#token=[A-Za-z0-9_-]{43}`).exec(mail.text);
  if (!match) throw new Error(`no ${page} link in:\n${mail.text}`);
  return match[0];
}
