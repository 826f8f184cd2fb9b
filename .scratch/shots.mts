import { chromium } from 'playwright-core';
const base = 'http://127.0.0.1:3107';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox','--disable-gpu','--disable-quic','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync'] });
const PHONE = { width: 390, height: 844 };
async function as(email: string, viewport = { width: 1440, height: 900 }) {
  const context = await browser.newContext({ viewport, baseURL: base });
  const page = await context.newPage();
  page.on('console', (m) => { if (m.type() === 'error') console.log('console error:', m.text()); });
  page.on('pageerror', (e) => console.log('page error:', e.message));
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('corvane-demo-2026');
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  return { context, page };
}
const shot = async (page: any, name: string) => { await page.waitForTimeout(900); await page.evaluate(() => window.scrollTo(0, 0)); await page.screenshot({ path: `screenshots/${name}.png`, fullPage: true }); console.log('shot', name, page.url()); };
const which = process.argv[2] ?? 'all';
if (which === 'manager') {
  const { page } = await as('grace.okafor@corvane.example');
  await page.getByRole('img', { name: /Blade spend by month/ }).first().waitFor({ timeout: 20000 });
  await shot(page, 'dash-overview-desktop');
  await page.getByRole('group', { name: 'Blade spend by month: view' }).getByRole('button', { name: 'Table' }).click();
  await page.getByRole('radio', { name: /Metric/ }).click();
  await page.waitForURL(/units=metric/);
  await shot(page, 'dash-overview-table-metric');
  await page.getByRole('link', { name: /CV-HOU Bayou/ }).first().click();
  await page.getByRole('heading', { level: 2, name: 'Saws' }).waitFor();
  await page.getByRole('link', { name: /HOU-S04/ }).waitFor({ timeout: 20000 });
  await shot(page, 'dash-site-desktop');
  await page.getByRole('link', { name: /HOU-S04/ }).click();
  await page.getByRole('heading', { name: 'Blade runs' }).waitFor();
  await page.locator('table').last().getByRole('link').first().waitFor({ timeout: 20000 });
  await shot(page, 'dash-saw-desktop');
  await page.locator('table').last().getByRole('link').first().click();
  await page.getByText('Cost (fixed when put on)').waitFor();
  await shot(page, 'dash-run-desktop');
  await page.goBack(); await page.goBack();
  console.log('after back back', page.url());
  await page.goto('/fleet/practice');
  await page.getByRole('heading', { name: 'What it meant for blade life' }).waitFor({ timeout: 20000 });
  await shot(page, 'dash-practice-desktop');
  await page.goto('/budgets');
  await page.getByRole('heading', { name: /CV-HAM/ }).waitFor({ timeout: 20000 });
  await shot(page, 'dash-budgets-desktop');
}
if (which === 'phone') {
  const { page } = await as('grace.okafor@corvane.example', PHONE);
  await page.getByRole('img', { name: /Blade spend by month/ }).first().waitFor({ timeout: 20000 });
  await shot(page, 'dash-overview-phone');
  const lead = await as('tomasz.wren@corvane.example', PHONE);
  await lead.page.getByRole('heading', { name: /Saws that need a look/ }).waitFor();
  await lead.page.getByRole('heading', { name: /Flags \(/ }).waitFor({ timeout: 20000 });
  await shot(lead.page, 'dash-outliers-phone');
}
if (which === 'lead') {
  const { page } = await as('tomasz.wren@corvane.example');
  console.log('lead home', page.url());
  await page.getByRole('heading', { name: /Flags \(/ }).waitFor({ timeout: 20000 });
  await shot(page, 'dash-outliers-desktop');
  await page.getByRole('link', { name: /See why, and follow it up/ }).first().click();
  await page.getByRole('heading', { name: 'Likely causes' }).waitFor({ timeout: 20000 });
  await shot(page, 'dash-saw-outlier-desktop');
}
if (which === 'admin') {
  const { page } = await as('noor.haddad@corvane.example');
  await page.goto('/exchange-rates');
  await page.getByRole('heading', { name: 'Rates by month' }).waitFor();
  await shot(page, 'dash-rates-desktop');
}
await browser.close();
