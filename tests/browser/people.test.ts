import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { BASE_URL, DEMO, DESKTOP, PHONE, launch, linkIn, newPage, shot, signIn, waitForMail } from './support.js';

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

describe('a site admin brings a new technician in by e-mail', () => {
  it('invites them; they accept from the mail, sign in, and later choose a new password from a reset link', async () => {
    const stamp = Date.now().toString(36);
    const email = `rhea.solberg.${stamp}@corvane.example`;
    const password = 'chip-brush-and-coolant';

    // The site admin invites a technician for their own site.
    const admin = await newPage(browser, DESKTOP);
    await signIn(admin.page, DEMO.siteAdmin);
    await admin.page.goto('/people');
    await admin.page.getByRole('link', { name: 'Invite someone' }).click();
    await admin.page.waitForURL('**/people/invite');
    await admin.page.getByRole('textbox', { name: /^E-mail/ }).fill(email);
    await admin.page.getByRole('radio', { name: /Saw technician/ }).check();
    // Their one site is already chosen; other roles and sites are not offered.
    expect(await admin.page.getByRole('radio').count()).toBe(2);
    await shot(admin.page, 'site-admin-invite-desktop');
    await admin.page.getByRole('button', { name: 'Send invitation' }).click();
    await admin.page.waitForURL((url) => url.pathname === '/people');
    await expect.poll(() => admin.page.getByText(`Invitation sent to ${email}`).count()).toBe(1);
    await expect.poll(() => admin.page.getByRole('table', { name: 'Invitations' }).getByText(email).count()).toBe(1);
    await shot(admin.page, 'site-admin-invitation-sent-desktop');

    // The invitation arrives at the local mail catcher with a link on the app's address.
    const invitation = await waitForMail(email);
    expect(invitation.subject).toBe('Ines Carvalho invited you to Kerfline');
    const link = linkIn(invitation, 'invitation');
    expect(link.startsWith(`${BASE_URL}/invitation#token=`)).toBe(true);

    // The technician opens it on a phone, chooses a name and password, and is in.
    const tech = await newPage(browser, PHONE);
    await tech.page.goto(link);
    await expect
      .poll(() => tech.page.getByText(/Ines Carvalho invited you as Saw technician at Hammerfield/).count())
      .toBe(1);
    await tech.page.getByRole('textbox', { name: /Your name/ }).fill('Rhea Solberg');
    await tech.page.getByLabel('Choose a password').fill(password);
    await shot(tech.page, 'technician-accept-invitation-phone');
    await tech.page.getByRole('button', { name: 'Set up my account' }).click();
    // In at once, on the start screen of their site's day.
    await tech.page.waitForURL('**/today');
    await expect.poll(() => tech.page.getByRole('heading', { level: 1 }).textContent()).toBe('Today');
    await expect
      .poll(() => tech.page.getByText('Hammerfield Service Centre', { exact: true }).count())
      .toBeGreaterThan(0);
    await shot(tech.page, 'technician-first-sign-in-phone');

    // The link works once.
    const again = await newPage(browser, PHONE);
    await again.page.goto(link);
    await expect.poll(() => again.page.getByText(/already used to set up an account/).count()).toBe(1);
    await shot(again.page, 'invitation-link-used-phone');
    await again.context.close();

    // Signed out, they sign in again with the password they chose.
    await tech.page.getByRole('button', { name: 'Menu' }).click();
    await tech.page.getByRole('button', { name: 'Sign out' }).click();
    await tech.page.waitForURL('**/sign-in');
    await tech.page.getByLabel('E-mail').fill(email);
    await tech.page.getByLabel('Password').fill(password);
    await tech.page.getByRole('button', { name: /sign in/i }).click();
    await tech.page.waitForURL('**/today');

    // The invitation now reads as accepted on the site admin's list.
    await admin.page.goto('/people?invitations=accepted');
    await expect.poll(() => admin.page.getByRole('table', { name: 'Invitations' }).getByText(email).count()).toBe(1);
    await expect.poll(() => admin.page.getByRole('link', { name: 'Rhea Solberg' }).count()).toBe(1);
    await shot(admin.page, 'site-admin-people-desktop');
    await admin.context.close();

    // Forgotten password: a reset link by mail, and the old sessions end.
    const other = await newPage(browser, PHONE);
    await other.page.goto('/sign-in');
    await other.page.getByRole('link', { name: 'Get a link to choose a new one' }).click();
    await other.page.waitForURL('**/forgot-password');
    await other.page.getByLabel('E-mail').fill(email);
    await other.page.getByRole('button', { name: 'Send the link' }).click();
    await expect.poll(() => other.page.getByText(/If an account uses that address/).count()).toBe(1);
    await shot(other.page, 'forgot-password-sent-phone');
    const reset = linkIn(
      await waitForMail(email, (m) => m.subject === 'Choose a new Kerfline password'),
      'reset-password',
    );
    await other.page.goto(reset);
    await other.page.getByLabel('New password', { exact: true }).fill('a-second-password-of-mine');
    await other.page.getByRole('button', { name: 'Save the new password' }).click();
    await expect.poll(() => other.page.getByText('Password changed').count()).toBe(1);
    await shot(other.page, 'password-reset-done-phone');
    // The phone session from before the reset has ended.
    await tech.page.goto('/account');
    await tech.page.waitForURL('**/sign-in**');
    await tech.context.close();
    await other.context.close();

    // The administrator reads both mails on the Mail page (the local catcher's outbox).
    const noor = await newPage(browser, DESKTOP);
    await signIn(noor.page, DEMO.admin);
    await noor.page.getByRole('link', { name: 'Mail', exact: true }).click();
    await noor.page.waitForURL('**/mail');
    await expect.poll(() => noor.page.getByText(`To ${email}`).count()).toBe(2);
    await expect
      .poll(() => noor.page.getByRole('table', { name: 'Mail sent' }).getByText('Sent').count())
      .toBeGreaterThan(1);
    await shot(noor.page, 'admin-mail-desktop');
    await noor.context.close();
  });
});

describe('changing people and sites', () => {
  it('shows a person’s page to their site admin and a site’s change page to an administrator', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.siteAdmin);
    await page.goto('/people');
    await page.getByRole('link', { name: 'Dale Pruitt' }).click();
    await page.waitForURL((url) => /^\/people\/[0-9a-f-]{36}$/.test(url.pathname));
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Dale Pruitt');
    // Only the roles a site admin may give are offered.
    expect(await page.getByRole('radio').count()).toBe(2);
    await page.getByRole('button', { name: 'Deactivate…' }).click();
    await expect.poll(() => page.getByText('Deactivate Dale Pruitt?').count()).toBe(1);
    await shot(page, 'site-admin-person-phone');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await page.getByRole('button', { name: 'Keep the account' }).click();
    await context.close();

    const admin = await newPage(browser, DESKTOP);
    await signIn(admin.page, DEMO.admin);
    await admin.page.goto('/sites');
    await admin.page.getByRole('link', { name: /Hammerfield Service Centre/ }).click();
    await admin.page.getByRole('link', { name: 'Change site' }).click();
    await admin.page.waitForURL('**/edit');
    await expect.poll(() => admin.page.getByRole('button', { name: 'Retire…' }).count()).toBe(1);
    await shot(admin.page, 'admin-site-change-desktop');
    await admin.context.close();
  });

  it('lets a regional lead turn the weekly digest off on their account page', async () => {
    const { context, page } = await newPage(browser, PHONE);
    await signIn(page, DEMO.lead);
    await page.goto('/account');
    const digest = page.getByRole('checkbox', { name: /Weekly region digest/ });
    await expect.poll(() => digest.isChecked()).toBe(true);
    await digest.uncheck();
    await expect.poll(() => page.getByText('Weekly region digest: off').count()).toBe(1);
    await shot(page, 'lead-account-mail-phone');
    await page.reload();
    await expect.poll(() => page.getByRole('checkbox', { name: /Weekly region digest/ }).isChecked()).toBe(false);
    await context.close();
  });
});
