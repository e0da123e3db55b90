import { expect, test } from '@playwright/test';
import { linkFromMailbox, signIn } from './support';

/** What each demo role's main navigation shows (DESIGN roles table; the nav follows the ability). */
const NAV: Array<[email: string, links: string[]]> = [
  ['admin@revloop.test', ['Shops']],
  ['owner@kestrel.test', ['Jobs', 'Customers', 'Team', 'Dealers', 'Reports', 'Kits', 'Settings']],
  ['tuner@kestrel.test', ['Jobs', 'Customers', 'Team', 'Kits']],
  ['dealer@kestrel.test', ['Jobs', 'Customers']],
  ['customer@kestrel.test', ['My jobs', 'Vehicles']],
];

for (const [email, links] of NAV) {
  test(`${email} signs in and sees their own navigation`, async ({ page }) => {
    await signIn(page, email);
    const nav = page.getByRole('navigation', { name: 'Main' });
    for (const label of links) await expect(nav.getByRole('link', { name: label, exact: true })).toBeVisible();
    const all = await nav.getByRole('link').allInnerTexts();
    for (const other of ['Shops', 'Jobs', 'My jobs', 'Team', 'Dealers', 'Customers', 'Vehicles', 'Reports', 'Kits', 'Settings'].filter((l) => !links.includes(l))) {
      expect(all.map((t) => t.trim())).not.toContain(other);
    }
  });
}

test('wrong password shows a clear error and stays signed out', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('owner@kestrel.test');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByText('The e-mail or password is wrong.')).toBeVisible();
  await expect(page).toHaveURL(/sign-in/);
});

test('an owner invites a tuner, who accepts through the mailed link and signs in', async ({ page, browser }) => {
  // Four browser contexts (owner, the platform admin reading the mailbox, the new tuner, a fresh sign-in).
  test.slow();
  const email = `new.tuner.${Date.now()}@kestrel.test`;
  await signIn(page, 'owner@kestrel.test');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
  const invite = page.locator('form').filter({ has: page.getByRole('button', { name: 'Send invitation' }) });
  await invite.getByLabel('E-mail').fill(email);
  await invite.getByLabel('Role', { exact: true }).selectOption('tuner');
  await invite.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(email).first()).toBeVisible();

  const link = await linkFromMailbox(page, email, /invited to Kestrel Calibration Works/);
  const tunerContext = await browser.newContext();
  const tuner = await tunerContext.newPage();
  await tuner.goto(link);
  await expect(tuner.getByText('Kestrel Calibration Works').first()).toBeVisible();
  await tuner.getByLabel('Your name').fill('Nia Quartermain');
  await tuner.getByLabel('Choose a password').fill('nia-tuner-password');
  await tuner.getByRole('button', { name: 'Accept and sign in' }).click();
  await expect(tuner.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' })).toBeVisible();
  await tunerContext.close();

  const again = await browser.newContext();
  const fresh = await again.newPage();
  await signIn(fresh, email, 'nia-tuner-password');
  await expect(fresh.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' })).toBeVisible();
  await again.close();
});

test('a suspended shop signs in read-only with a banner', async ({ page, browser }) => {
  await signIn(page, 'admin@revloop.test');
  const row = page.getByRole('row').filter({ hasText: 'Harbor Dyno & Tune' });
  await row.getByRole('button', { name: /Suspend/ }).click();
  await page.getByRole('dialog').getByRole('button', { name: /Suspend/ }).click();
  await expect(row.getByText(/Suspended/i)).toBeVisible();

  const ownerContext = await browser.newContext();
  const owner = await ownerContext.newPage();
  await signIn(owner, 'owner@harbor.test');
  await expect(owner.getByText(/This shop is suspended/)).toBeVisible();
  await ownerContext.close();

  await row.getByRole('button', { name: /Reactivate/ }).click();
  await page.getByRole('dialog').getByRole('button', { name: /Reactivate/ }).click();
  await expect(row.getByText(/Active/i)).toBeVisible();
});
