import fs from 'node:fs';
import path from 'node:path';
import { expect, type APIRequestContext, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'revloop-demo';
/** Only the platform admin may read the development mailbox (docs/decisions/006). */
export const PLATFORM_ADMIN = 'admin@revloop.test';

/** The demo accounts the browser tests use; tests/e2e/sessions.setup.ts signs each in once before the other tests. */
export const SESSION_ACCOUNTS = [
  PLATFORM_ADMIN,
  'owner@kestrel.test',
  'tuner@kestrel.test',
  'tuner2@kestrel.test',
  'dealer@kestrel.test',
  'customer@kestrel.test',
  'owner@harbor.test',
] as const;

/** Where the signed-in cookies of `email` are kept for this run (one folder per port, like the demo data). */
export function sessionFile(email: string): string {
  return path.resolve('.tmp', `e2e-sessions-${process.env.E2E_PORT ?? 8181}`, `${email}.json`);
}

/** The signed-in shell, at any width: the account menu is in the header on a phone too (the main navigation folds away). */
export const accountMenu = (page: Page) => page.getByRole('button', { name: /, account menu$/ });

/** Signs in through the real form and waits until the signed-in shell is there. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(accountMenu(page)).toBeVisible();
}

/**
 * Opens the app in `page` as `email` with the session the setup project saved, instead of typing the password
 * again (the form is tested by the setup and tests/e2e/foundation.spec.ts). Lands where a sign-in lands.
 * An account the setup does not sign in (one a test made, or a demo customer found at run time) uses the form.
 */
export async function useSession(page: Page, email: string): Promise<void> {
  if (!fs.existsSync(sessionFile(email))) return signIn(page, email);
  const state = JSON.parse(fs.readFileSync(sessionFile(email), 'utf8')) as { cookies: Awaited<ReturnType<BrowserContext['cookies']>> };
  await page.context().addCookies(state.cookies);
  await page.goto('/');
  await expect(accountMenu(page)).toBeVisible();
}

/** A new page in a browser context of its own, signed in as `email` (see useSession), open at the landing page. */
export async function openSignedIn(browser: Browser, email: string, options: BrowserContextOptions = {}): Promise<Page> {
  const page = await browser.newPage(options);
  await useSession(page, email);
  return page;
}

/** Runs `use` in a browser context of its own, signed in as the platform admin, so `page` keeps its own session. */
export async function asPlatformAdmin<T>(page: Page, use: (admin: Page) => Promise<T>): Promise<T> {
  const browser = page.context().browser();
  if (!browser) throw new Error('the page has no browser to open an admin context in');
  const origin = page.url().startsWith('http') ? new URL(page.url()).origin : undefined;
  const context = await browser.newContext(origin ? { baseURL: origin } : {});
  try {
    // Signed in through the API (the context's request shares its cookies): the form is tested elsewhere and costs a page load.
    const signedIn = await context.request.post('/api/auth/sign-in', { data: { email: PLATFORM_ADMIN, password: DEMO_PASSWORD } });
    expect(signedIn.status()).toBe(200);
    const admin = await context.newPage();
    return await use(admin);
  } finally {
    await context.close();
  }
}

/** The link to the app in the newest mail sent to `to`, read from the development mailbox page as the platform admin. */
export async function linkFromMailbox(page: Page, to: string, subject: RegExp): Promise<string> {
  return asPlatformAdmin(page, async (admin) => {
    await admin.goto('/dev/mailbox');
    const item = admin.getByRole('list', { name: 'Received mails' }).getByRole('button').filter({ hasText: `To ${to}` }).filter({ hasText: subject }).first();
    await item.click();
    const link = admin.getByRole('article', { name: 'Selected mail' }).getByRole('link').first();
    const href = await link.getAttribute('href');
    if (!href) throw new Error(`no link in the mail to ${to}`);
    return href;
  });
}

export interface Mail {
  to: string[];
  subject: string;
  text: string;
}

const adminRequests = new WeakSet<APIRequestContext>();

/** Mails sent to `address`, read through the API with `request` signed in as the platform admin (signed in on first use). */
export async function mailTo(request: APIRequestContext, address: string): Promise<Mail[]> {
  if (!adminRequests.has(request)) {
    const signedIn = await request.post('/api/auth/sign-in', { data: { email: PLATFORM_ADMIN, password: DEMO_PASSWORD } });
    expect(signedIn.status()).toBe(200);
    adminRequests.add(request);
  }
  const response = await request.get('/api/dev/mailbox');
  expect(response.status()).toBe(200);
  const { data } = (await response.json()) as { data: Mail[] };
  return data.filter((mail) => mail.to.includes(address));
}

/**
 * Fills the intake's vehicle fields after the VIN (make to ethanol) with one made-up V6 sedan; the specs check the VIN
 * and what the form derives (tyre size, stoichiometric AFR) themselves.
 */
export async function fillVehicle(page: Page, make = 'Sedan, 3.8 V6, 5-speed manual'): Promise<void> {
  await page.getByLabel('Make, model and trim').fill(make);
  await page.getByLabel('Displacement (L)').fill('3.8');
  await page.getByLabel('Cylinders').fill('6');
  await page.getByLabel('Engine family').fill('V6');
  await page.getByLabel('Current rev limit (rpm)').fill('6000');
  await page.getByLabel('Gear ratios, first gear first').fill('3.36 2.09 1.47 1.10 0.87');
  await page.getByLabel('Final drive ratio').fill('3.15');
  await page.getByLabel('Tyre size', { exact: true }).fill('245/40R20');
  await page.getByLabel('Curb mass (kg)').fill('1500');
  await page.getByLabel('Pump octane').fill('91');
  await page.getByLabel('Ethanol (% by volume)').fill('10');
}
