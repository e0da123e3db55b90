import { expect, test, type Page } from '@playwright/test';
import { fillVehicle, mailTo, useSession } from './support';

test.describe.configure({ mode: 'serial' });

const VIEWPORTS = [
  { name: 'desktop', width: 1366, height: 900 },
  { name: 'phone', width: 390, height: 844 },
] as const;

/** The VIN, then the shared vehicle fields. */
async function fillVehicleWithVin(page: Page) {
  // 1G4AH59H45G118341: check digit 4 (49 CFR 565.15(c) Table V worked example [STD], REFERENCES "VIN check digit").
  await page.getByLabel('VIN').fill('1G4AH59H45G118341');
  await expect(page.getByLabel('Model year')).toHaveValue('2005');
  await fillVehicle(page);
}

for (const viewport of VIEWPORTS) {
  test(`a new customer starts a tune from the public page and lands on the job (${viewport.width} px)`, async ({ page, browser, request }) => {
    test.slow();
    await page.setViewportSize({ width: viewport.width, height: viewport.height });
    const email = `new.driver.${viewport.name}.${Date.now()}@example.test`;

    await page.goto('/s/kestrel');
    await expect(page.getByRole('heading', { level: 1, name: 'Kestrel Calibration Works' })).toBeVisible();
    const packages = page.getByRole('region', { name: 'Packages' });
    await expect(packages.getByText('$599.00').first()).toBeVisible();
    await expect(packages.getByText(/revision rounds included/).first()).toBeVisible();
    // The cautions are on the page before anyone starts.
    await expect(page.getByText('Log only on a closed course or a dyno, never on public roads.').first()).toBeVisible();
    await expect(page.getByText(/defer to licensed professionals/).first()).toBeVisible();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
    await page.screenshot({ path: `.tmp/front-door-${viewport.name}-page.png`, fullPage: true });

    await packages.getByRole('button', { name: /^Start a tune: Engine calibration/ }).first().click();
    const form = page.getByRole('form', { name: 'Start a tune' });
    await expect(form).toBeVisible();
    await form.getByLabel('Your name').fill('Riley Novak');
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Password').fill('a-long-enough-password');
    await fillVehicleWithVin(page);
    await form.getByLabel('Goals').fill('Smoother part throttle and a little more mid-range.');
    // Nothing is sent before the cautions are accepted.
    await form.getByRole('button', { name: 'Start a tune' }).click();
    await expect(page.getByText('Cautions: ').first()).toBeVisible();
    await form.getByLabel('I have read and accept these cautions.').check();
    await form.getByRole('button', { name: 'Start a tune' }).click();
    await expect(page.getByText(`We sent a link to ${email}`)).toBeVisible();
    await page.screenshot({ path: `.tmp/front-door-${viewport.name}-sent.png`, fullPage: true });

    // The link from the mail, read from the development mailbox as the platform admin.
    await expect.poll(async () => (await mailTo(request, email)).length).toBe(1);
    const mail = (await mailTo(request, email))[0]!;
    const link = /http\S+\/s\/kestrel\/verify\?token=\S+/.exec(mail.text)?.[0];
    expect(link).toBeDefined();

    // Opened in a fresh browser, as from a mail client: it signs in and lands on the job.
    const context = await browser.newContext({ viewport: { width: viewport.width, height: viewport.height } });
    const customer = await context.newPage();
    await customer.goto(new URL(link!).pathname + new URL(link!).search);
    // The link's request opens the account and the job and sends two mails; a loaded machine takes its time.
    await expect(customer.getByRole('heading', { name: /^Job \d+$/ })).toBeVisible({ timeout: 30_000 });
    await expect(customer.getByText('Read the calibration off your vehicle and upload it as the stock read.').first()).toBeVisible();
    await expect(customer.getByText('Sedan, 3.8 V6, 5-speed manual').first()).toBeVisible();
    expect(await customer.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
    await customer.screenshot({ path: `.tmp/front-door-${viewport.name}-job.png`, fullPage: true });

    // The link works once.
    await customer.goto(new URL(link!).pathname + new URL(link!).search);
    await expect(customer.getByText('This link is invalid, used or expired.')).toBeVisible();
    await context.close();
  });
}

test('a page turned off answers "no page here"; the owner turns it back on', async ({ page }) => {
  await useSession(page, 'owner@harbor.test');
  await page.goto('/settings/shop');
  const publicPage = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Public page' }) });
  await expect(publicPage.getByLabel('Page address')).toHaveValue('harbor-dyno');
  await publicPage.getByLabel('Public page on').uncheck();
  await publicPage.getByRole('button', { name: 'Save public page' }).click();
  await expect(publicPage.getByRole('button', { name: 'Save public page' })).toBeDisabled();
  await page.goto('/s/harbor-dyno');
  await expect(page.getByText('This address has no public page')).toBeVisible();
  await page.goto('/settings/shop');
  await publicPage.getByLabel('Public page on').check();
  await publicPage.getByRole('button', { name: 'Save public page' }).click();
  await expect(publicPage.getByText('Your page is on at')).toBeVisible();
  await page.goto('/s/harbor-dyno');
  await expect(page.getByRole('heading', { level: 1, name: 'Harbor Dyno & Tune' })).toBeVisible();
});

for (const viewport of VIEWPORTS) {
  test(`a new shop sees the first-run checklist on its board; each step links to its page (${viewport.width} px)`, async ({ page }) => {
    await page.setViewportSize({ width: viewport.width, height: viewport.height });
    await page.goto('/sign-up');
    await page.getByLabel('Shop name').fill(`Bench Co ${viewport.name}`);
    await page.getByLabel('Your name').fill('Ari Vale');
    await page.getByLabel('E-mail').fill(`ari.${viewport.name}.${Date.now()}@bench.test`);
    await page.getByLabel('Password').fill('long-enough-pass');
    await page.getByRole('button', { name: 'Create shop' }).click();
    const checklist = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Set up your shop' }) });
    await expect(checklist.getByText('0 of 5 done.')).toBeVisible();
    await expect(checklist.getByRole('listitem')).toHaveCount(5);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
    await page.screenshot({ path: `.tmp/front-door-${viewport.name}-checklist.png`, fullPage: true });

    // Set the public page from the step's link; back on the board the step has ticked itself.
    await checklist.getByRole('link', { name: /Share the public page link/ }).click();
    const publicPage = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Public page' }) });
    await publicPage.getByLabel('Page address').fill(`bench-co-${viewport.name}`);
    await publicPage.getByLabel('Public page on').check();
    await publicPage.getByRole('button', { name: 'Save public page' }).click();
    await expect(publicPage.getByText('Your page is on at')).toBeVisible();
    await page.goto('/jobs');
    await expect(checklist.getByText('1 of 5 done.')).toBeVisible();
    await expect(checklist.getByRole('link', { name: new RegExp(`/s/bench-co-${viewport.name}$`) })).toBeVisible();
    await expect(page.getByText('No packages yet')).toHaveCount(0);
    await checklist.getByRole('link', { name: /Add a package/ }).click();
    await expect(page.getByText('No packages yet')).toBeVisible();
  });
}
