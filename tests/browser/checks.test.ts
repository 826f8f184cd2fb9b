import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, DESKTOP, PHONE, SCREENSHOTS, launch, newPage, shot, signIn } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

/** Text as read, with the page's non-breaking spaces read as spaces. */
const textOf = async (locator: Locator) => (await locator.innerText()).replace(/\u00a0/g, ' ');

/** Today at Hammerfield (America/Toronto), as the page writes a date: "Dec 2, 2026". */
const todayAtHammerfield = () =>
  new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'America/Toronto' }).format(new Date());

async function hammerfieldId(page: Page): Promise<string> {
  return page.evaluate(async () => {
    const sites = (await (await fetch('/api/sites')).json()) as { items: { id: string; code: string }[] };
    return sites.items.find((s) => s.code === 'CV-HAM')!.id;
  });
}

/** No element wider than the screen: a phone never scrolls sideways. */
const fitsWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);

describe('maintenance checks on the shop floor', () => {
  it('a technician records a guide check that fails on a phone, in two taps from the saw, and sees why', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.technician);
    // The start screen lists the site's checks due today, the longest overdue first, each with Record.
    await page.goto('/today');
    const today = page.getByRole('region', { name: 'Checks due today' });
    await expect.poll(() => today.count()).toBe(1);
    expect(await today.getByRole('link', { name: /^Record / }).count()).toBeGreaterThan(0);
    await shot(page, 'checks-today-phone');

    await page.goto('/sites');
    await page
      .getByRole('link', { name: /Hammerfield Service Centre/ })
      .first()
      .click();
    await page.getByRole('link', { name: 'HAM-S02', exact: true }).first().click();
    await expect.poll(() => page.getByRole('heading', { level: 1, name: /HAM-S02/ }).count()).toBe(1);
    // The state card says whether checks are due on this saw (the list below it shows only when some are).
    const state = page.getByRole('region', { name: 'State of HAM-S02' });
    await expect.poll(async () => /check/i.test(await textOf(state))).toBe(true);
    await shot(page, 'checks-saw-phone');

    // Tap 1: Record a check. Tap 2: the guide check (if it was not already the one chosen).
    await page.getByRole('link', { name: 'Record a check' }).click();
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Record a check' }).count()).toBe(1);
    const caution = page.getByRole('region', { name: 'Caution: adjusting a saw' });
    expect(await textOf(caution)).toContain('Isolate and lock out the power before reaching into the saw.');
    expect(await textOf(caution)).toContain('Put the guards back on before running the saw.');
    await page.getByRole('radio', { name: /Guide bearing clearance/ }).check();
    const target = page.getByRole('region', { name: 'Target' });
    // HAM-S02 carries a 1-1/4 x .042 bi-metal band: target 0.042 + 0.001 = 0.043 in, inches first.
    expect(await textOf(target)).toContain('0.043 in');
    expect(await textOf(target)).toContain('Source: Kerfline’s starting value (no printed source gives one value).');
    expect(await fitsWidth(page)).toBe(true);
    await shot(page, 'checks-record-phone');

    // 0.040 in: tighter than the band itself.
    await page.getByRole('textbox', { name: /Reading/ }).fill('0.040');
    await page.getByRole('textbox', { name: /Notes/ }).fill('Left guide, after the blade change');
    await page.getByRole('button', { name: 'Save reading' }).click();
    const result = page.getByRole('region', { name: 'Result' });
    await expect.poll(() => result.count()).toBe(1);
    expect(await textOf(result)).toContain('Failed');
    expect(await result.locator('span[data-shape="square"]').count()).toBe(1);
    expect(await textOf(result)).toContain('is tighter than the band itself: the guides will pinch and heat it.');
    expect(await textOf(result)).toContain('Reading 0.040 in (1.02 mm)');
    await shot(page, 'checks-failed-phone');

    // The saw page shows the guide check as done (no longer due) and its failure is on record.
    await page.getByRole('link', { name: 'Back to HAM-S02' }).click();
    await expect.poll(() => page.getByRole('heading', { level: 1, name: /HAM-S02/ }).count()).toBe(1);
    await expect
      .poll(
        async () =>
          (await page.getByRole('region', { name: 'Checks due' }).count()) === 0 ||
          (await page.getByRole('region', { name: 'Checks due' }).getByText('Guide bearing clearance').count()) === 0,
      )
      .toBe(true);
    await context.close();
  });

  it('a site admin changes a check’s limits on the site’s list, and the list says who changed it', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    const siteId = await hammerfieldId(page);
    await page.goto(`/sites/${siteId}/checks`);
    const own = page.getByRole('article', { name: 'Feed cylinder pressure' });
    await expect.poll(() => own.count()).toBe(1);
    expect(await textOf(own)).toContain('Aim for 500 psi; 450 psi to 550 psi passes — set on this list');
    const guide = page.getByRole('article', { name: 'Guide bearing clearance' });
    expect(await textOf(guide)).toContain('Your site’s setting “Guide opening”: Kerfline’s starting value');
    expect(await fitsWidth(page)).toBe(true);
    await shot(page, 'checks-list-phone');

    await own.getByRole('button', { name: 'Change Feed cylinder pressure' }).click();
    const form = page.getByRole('form', { name: 'Change Feed cylinder pressure' });
    await form.getByRole('textbox', { name: /Highest passing/ }).fill('600');
    await form.getByRole('textbox', { name: /Grace before it is overdue/ }).fill('48');
    await shot(page, 'checks-edit-phone');
    await form.getByRole('button', { name: 'Save changes' }).click();
    await expect.poll(() => textOf(own)).toContain('Aim for 500 psi; 450 psi to 600 psi passes — set on this list');
    expect(await textOf(own)).toContain('Every 14 days, overdue 2 days later');
    expect(await textOf(own)).toContain(`changed by Ines Carvalho on ${todayAtHammerfield()}`);

    // The change is in the site's audit trail, before and after.
    const audit = await page.evaluate(async (id) => {
      const res = await fetch(`/api/audit?siteId=${id}&entity=SiteCheck`);
      return ((await res.json()) as { items: { before: unknown; after: unknown }[] }).items[0];
    }, siteId);
    expect(audit).toMatchObject({ after: { graceHours: 48 }, before: { graceHours: 24 } });
    await context.close();

    const desk = await newPage(browser, DESKTOP);
    await signIn(desk.page, DEMO.siteAdmin);
    await desk.page.goto(`/sites/${siteId}/checks`);
    await expect.poll(() => desk.page.getByRole('article', { name: 'Feed cylinder pressure' }).count()).toBe(1);
    await shot(desk.page, 'checks-list-desktop');
    await desk.page.goto(`/sites/${siteId}/checks/overdue?state=pending`);
    await expect.poll(() => desk.page.getByRole('table', { name: 'Checks due and overdue' }).count()).toBe(1);
    await shot(desk.page, 'checks-overdue-desktop');
    await desk.context.close();
  });

  it('a lead reads a site’s overdue checks as cards on a phone, with no way to record or change them', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.lead);
    const siteId = await hammerfieldId(page);
    await page.goto(`/sites/${siteId}/checks/overdue?state=pending`);
    await expect.poll(() => page.getByRole('table', { name: 'Checks due and overdue' }).count()).toBe(1);
    expect(await page.getByRole('link', { name: /^Record / }).count()).toBe(0);
    expect(await fitsWidth(page)).toBe(true);
    await shot(page, 'checks-overdue-phone');
    await page.goto(`/sites/${siteId}/checks`);
    await expect.poll(() => page.getByRole('article', { name: 'Guide bearing clearance' }).count()).toBe(1);
    expect(await page.getByRole('button', { name: /^Change / }).count()).toBe(0);
    await context.close();
  });

  it('a site admin gives a spring-fed saw its own head-force limit, and its head-force check is judged by it', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    const sawId = await page.evaluate(async () => {
      const saws = (await (await fetch('/api/saws?limit=100')).json()) as { items: { id: string; assetTag: string }[] };
      return saws.items.find((s) => s.assetTag === 'HAM-S05')!.id;
    });
    await page.goto(`/saws/${sawId}/edit`);
    // HAM-S05's head feeds by gravity against a spring: the form asks for its limits, in lbf at this imperial site.
    const largest = page.getByRole('textbox', { name: /Largest head force/ });
    await expect.poll(() => largest.count()).toBe(1);
    expect(await largest.getAttribute('aria-describedby')).toBeTruthy();
    await largest.fill('6');
    await largest.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SCREENSHOTS}/saw-head-force-edit-phone.png` });
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.waitForURL((url) => url.pathname === `/saws/${sawId}`);
    const machine = page.getByRole('region', { name: 'Machine' });
    await expect.poll(async () => textOf(machine)).toMatch(/Largest head force\s*6 lbf/);
    expect(await textOf(machine)).toContain(`This saw’s limit, set by Ines Carvalho on ${todayAtHammerfield()}.`);
    expect(await fitsWidth(page)).toBe(true);

    // The saw's head-force check reads the saw's own 6 lbf (26.7 N), and says whose figure it is.
    const target = await page.evaluate(async (id) => {
      const checks = (await (await fetch(`/api/saws/${id}/checks`)).json()) as {
        items: {
          check: { targetRule: string };
          target: { max: number; basis: { kind: string; setByName?: string } };
        }[];
      };
      return checks.items.find((i) => i.check.targetRule === 'feed_pressure')!.target;
    }, sawId);
    expect(target.max).toBeCloseTo(26.689, 3);
    expect(target.basis).toMatchObject({ kind: 'record', setByName: 'Ines Carvalho' });
    await context.close();
  });

  it('a lead looks back over a site’s recorded checks, failed ones first filtered, as cards on a phone', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.lead);
    const siteId = await hammerfieldId(page);
    await page.goto(`/sites/${siteId}`);
    await page.getByRole('link', { name: 'Checks recorded' }).click();
    const table = page.getByRole('region', { name: 'Checks recorded' });
    await expect.poll(() => table.count()).toBe(1);
    await page.getByRole('combobox', { name: 'Verdict' }).selectOption('failed');
    await page.waitForURL((url) => url.searchParams.get('verdict') === 'failed');
    // The address changes before the filtered page has loaded: wait for the passed rows to go.
    await expect.poll(async () => table.locator('span[data-shape="circle"]').count(), { timeout: 15_000 }).toBe(0);
    expect(await table.locator('span[data-shape="square"]').count()).toBeGreaterThan(0);
    expect(await textOf(table)).toMatch(/of [\d,]+ recorded checks/);
    expect(await fitsWidth(page)).toBe(true);
    await shot(page, 'check-records-phone');
    await context.close();

    const desk = await newPage(browser, DESKTOP);
    await signIn(desk.page, DEMO.lead);
    await desk.page.goto(`/sites/${siteId}/check-records`);
    await expect.poll(() => desk.page.getByRole('table', { name: 'Checks recorded' }).count()).toBe(1);
    await shot(desk.page, 'check-records-desktop');
    await desk.context.close();
  });
});
