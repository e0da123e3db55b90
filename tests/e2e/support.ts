import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'revloop-demo';

/** Signs in through the real form and waits until the signed-in shell is there. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
}

/** The link to the app in the newest mail sent to `to`, read from the development mailbox page. */
export async function linkFromMailbox(page: Page, to: string, subject: RegExp): Promise<string> {
  await page.goto('/dev/mailbox');
  const item = page.getByRole('list', { name: 'Received mails' }).getByRole('button').filter({ hasText: `To ${to}` }).filter({ hasText: subject }).first();
  await item.click();
  const link = page.getByRole('article', { name: 'Selected mail' }).getByRole('link').first();
  const href = await link.getAttribute('href');
  if (!href) throw new Error(`no link in the mail to ${to}`);
  return href;
}
