import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEMO, DESKTOP, launch, newPage, shot, signIn } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

/** The narrowest phone the web app is laid out for. */
const NARROW_PHONE = { width: 375, height: 812 };

describe('an administrator sets up a new plant', () => {
  it('adds a site, adds a technician there, and the technician signs in to that site', async () => {
    // Unique per run: a code is at most 12 capitals, digits and dashes.
    const code = `J-${Date.now().toString(36).toUpperCase().slice(-6)}`;
    const siteName = `Cedar Flats Cut Shop ${code}`;
    const techName = `Noel Varga ${code}`;
    const techEmail = `noel.varga.${code.toLowerCase()}@corvane.example`;
    const techPassword = 'first-shift-band-2026';

    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.admin);
    await page.goto('/sites');
    await expect.poll(() => page.getByRole('link', { name: 'Add site' }).count()).toBe(1);
    await shot(page, 'admin-sites-desktop');
    await page.getByRole('link', { name: 'Add site' }).click();
    await page.waitForURL('**/sites/new');

    // A blank form is answered in words beside each field, and nothing is sent.
    await page.getByRole('button', { name: 'Add site' }).click();
    await expect.poll(() => page.getByText('Choose the time zone the site works in').count()).toBe(1);
    await shot(page, 'admin-site-new-errors-desktop');

    await page.getByLabel('Name', { exact: true }).fill(siteName);
    await page.getByLabel('Code', { exact: true }).fill(code.toLowerCase());
    await page.getByLabel('City', { exact: true }).fill('Tulsa');
    await page.getByLabel('Region', { exact: true }).selectOption({ label: 'Gulf & Sierra' });
    await page.getByLabel('Time zone').selectOption('America/Chicago');
    await page.getByLabel('Currency', { exact: true }).selectOption('USD');
    await page.getByRole('radio', { name: /Imperial/ }).check();
    await expect.poll(() => page.getByText(/Now there:/).count()).toBe(1);
    await shot(page, 'admin-site-new-desktop');
    await page.getByRole('button', { name: 'Add site' }).click();

    await page.waitForURL((url) => /^\/sites\/[0-9a-f-]{36}$/.test(url.pathname));
    const siteUrl = new URL(page.url()).pathname;
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe(siteName);
    expect(await page.getByText('America/Chicago').count()).toBeGreaterThan(0);
    await shot(page, 'admin-site-added-desktop');

    // The same code again is refused by the server, and the form says so.
    await page.goto('/sites/new');
    await page.getByLabel('Name', { exact: true }).fill('Second try');
    await page.getByLabel('Code', { exact: true }).fill(code);
    await page.getByLabel('Region', { exact: true }).selectOption({ label: 'Gulf & Sierra' });
    await page.getByLabel('Time zone').selectOption('America/Chicago');
    await page.getByLabel('Currency', { exact: true }).selectOption('USD');
    await page.getByRole('radio', { name: /Imperial/ }).check();
    await page.getByRole('button', { name: 'Add site' }).click();
    await expect.poll(() => page.getByText('Another site already uses that code').count()).toBe(1);
    await shot(page, 'admin-site-code-taken-desktop');

    // Both forms on the narrowest phone: nothing on the page is wider than the screen.
    const pageWidth = () => page.evaluate(() => document.documentElement.scrollWidth);
    await page.setViewportSize(NARROW_PHONE);
    await shot(page, 'admin-site-code-taken-375');
    expect(await pageWidth()).toBeLessThanOrEqual(NARROW_PHONE.width);
    await page.goto('/people');
    await page.getByRole('link', { name: 'Add with a password' }).click();
    await page.waitForURL('**/people/new');
    await page.getByLabel('Name', { exact: true }).fill(techName);
    await page.getByLabel('E-mail', { exact: true }).fill(techEmail);
    await page.getByRole('radio', { name: /Saw technician/ }).check();
    await page.getByLabel('Home site').selectOption({ label: `${siteName} (${code})` });
    await page.getByLabel('Password', { exact: true }).fill(techPassword);
    await page.getByRole('button', { name: 'Show password' }).click();
    expect(await page.getByLabel('Password', { exact: true }).getAttribute('type')).toBe('text');
    await shot(page, 'admin-person-new-375');
    expect(await pageWidth()).toBeLessThanOrEqual(NARROW_PHONE.width);
    await page.getByRole('button', { name: 'Add person' }).click();

    await page.waitForURL((url) => url.pathname === '/people');
    expect(page.url()).not.toContain(techPassword);
    await expect.poll(() => page.getByRole('rowheader', { name: techName }).count()).toBe(1);
    await expect.poll(() => page.getByText(`${techName} added`).count()).toBe(1);
    await shot(page, 'admin-person-added-375');

    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL('**/sign-in');

    await page.getByLabel('E-mail').fill(techEmail);
    await page.getByLabel('Password').fill(techPassword);
    await page.getByRole('button', { name: /sign in/i }).click();
    // One site: the new technician starts from its day's work, which has no saws yet.
    await page.waitForURL('**/today');
    await expect.poll(() => page.getByText(siteName, { exact: true }).count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByText('No saw is running.').count()).toBe(1);
    await page.goto(siteUrl);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe(siteName);
    await expect.poll(() => page.getByText('No saws are recorded at this site yet.').count()).toBe(1);
    expect(await page.getByRole('link', { name: /add saw/i }).count()).toBe(0);
    await shot(page, 'admin-new-technician-home-375');

    // The new technician replaces the password the admin gave them, from their own account page.
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('link', { name: /Your account/ }).click();
    await page.waitForURL('**/account');
    await page.getByLabel('Current password').fill(techPassword);
    await page.getByLabel('New password').fill('my-own-secret-2026');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Password changed' }).count()).toBe(1);
    await shot(page, 'technician-password-changed-375');
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL('**/sign-in');
    await page.getByLabel('E-mail').fill(techEmail);
    await page.getByLabel('Password').fill('my-own-secret-2026');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.waitForURL('**/today');
    await context.close();
  });
});
