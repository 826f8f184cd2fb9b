import { chromium } from 'playwright-core';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox','--disable-gpu','--disable-quic','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync'] });
const context = await browser.newContext({ viewport: { width: 390, height: 844 }, baseURL: 'http://127.0.0.1:3107' });
const page = await context.newPage();
await page.goto('/sign-in');
await page.getByLabel('E-mail').fill(process.argv[2] ?? 'grace.okafor@corvane.example');
await page.getByLabel('Password').fill('corvane-demo-2026');
await page.getByRole('button', { name: /sign in/i }).click();
await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
if (process.argv[3]) await page.goto(process.argv[3]);
await page.waitForTimeout(4000);
const offsets = (process.argv[4] ?? '0').split(',').map(Number);
for (const [i, y] of offsets.entries()) {
  await page.evaluate((yy) => window.scrollTo(0, yy), y);
  await page.waitForTimeout(400);
  await page.screenshot({ path: `screenshots/phone-${i}.png` });
}
await browser.close();
