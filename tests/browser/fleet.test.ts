import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator } from 'playwright-core';
import { DEMO, DESKTOP, PHONE, launch, newPage, shot, signIn } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

/** Text as read, with the page's non-breaking spaces read as spaces. */
const textOf = async (locator: Locator) => (await locator.innerText()).replace(/\u00a0/g, ' ');

/** The Rotterdam technician of the demo (Maasvlakte Bar Depot). */
const ROTTERDAM_TECHNICIAN = 'joost.bakker@corvane.example';

describe('the operations manager’s fleet overview', () => {
  it('opens after sign-in with its charts and their table views, switches units, exports, and drills down', async () => {
    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.manager);
    await page.waitForURL('**/fleet');
    // Four charts, each an image with its own accessible label naming its units.
    const spendChart = page.getByRole('img', { name: /^Blade spend by month, in USD/ });
    await spendChart.waitFor({ timeout: 30_000 });
    for (const name of [
      /^Cost per area cut by month/,
      /^Stop hours by category, in hours/,
      /^Blade life by site \(median\)/,
    ])
      await page.getByRole('img', { name }).waitFor();
    // Most of Grace's sites are imperial: blade life opens in square feet.
    const tiles = page.getByRole('region', { name: 'Sites' });
    await expect.poll(() => textOf(tiles)).toMatch(/Blade life \(median\)\s+[\d.]+ ft²/i);
    await shot(page, 'fleet-overview-desktop');

    // The table view of the spend chart: the same numbers, site by month.
    await page
      .getByRole('group', { name: 'Blade spend by month: view' })
      .getByRole('button', { name: 'Table' })
      .click();
    const table = page.getByRole('table', { name: /^Blade spend by month/ });
    expect(await textOf(table)).toContain('CV-HAM');
    expect(await textOf(table)).toMatch(/\$[\d,]+/);

    // Metric: every figure follows, and the address keeps it for sharing.
    await page.getByRole('radio', { name: /Metric/ }).click();
    await page.waitForURL(/units=metric/);
    await expect.poll(() => textOf(tiles)).toMatch(/Blade life \(median\)\s+[\d.]+ m²/i);
    await shot(page, 'fleet-overview-metric-desktop');

    // Export the months behind the two line charts: a CSV in the chosen units.
    const months = page.getByRole('region', { name: 'Blade spend by month' });
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      months.getByRole('button', { name: 'Export CSV' }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^fleet-months-\d{4}-\d{2}-\d{4}-\d{2}\.csv$/);
    const csv = readFileSync((await download.path())!, 'utf8');
    expect(csv.split('\r\n')[0]).toContain('"Area cut (m²)"');
    expect(csv).toContain('"CV-HOU"');
    await expect.poll(() => textOf(months)).toMatch(/Saved fleet-months/);

    // Drill down: fleet → site → saw → blade run, then back and forward.
    await tiles.getByRole('link', { name: /Bayou Structural Yard/ }).click();
    await page.waitForURL(/\/fleet\/sites\/.+units=metric/);
    await page.getByRole('link', { name: /HOU-S04/ }).click();
    await page.waitForURL(/\/fleet\/saws\//);
    const sawUrl = page.url();
    await page.getByRole('heading', { name: 'Blade runs' }).waitFor();
    await page.locator('main table').last().getByRole('link').first().click();
    await page.waitForURL(/\/fleet\/runs\//);
    await page.getByText('Cost (fixed when put on)').waitFor();
    const trail = page.getByRole('navigation', { name: 'Breadcrumb' });
    await expect.poll(() => textOf(trail)).toMatch(/Fleet\s*›\s*CV-HOU Bayou Structural Yard\s*›\s*HOU-S04 [^›]+›/);
    await shot(page, 'fleet-run-desktop');
    await page.goBack();
    await page.waitForURL(sawUrl);
    await page.goForward();
    await page.waitForURL(/\/fleet\/runs\//);
    await trail.getByRole('link', { name: 'Fleet' }).click();
    await page.waitForURL(/\/fleet\?from=.+units=metric/);
    await context.close();
  });

  it('stays readable on a phone', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.manager);
    await page.getByRole('img', { name: /^Blade spend by month/ }).waitFor({ timeout: 30_000 });
    await shot(page, 'fleet-overview-phone');
    await context.close();
  });
});

describe('the regional lead follows a flag up with the site', () => {
  it('opens an outlier, explains it, opens a follow-up that the site then sees and works', async () => {
    const lead = await newPage(browser, DESKTOP);
    await signIn(lead.page, DEMO.lead);
    await lead.page.waitForURL('**/outliers');
    const flag = lead.page.getByRole('listitem').filter({ hasText: 'RTM-S02' }).first();
    await flag.waitFor({ timeout: 30_000 });
    // The flag explains itself: this saw, the peers' median, how far and by which method.
    expect(await textOf(flag)).toMatch(/This saw[\s\S]+Peers’ median[\s\S]+Modified z-score/i);
    expect(await textOf(flag)).toContain('Iglewicz & Hoaglin');
    await shot(lead.page, 'fleet-outliers-desktop');
    await flag.getByRole('link', { name: /See why, and follow it up/ }).click();
    await lead.page.getByRole('heading', { name: 'Likely causes' }).waitFor({ timeout: 30_000 });
    expect(await textOf(lead.page.getByRole('main'))).toContain('Why its blades came off');

    await lead.page
      .getByLabel('What should be done')
      .fill('RTM-S02 stops too often: check the hydraulics and the band speed');
    await lead.page.getByLabel('Who at the site').selectOption({ label: 'Joost Bakker (Saw technician)' });
    await lead.page.getByRole('button', { name: 'Open the follow-up' }).click();
    await expect
      .poll(() => textOf(lead.page.getByRole('status').filter({ hasText: 'Follow-up opened' })))
      .toContain('for Joost Bakker');
    await shot(lead.page, 'fleet-follow-up-opened-desktop');
    await lead.context.close();

    // The site sees it on the technician's start screen, and moves it along from there.
    const tech = await newPage(browser, PHONE);
    await signIn(tech.page, ROTTERDAM_TECHNICIAN);
    await tech.page.waitForURL('**/today');
    const panel = tech.page.getByRole('region', { name: 'Follow-ups at this site' });
    await expect.poll(() => textOf(panel), { timeout: 30_000 }).toContain('RTM-S02 stops too often');
    await shot(tech.page, 'fleet-follow-up-start-screen-phone');
    await panel.getByRole('button', { name: 'Start' }).first().click();
    await expect.poll(() => textOf(panel)).toContain('In progress');
    // And on the saw's own page.
    await panel.getByRole('link', { name: 'History' }).first().click();
    await tech.page.waitForURL(/\/follow-ups\//);
    await expect.poll(() => textOf(tech.page.getByRole('main'))).toContain('Open → In progress');
    await shot(tech.page, 'fleet-follow-up-history-phone');
    await tech.context.close();
  });
});
