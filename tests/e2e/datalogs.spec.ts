import { expect, test, type Page } from '@playwright/test';
import { generateLog } from '@revloop/domain/datalog/testing';
import { signIn } from './support';

/** The first job in this state that the signed-in user can see, through the same API the app uses. */
async function firstJobIn(page: Page, state: string): Promise<{ id: string; number: number }> {
  const res = await page.request.get(`/api/jobs?state=${state}&sort=number&dir=asc`);
  expect(res.ok()).toBe(true);
  const job = (await res.json()).data[0];
  if (!job) throw new Error(`no ${state} job for this user`);
  return job;
}

test('a customer uploads a log and sees its checklist at once', async ({ page }) => {
  await signIn(page, 'customer@kestrel.test');
  const job = await firstJobIn(page, 'with_customer');
  await page.goto(`/jobs/${job.id}/logs`);
  const panel = page.getByRole('region', { name: 'Datalogs' }).or(page.locator('section').filter({ hasText: 'Datalogs' })).first();
  await expect(panel.getByText('Before a full-throttle pull')).toBeVisible();

  const { text } = generateLog({ rateHz: 10, warmupS: 320, cruiseS: 60, pulls: [{ gears: [3], pedalPct: 60 }], gearChannel: true });
  await page.getByLabel('Datalog file (CSV)').setInputFiles({ name: 'my-drive.csv', mimeType: 'text/csv', buffer: Buffer.from(text) });
  await page.getByRole('button', { name: 'Upload log' }).click();

  const checks = page.getByRole('list', { name: 'Log checks' });
  await expect(checks).toBeVisible({ timeout: 30_000 });
  for (const title of ['Requested channels', 'Engine warm', 'Full throttle', 'Full-throttle gears', 'Sensors']) {
    await expect(checks.getByText(title, { exact: true })).toBeVisible();
  }
  // The half-pressed pedal is told in plain words, so the customer can log again the same day.
  await expect(checks.getByText(/Press the pedal all the way to the floor/)).toBeVisible();
  await expect(page.getByText(/this log needs to be redone/)).toBeVisible();
  await page.screenshot({ path: '.tmp/datalogs-customer.png', fullPage: true });
  await page.getByRole('link', { name: 'Open the full report' }).click();
  await expect(page.getByRole('heading', { name: 'Log my-drive.csv' })).toBeVisible();
});

test('the tuner sees the trim grid and the chart of a log in review', async ({ page }) => {
  await signIn(page, 'tuner@kestrel.test');
  const job = await firstJobIn(page, 'log_review');
  const logs = await (await page.request.get(`/api/jobs/${job.id}/datalogs`)).json();
  await page.goto(`/datalogs/${logs.data[0].id}`);
  const grid = page.getByRole('table', { name: 'Mean fuel trim by engine speed and manifold pressure' });
  await expect(grid).toBeVisible();
  expect(await grid.getByRole('cell').count()).toBeGreaterThan(4);
  const chart = page.getByRole('img', { name: /Chart of engine speed/ });
  await expect(chart).toBeVisible();
  await expect(chart.locator('.recharts-line').first()).toBeVisible();
  await expect(page.getByRole('link', { name: 'Download trim corrections (CSV)' })).toHaveAttribute('href', /export\/trims\.csv$/);
  await page.getByLabel('mass air flow').check();
  await expect(chart.locator('.recharts-line')).toHaveCount(5);
  await page.screenshot({ path: '.tmp/datalogs-tuner.png', fullPage: true });
});

test('the tuner states a column unit and the AFR scale, and the log is checked again with them', async ({ page }) => {
  await signIn(page, 'tuner@kestrel.test');
  const job = await firstJobIn(page, 'log_review');
  const logs = await (await page.request.get(`/api/jobs/${job.id}/datalogs`)).json();
  const id = logs.data[0].id as string;
  await page.goto(`/datalogs/${id}`);
  await page.getByRole('button', { name: 'Confirm or fix columns' }).click();
  const dialog = page.getByRole('dialog', { name: 'Confirm the column mapping' });
  await dialog.getByLabel('Unit of manifold pressure').selectOption('kPa abs');
  await dialog.getByLabel('Air-fuel ratio columns are written on').selectOption('gasoline');
  await page.screenshot({ path: '.tmp/datalogs-mapping.png', fullPage: true });
  await dialog.getByRole('button', { name: 'Confirm and check again' }).click();
  await expect(dialog).toBeHidden();
  const mapping = await (await page.request.get(`/api/datalogs/${id}/mapping`)).json();
  expect(mapping.data).toMatchObject({ stated: { map: 'kPa abs' }, afrScale: 'gasoline' });
  await expect(page.getByRole('list', { name: 'Log checks' })).toBeVisible({ timeout: 30_000 });
});
