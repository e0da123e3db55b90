import { expect, type APIRequestContext, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'revloop-demo';
/** Only the platform admin may read the development mailbox (docs/decisions/006). */
export const PLATFORM_ADMIN = 'admin@revloop.test';

/** Signs in through the real form and waits until the signed-in shell is there. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
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
