import fs from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { LAPTOP, overflowPx, PHONE, seriousViolations } from './a11y';
import { useSession } from './support';

/** Every report card: its heading, the caption of its table, and the name of its chart region. */
const REPORTS = [
  { heading: 'Turnaround', table: 'Time in each state (hours)', chart: 'Time in each state (chart)' },
  { heading: 'Rounds per dialed-in job', table: /^Rounds per job, \d+ jobs dialed in$/, chart: 'Rounds per dialed-in job (chart)' },
  { heading: 'Load per tuner', table: 'Load per tuner', chart: 'Load per tuner (chart)' },
  { heading: 'Jobs per week', table: 'Jobs opened and dialed in per week', chart: 'Jobs per week (chart)' },
  { heading: 'Revenue by month', table: /^Revenue by month \(USD\)$/, chart: 'Revenue by month (chart)' },
  { heading: 'Revenue by package', table: /^Revenue by package \(USD\)$/, chart: 'Revenue by package (chart)' },
  { heading: 'Revenue by dealer', table: /^Revenue by dealer \(USD\)$/, chart: 'Revenue by dealer (chart)' },
  { heading: 'Log quality', table: /^Check results over \d+ analysed logs$/, chart: 'Log quality (chart)' },
];

async function openReports(page: Page) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reports' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Reports' })).toBeVisible();
}

async function expectEveryReport(page: Page) {
  for (const r of REPORTS) {
    await expect(page.getByRole('heading', { name: r.heading, exact: true })).toBeVisible();
    const table = page.getByRole('table', { name: r.table });
    await expect(table).toBeVisible();
    // The demo has months of history: every table has rows.
    expect(await table.getByRole('row').count()).toBeGreaterThan(1);
    const chart = page.getByRole('region', { name: r.chart });
    await expect(chart.locator('.recharts-surface').first()).toBeVisible();
    // Both axes drawn, each with its title (two labels), and a legend on every chart.
    await expect(chart.locator('.recharts-xAxis')).toHaveCount(1);
    await expect(chart.locator('.recharts-yAxis')).toHaveCount(1);
    await expect(chart.locator('.recharts-label')).toHaveCount(2);
    await expect(chart.locator('.recharts-legend-wrapper')).toBeVisible();
  }
}

test('the owner sees every report with charts and tables, changes the dates and downloads a CSV', async ({ page }) => {
  test.setTimeout(180_000);
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await openReports(page);
  await expectEveryReport(page);
  await page.screenshot({ path: '.tmp/test-results/reports-1366.png', fullPage: true });

  const turnaround = page.getByRole('table', { name: 'Time in each state (hours)' });
  await expect(turnaround.getByRole('rowheader', { name: 'With customer' })).toBeVisible();

  const download = page.waitForEvent('download');
  await page.getByRole('link', { name: 'Download CSV of revenue by month' }).click();
  const file = await download;
  expect(file.suggestedFilename()).toMatch(/^revenue-by-month-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
  const lines = fs.readFileSync((await file.path())!, 'utf8').split('\r\n');
  expect(lines[0]).toBe('Month (YYYY-MM),Customer payments (USD),Refunds (USD),Dealer debits (USD),Net revenue (USD)');
  expect(lines.length).toBeGreaterThan(3);

  // A range with no work in it: each card says so in words instead of drawing an empty chart.
  await page.getByLabel('From', { exact: true }).fill('2020-01-01');
  await expect(page.getByLabel('From', { exact: true })).toHaveValue('2020-01-01');
  await page.getByLabel('To', { exact: true }).fill('2020-01-31');
  await expect(page).toHaveURL(/from=2020-01-01&to=2020-01-31/);
  await expect(page.getByText('No job moved in these days.')).toBeVisible();
  await expect(page.getByText('No log was uploaded during these days.')).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});

test('on a phone the reports fit the width: charts and tables scroll inside their own regions', async ({ page }) => {
  // Eight charts and an accessibility scan on a shared two-core machine.
  test.setTimeout(180_000);
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.setViewportSize(PHONE);
  await page.goto('/reports');
  await expectEveryReport(page);
  expect(await overflowPx(page)).toBe(0);
  expect(await seriousViolations(page)).toEqual([]);
  await page.screenshot({ path: '.tmp/test-results/reports-390.png', fullPage: true });
});

test('a tuner has no Reports link, and the page and API refuse them', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'tuner@kestrel.test');
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' })).toBeVisible();
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reports' })).toHaveCount(0);
  await page.goto('/reports');
  await expect(page.getByText('This page is not part of your role')).toBeVisible();
  const res = await page.request.get('/api/reports/turnaround?from=2026-01-01&to=2026-12-31');
  expect(res.status()).toBe(403);
});
