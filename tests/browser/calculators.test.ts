import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { DEMO, DESKTOP, PHONE, launch, newPage, shot, signIn } from './support.js';

/**
 * Picks a unit system. The switch changes the address, and the page redraws the switch for the new
 * address, so wait for the address and the redrawn radio rather than the clicked element.
 */
async function chooseUnits(page: Page, name: 'Metric' | 'Imperial'): Promise<void> {
  await page.getByRole('radio', { name: new RegExp(name) }).click();
  await page.waitForURL(`**units=${name.toLowerCase()}*`);
  await expect.poll(() => page.getByRole('radio', { name: new RegExp(name) }).isChecked()).toBe(true);
}

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

/** 1 in = 25.4 mm exactly (NIST SP 811 (2008), B.8). */
const MM_PER_IN = 25.4;

const number = (text: string) => Number(text.replace(/,/g, ''));

/** The text of the result panel, with the page's non-breaking spaces read as spaces. */
async function resultText(page: Page): Promise<string> {
  return (await page.getByRole('region', { name: 'Result' }).innerText()).replace(/\u00a0/g, ' ');
}

/** Waits until the result panel matches, then returns the match. */
async function resultMatch(page: Page, pattern: RegExp): Promise<RegExpMatchArray> {
  await expect.poll(async () => pattern.test(await resultText(page))).toBe(true);
  return (await resultText(page)).match(pattern)!;
}

describe('the shop calculators, as a technician uses them on a phone', () => {
  it('works out teeth in the work and band length in both unit systems', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.technician);

    await page.getByRole('button', { name: 'Menu' }).click();
    await page.getByRole('link', { name: 'Shop calculators' }).click();
    await page.waitForURL('**/calculators');
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Shop calculators' }).count()).toBe(1);
    // The technician's site works in inches, so the calculators start there.
    expect(await page.getByRole('radio', { name: /Imperial/ }).isChecked()).toBe(true);
    await shot(page, 'calculators-index-phone');

    // Teeth in the work, in millimetres.
    await page.getByRole('link', { name: /Teeth in the work and pitch/ }).click();
    await page.waitForURL('**/calculators/teeth-in-work?units=imperial');
    await chooseUnits(page, 'Metric');
    await page.waitForURL('**/calculators/teeth-in-work?units=metric');
    await page.getByRole('textbox', { name: /Diameter/ }).fill('50');
    await page.getByRole('combobox', { name: 'Pitch' }).selectOption({ label: '4/6 TPI (variable)' });
    // 4/6 TPI counts as 5 TPI: 5 × 50 mm ÷ 25.4 = 9.84 teeth across the full diameter; 5 × π·50/4 ÷ 25.4 = 7.73 on
    // the mean chord (worked by hand).
    const metricTeeth = await resultMatch(page, /4\/6 TPI puts ([\d.]+) to ([\d.]+) teeth in this 50 mm round bar/);
    expect(metricTeeth.slice(1, 3)).toEqual(['7.7', '9.8']);
    const metricMetal = await resultMatch(page, /Metal under the band\s+([\d.,]+)–([\d.,]+)\s+mm/);
    expect(metricMetal.slice(1, 3)).toEqual(['39.3', '50.0']);
    await shot(page, 'calculators-teeth-in-work-metric-phone');

    // The same bar in inches: the length under the band changes unit and value together; the teeth stay.
    await chooseUnits(page, 'Imperial');
    await page.waitForURL('**/calculators/teeth-in-work?units=imperial');
    const imperialMetal = await resultMatch(page, /Metal under the band\s+([\d.,]+)–([\d.,]+)\s+in/);
    expect(number(imperialMetal[1]!)).toBeCloseTo(number(metricMetal[1]!) / MM_PER_IN, 2);
    expect(number(imperialMetal[2]!)).toBeCloseTo(number(metricMetal[2]!) / MM_PER_IN, 2);
    const imperialTeeth = await resultMatch(
      page,
      /4\/6 TPI puts ([\d.]+) to ([\d.]+) teeth in this ([\d.]+) in round bar/,
    );
    expect(imperialTeeth.slice(1, 3)).toEqual(metricTeeth.slice(1, 3));
    expect(number(imperialTeeth[3]!)).toBeCloseTo(50 / MM_PER_IN, 3);
    expect(await page.getByRole('textbox', { name: /Diameter/ }).inputValue()).toBe('1.9685');
    await shot(page, 'calculators-teeth-in-work-imperial-phone');

    // Band length, reached from the switcher: the units travel with the link.
    await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Band length' }).click();
    await page.waitForURL('**/calculators/band-length?units=imperial');
    await page.getByRole('textbox', { name: /Drive wheel diameter/ }).fill('18');
    await page.getByRole('textbox', { name: /Centre distance/ }).fill('53');
    // Open-belt formula with equal wheels, by hand: 2 × 53 + π × 18 = 162.55 in.
    const inches = await resultMatch(page, /take a band ([\d.,]+) in long/);
    expect(inches[1]).toBe('162.55');
    await shot(page, 'calculators-band-length-imperial-phone');

    await chooseUnits(page, 'Metric');
    await page.waitForURL('**/calculators/band-length?units=metric');
    // 162.5487 in × 25.4 = 4,128.7 mm.
    const millimetres = await resultMatch(page, /take a band ([\d.,]+) mm long/);
    expect(millimetres[1]).toBe('4,128.7');
    expect(number(millimetres[1]!) / MM_PER_IN).toBeCloseTo(number(inches[1]!), 2);
    expect(await page.getByRole('textbox', { name: /Drive wheel diameter/ }).inputValue()).toBe('457.2');

    // A centre distance too short for the wheels is explained beside its field.
    await page.getByRole('textbox', { name: /Centre distance/ }).fill('300');
    await page.getByRole('button', { name: 'Work it out' }).click();
    await expect
      .poll(() => page.getByText('Centre distance must be more than half the sum of the wheel diameters').count())
      .toBe(1);
    await shot(page, 'calculators-band-length-error-phone');
    await context.close();
  });

  it('shows the safety caution and the figures on the break-in and check-target calculators', async () => {
    const { context, page } = await newPage(browser, DESKTOP);
    await signIn(page, DEMO.technician);

    await page.goto('/calculators/break-in?units=metric');
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Break-in plan' }).count()).toBe(1);
    expect(await page.getByRole('region', { name: /Caution/ }).innerText()).toContain('Isolate and lock out the power');
    await page.getByRole('textbox', { name: /Normal cutting rate/ }).fill('100');
    // (1/3 × 10 + 0.5 × 5 + 0.75 × 5) min × 100 cm²/min = 958.3 cm² (worked by hand).
    await resultMatch(page, /reach normal feed after 20 min \(958\.3 cm² of cut\)/);
    await shot(page, 'calculators-break-in-desktop');

    await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Check targets' }).click();
    await page.waitForURL('**/calculators/check-targets?units=metric');
    expect(await page.getByRole('region', { name: /Caution/ }).count()).toBe(1);
    const picker = page.getByRole('combobox', { name: 'Fill in from a saw' });
    const firstSaw = (await picker.locator('option').nth(1).textContent()) ?? '';
    await picker.selectOption({ label: firstSaw });
    await expect.poll(() => page.getByRole('textbox', { name: /Band thickness/ }).inputValue()).not.toBe('');
    await page.getByRole('textbox', { name: /Spring-balance reading/ }).fill('50');
    await expect.poll(() => page.getByRole('article', { name: 'Head down-force' }).getByText('Fail').count()).toBe(1);
    await shot(page, 'calculators-check-targets-desktop');

    await page.goto('/calculators/check-targets?units=imperial');
    await page.setViewportSize(PHONE);
    await expect.poll(() => page.getByRole('heading', { level: 1, name: 'Check targets' }).count()).toBe(1);
    await shot(page, 'calculators-check-targets-phone');
    await context.close();
  });

  it('fits a 375 px phone without sideways scrolling', async () => {
    const { context, page } = await newPage(browser, { width: 375, height: 812 });
    await signIn(page, DEMO.technician);
    for (const slug of ['teeth-in-work', 'band-length', 'band-speed', 'stock-area', 'break-in', 'check-targets']) {
      await page.goto(`/calculators/${slug}?units=metric`);
      await expect.poll(() => page.getByRole('button', { name: 'Work it out' }).count()).toBe(1);
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow, slug).toBeLessThanOrEqual(0);
    }

    await page.goto('/calculators/band-speed?units=metric');
    await page.getByRole('combobox', { name: 'Material' }).selectOption({ label: 'Stainless steel' });
    await page.getByRole('textbox', { name: /Band speed set/ }).fill('60');
    await page.getByRole('textbox', { name: /Lowest band speed of the saw/ }).fill('20');
    await page.getByRole('textbox', { name: /Highest band speed of the saw/ }).fill('100');
    await resultMatch(page, /60 m\/min is above the 20–40 m\/min range for stainless steel/);
    await shot(page, 'calculators-band-speed-375');

    await page.goto('/calculators/stock-area?units=metric');
    await page.getByRole('combobox', { name: 'Shape' }).selectOption({ label: 'I/H beam' });
    await page.getByRole('textbox', { name: /Depth/ }).fill('200');
    await page.getByRole('textbox', { name: /Flange width/ }).fill('100');
    await page.getByRole('textbox', { name: /Web thickness/ }).fill('5.6');
    await page.getByRole('textbox', { name: /Flange thickness/ }).fill('8.5');
    // Parallel flanges, no fillets, by hand: 2 × 100 × 8.5 + (200 − 17) × 5.6 = 1,700 + 1,024.8 = 2,724.8 mm² = 27.2 cm².
    await resultMatch(page, /Cut area\s+27\.2\s+cm²/);
    await shot(page, 'calculators-stock-area-375');
    await context.close();
  });
});
