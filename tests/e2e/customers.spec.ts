import { expect, test } from '@playwright/test';
import { LAPTOP, PHONE, overflowPx, seriousViolations } from './a11y';
import { useSession } from './support';

test.describe.configure({ mode: 'serial' });

for (const [name, size] of [['laptop', LAPTOP], ['phone', PHONE]] as const) {
  test(`owner finds a customer, opens a vehicle's history and edits the vehicle (${name})`, async ({ page }) => {
    // Sign in where the main navigation shows, then look at the pages at this size.
    await useSession(page, 'owner@kestrel.test');
    await page.setViewportSize(size);
    await page.goto('/customers');
    await expect(page.getByRole('heading', { name: 'Customers' })).toBeVisible();
    await page.getByLabel('Search customers').fill('riley');
    const table = page.getByRole('table', { name: /Customers, sorted by/ });
    await expect(table.getByRole('row')).toHaveCount(2);
    expect(await overflowPx(page)).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);
    await page.screenshot({ path: `/tmp/customers-list-${name}.png`, fullPage: true });

    await table.getByRole('link', { name: 'Riley Moss' }).click();
    await expect(page.getByRole('heading', { name: 'Riley Moss' })).toBeVisible();
    await expect(page.getByRole('heading', { name: 'Payments' })).toBeVisible();
    expect(await overflowPx(page)).toBe(0);
    await page.screenshot({ path: `/tmp/customer-page-${name}.png`, fullPage: true });

    await page.locator('section', { has: page.getByRole('heading', { name: 'Vehicles' }) }).getByRole('link').first().click();
    await expect(page.getByRole('heading', { name: 'History' })).toBeVisible();
    await expect(page.getByRole('list', { name: 'Vehicle history' }).getByRole('listitem').first()).toBeVisible();
    expect(await overflowPx(page)).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);
    await page.screenshot({ path: `/tmp/vehicle-history-${name}.png`, fullPage: true });

    await page.getByRole('button', { name: 'Edit vehicle' }).click();
    const description = page.getByLabel('Make, model and trim');
    const renamed = `${await description.inputValue()} (${name})`.slice(0, 120);
    await description.fill(renamed);
    await page.getByRole('button', { name: 'Save vehicle' }).click();
    await expect(page.getByRole('heading', { name: renamed })).toBeVisible();
  });
}

test('a read of an unexpected size is flagged on the vehicle history', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  const vehicles = (await (await page.request.get('/api/vehicles')).json()).data as Array<{ id: string; spec: { engine: { family: string } } }>;
  const i3 = vehicles.find((v) => v.spec.engine.family === '1.5 turbo I3')!;
  await page.goto(`/vehicles/${i3.id}`);
  await expect(page.getByText('Unexpected image size').first()).toBeVisible();
  await page.screenshot({ path: '/tmp/vehicle-flagged-read.png', fullPage: true });
});

for (const [name, size] of [['laptop', LAPTOP], ['phone', PHONE]] as const) {
  test(`a dealer sees its balance, statement and jobs; the owner sees them too (${name})`, async ({ page }) => {
    await useSession(page, 'dealer@kestrel.test');
    await page.setViewportSize(size);
    await page.goto('/customers');
    await page.getByRole('link', { name: 'Balance and statement' }).click();
    await expect(page.getByLabel('Dealer balance')).toBeVisible();
    await expect(page.getByRole('list', { name: 'Dealer jobs' }).getByRole('listitem').first()).toBeVisible();
    await expect(page.getByRole('table', { name: /Statement of/ })).toBeVisible();
    expect(await overflowPx(page)).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);
    await page.screenshot({ path: `/tmp/dealer-page-dealer-${name}.png`, fullPage: true });
    const dealerUrl = page.url();

    await page.context().clearCookies();
    await page.setViewportSize(LAPTOP);
    await useSession(page, 'owner@kestrel.test');
    await page.setViewportSize(size);
    await page.goto(dealerUrl);
    await expect(page.getByLabel('Dealer balance')).toBeVisible();
    await expect(page.getByRole('list', { name: 'Dealer jobs' })).toBeVisible();
    await page.screenshot({ path: `/tmp/dealer-page-owner-${name}.png`, fullPage: true });
  });
}
