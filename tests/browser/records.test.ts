import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { DEMO, DESKTOP, PHONE, launch, newPage, shot, signIn } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

/** Text as read, with the page's non-breaking spaces read as spaces. */
const textOf = async (locator: Locator) => (await locator.innerText()).replace(/\u00a0/g, ' ');

/** Nothing on the page is wider than the phone: no sideways scrolling. */
const fitsWidth = async (page: Page) =>
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);

/** A photo of a failed band, as a phone would send it (an invented picture). */
const bandPhoto = () =>
  sharp({ create: { width: 1200, height: 900, channels: 3, background: { r: 118, g: 112, b: 104 } } })
    .jpeg({ quality: 80 })
    .toBuffer();

describe('a technician’s shift on a phone', () => {
  it('starts from today’s work, changes a blade after a failure, logs and ends a stop, with the cautions and causes in view', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.technician);
    // The start screen: the site's saws down first, then the running saws with the blade on each.
    await page.waitForURL('**/today');
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Today' }).count()).toBe(1);
    const down = page.getByRole('region', { name: 'Down now' });
    expect(await textOf(down)).toContain('HAM-S03');
    expect(await textOf(down)).toContain('Down: hydraulic');
    await fitsWidth(page);
    await shot(page, 'records-today-phone');

    // One tap from the start screen: change the blade on the offcut saw.
    const offcut = page.getByRole('region', { name: 'State of HAM-S05' });
    await offcut.getByRole('link', { name: 'Change blade' }).click();
    await page.waitForURL(/\/saws\/[0-9a-f-]{36}\/blade-off\?next=on$/);
    const sawPath = new URL(page.url()).pathname.replace('/blade-off', '');
    const caution = page.getByRole('region', { name: 'Caution: work on the saw safely' });
    expect(await textOf(caution)).toContain('Isolate and lock out the power before reaching into the saw.');
    expect(await textOf(caution)).toContain('saw maker’s manual come first');

    // A blank form is answered in words and nothing is sent.
    await page.getByRole('button', { name: 'Take it off, then put the new one on' }).click();
    await expect.poll(() => page.getByText('Choose why the blade came off').count()).toBe(1);

    // A failure reason shows this saw's likely causes at once, ranked, with their reasons.
    await page.getByRole('radio', { name: /Tooth strippage/ }).check();
    const causes = page.getByRole('group', { name: /Likely causes of tooth strippage/ });
    await expect.poll(() => causes.getByRole('radio').count()).toBeGreaterThan(2);
    expect(await textOf(causes)).toContain('Ranked by Kerfline from the failure and this saw’s records');
    const first = causes.getByRole('radio').first();
    const firstCause = (await first.locator('xpath=..').innerText()).split('\n')[0]!;
    await first.check();
    await page.getByLabel('Number of cuts').fill('212');
    await page.getByRole('textbox', { name: 'Notes' }).fill('Teeth gone over a hand’s width, near the weld.');
    await page
      .getByLabel(/^Photos/)
      .setInputFiles({ name: 'band.jpg', mimeType: 'image/jpeg', buffer: await bandPhoto() });
    await expect.poll(() => page.getByText('band.jpg').count()).toBe(1);
    await fitsWidth(page);
    await shot(page, 'records-blade-off-phone');
    await page.getByRole('button', { name: 'Take it off, then put the new one on' }).click();

    // Step 2 of the change: the new blade, with the saw's usual spec chosen and its break-in plan.
    await page.waitForURL(`**${sawPath}/blade-on`);
    const spec = page.getByLabel('Blade spec');
    expect(await spec.locator('option:checked').innerText()).toMatch(
      /1 in × 0.035 in × 138 in bi-metal 6\/10 TPI — \d+ in stock/,
    );
    await page.getByLabel('Material it will cut first').selectOption('carbon_steel');
    const plan = page.getByRole('region', { name: /Break-in plan for/ });
    await expect.poll(() => plan.count()).toBe(1);
    await expect.poll(() => textOf(plan)).toContain('Band speed for carbon steel');
    expect(await textOf(plan)).toMatch(/ft\/min/);
    expect(await textOf(plan)).toMatch(/Kerfline’s starting value|published:|your site’s setting/i);
    await page.getByRole('radio', { name: 'Followed the plan' }).check();
    await fitsWidth(page);
    await shot(page, 'records-blade-on-phone');
    await page.getByRole('button', { name: 'Put blade on' }).click();
    await page.waitForURL(`**${sawPath}`);
    await expect.poll(() => page.getByText(/is on HAM-S05\./).count()).toBe(1);
    await shot(page, 'records-saw-after-change-phone');

    // The removed run keeps the cause confirmed and the photo; its page shows both.
    const timeline = page.getByRole('region', { name: 'Timeline' });
    await expect.poll(() => textOf(timeline)).toContain('Tooth strippage');
    expect(await textOf(timeline)).toContain(`cause: ${firstCause.toLowerCase()}`);
    expect(await textOf(timeline)).toContain('1 photo');
    await timeline
      .getByRole('link', { name: /Blade run:/ })
      .first()
      .click();
    await page.waitForURL(/\/blade-runs\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByRole('img', { name: 'Photo of the blade' }).count()).toBe(1);
    expect(await textOf(page.getByRole('region', { name: 'Taken off' }))).toContain(firstCause);
    await shot(page, 'records-blade-run-phone');

    // A cut on the new blade: the answer gives the area and the teeth in the work, and any warning.
    await page.goto(sawPath);
    await page.getByRole('link', { name: 'Log a cut' }).click();
    await page.waitForURL(`**${sawPath}/cut-logs/new`);
    expect(await page.getByLabel('Material').inputValue()).toBe('carbon_steel');
    await page.getByRole('textbox', { name: /Diameter/ }).fill('4');
    await page.getByRole('textbox', { name: /Band speed/ }).fill('180');
    await page.getByRole('button', { name: 'Log the cut' }).click();
    const answer = page.getByRole('region', { name: /Logged: 1 × 4 in round bar/ });
    await expect.poll(() => answer.count()).toBe(1);
    // A 4 in round bar's face is π·4²/4 = 12.57 in² (geometry).
    expect(await textOf(answer)).toContain('12.57 in²');
    expect(await textOf(answer)).toMatch(/Teeth in the work\s+\d/);
    await fitsWidth(page);
    await shot(page, 'records-cut-log-phone');

    // Log a stop, then a second one over it: the server's refusal is shown in words, naming the other stop.
    await page.goto(sawPath);
    await page.getByRole('link', { name: 'Log a stop' }).click();
    await page.waitForURL(`**${sawPath}/stops/new`);
    await page.getByRole('radio', { name: 'Mechanical' }).check();
    await page.getByRole('textbox', { name: /Notes/ }).fill('Vice jaw sticking.');
    await fitsWidth(page);
    await shot(page, 'records-stop-new-phone');
    await page.getByRole('button', { name: 'Log the stop' }).click();
    await page.waitForURL(`**${sawPath}`);
    const state = page.getByRole('region', { name: 'State of HAM-S05' });
    await expect.poll(() => textOf(state)).toContain('Down: mechanical');
    await shot(page, 'records-saw-down-phone');

    await page.goto(`${sawPath}/stops/new`);
    await page.getByRole('radio', { name: 'Electrical' }).check();
    await page.getByRole('button', { name: 'Log the stop' }).click();
    const refusal = page.getByRole('alert').filter({ hasText: 'The stop was not logged' });
    await expect.poll(() => refusal.count()).toBe(1);
    expect(await textOf(refusal)).toMatch(/overlap/i);
    await shot(page, 'records-stop-overlap-phone');

    // End it, from the saw page: two taps.
    await page.goto(sawPath);
    await state.getByRole('link', { name: 'End the stop' }).click();
    await page.waitForURL(`**${sawPath}/stop-end`);
    await page.getByRole('button', { name: 'End the stop' }).click();
    await page.waitForURL(`**${sawPath}`);
    await expect.poll(() => textOf(state)).toContain('Running');
    await expect.poll(() => page.getByText('HAM-S05 is running again.').count()).toBe(1);
    await fitsWidth(page);
    await shot(page, 'records-saw-running-phone');

    await page.setViewportSize(DESKTOP);
    await shot(page, 'records-saw-desktop');
    await context.close();
  });
});

describe('a site admin keeps the blade stock', () => {
  it('receives blades, sees the stock rise with its days left and reorder point, and sets a lead time', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sites' }).click();
    const tile = page.getByRole('link', { name: /Hammerfield Service Centre/ }).first();
    await expect.poll(() => textOf(tile)).toContain('Saws down now');
    expect(await textOf(tile)).toContain('Blade stock left');
    await shot(page, 'records-sites-tiles-phone');
    await tile.click();
    await page.getByRole('link', { name: 'Blade stock' }).click();
    await page.waitForURL('**/stock');
    const line = page.getByRole('listitem').filter({ hasText: '1.25 in × 0.042 in × 162 in bi-metal 5/8 TPI' }).first();
    const onHandBefore = Number((await line.locator('dd').first().innerText()).replace(/,/g, ''));
    expect(await textOf(line)).toContain('Reorder point: published: ROP = d × L + SS');
    await shot(page, 'records-stock-phone');

    await page.getByRole('link', { name: 'Receive blades' }).click();
    await page.waitForURL('**/stock/receive');
    await page.getByLabel('Blade spec').selectOption({ label: '1.25 in × 0.042 in × 162 in bi-metal 5/8 TPI' });
    await page.getByRole('button', { name: 'Receive blades' }).click();
    await expect.poll(() => page.getByText('Enter how many blades came in').count()).toBe(1);
    await page.getByLabel('Blades received').fill('12');
    await page.getByLabel('Cost of one blade').fill('61.40');
    await page.getByLabel('Lot or delivery reference').fill('DN-44817');
    await fitsWidth(page);
    await shot(page, 'records-stock-receive-phone');
    await page.getByRole('button', { name: 'Receive blades' }).click();
    await page.waitForURL(/\/stock$/);
    await expect
      .poll(() =>
        page.getByText(/12 × 1\.25 in × 0\.042 in × 162 in bi-metal 5\/8 TPI received at CA\$61\.40 each\./).count(),
      )
      .toBe(1);
    const after = page
      .getByRole('listitem')
      .filter({ hasText: '1.25 in × 0.042 in × 162 in bi-metal 5/8 TPI' })
      .first();
    await expect
      .poll(async () => Number((await after.locator('dd').first().innerText()).replace(/,/g, '')))
      .toBe(onHandBefore + 12);

    await after.getByRole('button', { name: /Change lead time and safety stock/ }).click();
    await after.getByLabel('Lead time').fill('21');
    await after.getByLabel('Safety stock').fill('2');
    await after.getByRole('button', { name: 'Save levels' }).click();
    await expect.poll(() => textOf(after)).toContain('lead 21 days, safety 2');
    expect(await textOf(after)).toContain('your site’s setting, changed by Ines Carvalho');
    await fitsWidth(page);
    await shot(page, 'records-stock-after-phone');

    // The movements table pages on the server, its filter in the address.
    await page.goto(`${new URL(page.url()).pathname}/movements`);
    await expect.poll(() => page.getByText('DN-44817').count()).toBeGreaterThan(0);
    await fitsWidth(page);
    await shot(page, 'records-movements-phone');
    await page.setViewportSize(DESKTOP);
    await shot(page, 'records-movements-desktop');
    await context.close();
  });

  it('reads the site’s blade runs and stops as tables whose filters and pages live in the address, and the history of changes', async () => {
    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.siteAdmin);
    const sitePath = new URL(page.url()).pathname;
    await page.goto(`${sitePath}/blade-runs?reason=worn_out`);
    const table = page.getByRole('region', { name: 'Blade runs' });
    await expect.poll(() => table.getByRole('row').count()).toBeGreaterThan(1);
    expect(await page.getByLabel('Why it came off').inputValue()).toBe('worn_out');
    const rows = await table.getByRole('row').allInnerTexts();
    expect(rows.slice(1).every((row) => row.includes('Worn out'))).toBe(true);
    await page.getByRole('button', { name: /Put on/ }).click();
    await expect.poll(() => new URL(page.url()).searchParams.get('sort')).toBe('installedAt');
    await shot(page, 'records-blade-runs-desktop');
    await page.getByRole('link', { name: 'Next' }).click();
    await expect.poll(() => new URL(page.url()).searchParams.get('offset')).toBe('25');
    expect(new URL(page.url()).searchParams.get('reason')).toBe('worn_out');

    await page.goto(`${sitePath}/stops?state=open`);
    await expect
      .poll(() => page.getByRole('region', { name: 'Stops' }).getByText('Still down').count())
      .toBeGreaterThan(0);
    await shot(page, 'records-stops-desktop');
    await page.setViewportSize(PHONE);
    await fitsWidth(page);
    await shot(page, 'records-stops-phone');

    await page.goto(`${sitePath}/history?record=StockReceipt`);
    await expect.poll(() => page.getByText('DN-44817').count()).toBeGreaterThan(0);
    await shot(page, 'records-history-phone');
    await page.goto('/people');
    await fitsWidth(page);
    await shot(page, 'records-people-phone');
    await context.close();
  });

  it('removes a stop logged by mistake with a reason, finds it among the removed entries and puts it back', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    const sitePath = new URL(page.url()).pathname;
    await page.goto(`${sitePath}/stops?state=ended&category=electrical`);
    const stops = page.getByRole('region', { name: 'Stops' });
    await expect.poll(() => stops.getByRole('row').count()).toBeGreaterThan(1);
    await stops.locator('a[href^="/stops/"]').first().click();
    await page.waitForURL(/\/stops\/[0-9a-f-]{36}$/);
    const stopPath = new URL(page.url()).pathname;

    await page.getByRole('button', { name: 'Remove this stop…' }).click();
    const confirm = page.getByRole('region', { name: 'Remove this stop?' });
    expect(await textOf(confirm)).toContain('can put it back from Removed entries');
    await confirm.getByRole('button', { name: 'Remove the stop' }).click();
    await expect.poll(() => confirm.getByText('Say why this record is being removed').count()).toBe(1);
    await confirm.getByLabel('Why is it being removed?').fill('Logged twice from the shift sheet');
    await fitsWidth(page);
    await shot(page, 'removed-confirm-phone');
    await confirm.getByRole('button', { name: 'Remove the stop' }).click();
    await page.waitForURL(/\/saws\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByText('The stop was removed.').count()).toBe(1);

    await page.goto(sitePath);
    await page
      .getByRole('navigation', { name: 'The site’s records' })
      .getByRole('link', { name: 'Removed entries' })
      .click();
    await page.waitForURL(`**${sitePath}/removed`);
    const entry = page.getByRole('listitem').filter({ hasText: 'Logged twice from the shift sheet' });
    await expect.poll(() => entry.count()).toBe(1);
    expect(await textOf(entry)).toContain('Electrical');
    expect(await textOf(entry)).toContain('by Ines Carvalho');
    await fitsWidth(page);
    await shot(page, 'removed-list-phone');
    await page.setViewportSize(DESKTOP);
    await shot(page, 'removed-list-desktop');
    await entry.getByRole('button', { name: /^Put back/ }).click();
    await expect.poll(() => page.getByText('Put back.').count()).toBe(1);
    await page.getByRole('link', { name: 'See it' }).click();
    await page.waitForURL(`**${stopPath}`);
    await expect.poll(() => page.getByRole('heading', { name: 'Stopped: electrical' }).count()).toBe(1);
    await context.close();
  });
});
