import { chromium } from 'playwright-core';
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ['--no-sandbox','--disable-gpu','--disable-quic','--no-first-run','--disable-background-networking','--disable-component-update','--disable-sync'] });
const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, baseURL: 'http://127.0.0.1:3107' });
const page = await context.newPage();
page.on('pageerror', (e) => console.log('page error:', e.message));
await page.goto('/sign-in');
await page.getByLabel('E-mail').fill(process.argv[2]!);
await page.getByLabel('Password').fill('corvane-demo-2026');
await page.getByRole('button', { name: /sign in/i }).click();
await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
if (process.argv[3]!.startsWith('/')) await page.goto(process.argv[3]!);
else { await page.goto('/saws?q=' + process.argv[3]); await page.getByRole('link', { name: process.argv[3]! }).first().click(); }
await page.waitForTimeout(5000);
await page.screenshot({ path: `screenshots/${process.argv[4]}.png`, fullPage: true });
console.log(page.url());
await browser.close();
