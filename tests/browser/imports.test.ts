import path from 'node:path';
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, DESKTOP, PHONE, launch, newPage, shot, signIn } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

const FIXTURES = path.resolve(import.meta.dirname, '../../fixtures/imports');
const MID = '1.25 in × 0.042 in × 162 in bi-metal 3/4 TPI';
const textOf = async (locator: Locator) => (await locator.innerText()).replace(/\u00a0/g, ' ');

/** From the Imports page to the columns of the messy workbook, as a site admin would go. */
async function dropWorkbook(page: Page) {
  await page.goto('/imports');
  await page.getByRole('link', { name: 'Bring a file in' }).click();
  await page.getByLabel('Blade log').check();
  await page.getByText('Columns Kerfline takes for blade log').click();
  expect(await textOf(page.getByRole('table'))).toContain('Why taken off');
  await page.getByRole('button', { name: 'Next: choose the file' }).click();
  await page.locator('input[type=file]').setInputFiles(path.join(FIXTURES, 'hammerfield-blade-log.xlsx'));
  await expect
    .poll(() => page.getByText('hammerfield-blade-log.xlsx: 13 rows and 10 columns').count(), { timeout: 30_000 })
    .toBe(1);
  // Two sheets: the log and the office's notes.
  expect(await page.getByLabel('Sheet').locator('option').allInnerTexts()).toEqual([
    'Blade log 2023 (13 rows)',
    'Read me (2 rows)',
  ]);
}

describe('a site admin brings years of blade logs in', () => {
  it('runs the wizard on a messy workbook end to end, then takes the import back out', async () => {
    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.siteAdmin);
    await dropWorkbook(page);
    await shot(page, 'import-file-desktop');
    await page.getByRole('button', { name: 'Next: match the columns' }).click();

    // Suggested from the headers, with the units the headers name.
    expect(await page.getByLabel('Kerfline field for column Date on').inputValue()).toBe('installedAt');
    expect(await page.getByLabel('Unit of column Area cut (sq in)').inputValue()).toBe('in2');
    expect(await page.getByLabel('Unit of column Tension (psi)').inputValue()).toBe('psi');
    // 03/04/2023 reads two ways: the wizard asks, and will not go on until it is answered.
    await expect.poll(() => page.getByText('How is “03/04/2023 15:00” written?').count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Next: check every row' }).isDisabled()).toBe(true);
    await page.getByLabel('March 4, 2023').check();
    await shot(page, 'import-columns-desktop');
    await page.getByRole('button', { name: 'Next: check every row' }).click();

    // Every row checked in the browser: misspelt saws, shop words and shorthand blades asked about.
    await expect
      .poll(() => page.getByText('Names and words Kerfline did not recognise').count(), { timeout: 30_000 })
      .toBe(1);
    await page.getByLabel(/“1-1\/4 x \.042 x 162 3\/4 BiM”/).selectOption({ label: MID });
    await page.getByLabel(/“snapped”/).selectOption({ label: 'Broken' });
    await page.getByLabel(/“Offcutt saw”/).selectOption({ label: 'HAM-S05 · Offcut saw' });
    await page.getByRole('button', { name: 'Check the rows again with these answers' }).click();
    await expect.poll(() => page.getByText('“Offcutt saw”').count(), { timeout: 30_000 }).toBe(0);
    await page.getByRole('button', { name: 'Compare with the site’s records' }).click();
    const bringIn = page.getByRole('button', { name: 'Bring in 9 rows' });
    await bringIn.waitFor({ timeout: 30_000 });
    const problems = await textOf(page.getByRole('region', { name: /Problems and notes/ }));
    expect(problems).toContain('"31/02/2023 08:00" has no month 31');
    expect(problems).toContain('no saw of this site is called “Saw 12”');
    // The blade "still on" in 2023 clashes with the demo's later runs on that saw.
    expect(problems).toMatch(/Overlaps a blade run already recorded on this saw/);
    await shot(page, 'import-rows-desktop');

    await bringIn.click();
    await page.getByRole('heading', { name: /Brought in$/ }).waitFor({ timeout: 30_000 });
    const card = page.locator('section', { hasText: 'hammerfield-blade-log.xlsx' });
    expect(await textOf(card)).toMatch(/Added\s*9/);
    expect(await textOf(card)).toMatch(/Not brought in\s*3/);
    // The rejected rows come back as a CSV with the reason.
    const download = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Download the 3 rows not brought in (CSV)' }).click();
    const csv = readFileSync((await (await download).path())!, 'utf8');
    expect(csv).toContain('Why Kerfline did not bring it in');
    expect(csv).toContain('Saw 12');
    await shot(page, 'import-done-desktop');

    await page.getByRole('button', { name: 'Take this import back out' }).click();
    await page.getByRole('button', { name: 'Yes, take it out' }).click();
    await expect
      .poll(() => page.getByText('Taken back out', { exact: true }).count(), { timeout: 20_000 })
      .toBeGreaterThan(0);
    expect(await textOf(card)).toContain('The 9 records it added were removed by Ines Carvalho');
    await shot(page, 'import-undone-desktop');

    // The list keeps the import, marked.
    await page.getByRole('link', { name: /All imports of Hammerfield/ }).click();
    await expect.poll(() => page.getByRole('link', { name: /hammerfield-blade-log\.xlsx/ }).count()).toBe(1);
    expect(await textOf(page.getByRole('table'))).toContain('Taken back out');
    await context.close();
  });

  it('works on a phone: the columns, one task per screen, and the list of imports', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    await dropWorkbook(page);
    await page.getByRole('button', { name: 'Next: match the columns' }).click();
    await page.getByLabel(/^3 April 2023/).check();
    await shot(page, 'import-columns-phone');
    await page.getByRole('button', { name: 'Next: check every row' }).click();
    // The answers given on the desktop were remembered for the site and kind: nothing is left to ask but Saw 12.
    await expect
      .poll(() => page.getByText('Names and words Kerfline did not recognise').count(), { timeout: 30_000 })
      .toBe(1);
    expect(await page.getByLabel(/“snapped”/).count()).toBe(0);
    expect(await page.getByLabel(/“Saw 12”/).count()).toBe(1);
    await shot(page, 'import-rows-phone');
    await page.goto('/imports');
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Imports' }).count()).toBe(1);
    await shot(page, 'imports-phone');
    await context.close();
  });

  it('tells a technician the page is not theirs, and keeps Imports out of their menu', async () => {
    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.technician);
    expect(await page.getByRole('link', { name: 'Imports' }).count()).toBe(0);
    await page.goto('/imports');
    await expect.poll(() => page.getByText('No site to bring files into').count()).toBe(1);
    await context.close();
  });
});
