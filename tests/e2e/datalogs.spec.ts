import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Locator, type Page } from '@playwright/test';
import { KNOCKING_DRIVE, generateLog } from '@revloop/domain/datalog/testing';
import { useSession } from './support';

/** The first job in this state that the signed-in user can see, through the same API the app uses. */
async function firstJobIn(page: Page, state: string): Promise<{ id: string; number: number }> {
  const res = await page.request.get(`/api/jobs?state=${state}&sort=number&dir=asc`);
  expect(res.ok()).toBe(true);
  const job = (await res.json()).data[0];
  if (!job) throw new Error(`no ${state} job for this user`);
  return job;
}

test('a customer uploads a log and sees its checklist at once', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
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
  await useSession(page, 'tuner@kestrel.test');
  const job = await firstJobIn(page, 'log_review');
  const logs = await (await page.request.get(`/api/jobs/${job.id}/datalogs`)).json();
  await page.goto(`/datalogs/${logs.data[0].id}`);
  const grid = page.getByRole('table', { name: 'Mean fuel trim by engine speed and manifold pressure' });
  await expect(grid).toBeVisible();
  expect(await grid.getByRole('cell').count()).toBeGreaterThan(4);
  const chart = page.getByRole('group', { name: /Chart of engine speed/ });
  await expect(chart).toBeVisible();
  await expect(chart.locator('.recharts-line').first()).toBeVisible();
  await expect(page.getByRole('link', { name: 'Download trim corrections (CSV)' })).toHaveAttribute('href', /export\/trims\.csv$/);
  const before = await chart.locator('.recharts-line').count();
  await page.getByLabel('mass air flow (g/s)').check();
  await expect(chart.locator('.recharts-line')).toHaveCount(before + 1);
  await page.screenshot({ path: '.tmp/datalogs-tuner.png', fullPage: true });
});

test('the tuner states a column unit and the AFR scale, and the log is checked again with them', async ({ page }) => {
  await useSession(page, 'tuner@kestrel.test');
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

// A drive with one full-throttle pull and a knock burst in it, so the chart has a pull to shade and knock to mark.
const KNOCKING_LOG = generateLog(KNOCKING_DRIVE).text;

/** Uploads the knocking drive to the last job in log review (which already has a log) and waits until it is read. */
async function openKnockingLog(page: Page): Promise<string> {
  const res = await page.request.get('/api/jobs?state=log_review&sort=number&dir=desc');
  const job = (await res.json()).data[0];
  const upload = await page.request.post(`/api/jobs/${job.id}/datalogs`, {
    multipart: { file: { name: 'pull-with-knock.csv', mimeType: 'text/csv', buffer: Buffer.from(KNOCKING_LOG) } },
  });
  expect(upload.status()).toBe(202);
  const id: string = (await upload.json()).data.id;
  await expect.poll(async () => (await (await page.request.get(`/api/datalogs/${id}`)).json()).data.status, { timeout: 30_000 }).toBe('ready');
  await page.goto(`/datalogs/${id}`);
  return id;
}

async function seriousAxeFindings(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical' || v.id === 'nested-interactive').map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

// The machine that runs these tests may be busy: loading a log's series can take a while.
const LOAD = { timeout: 45_000 };

/** An axis title drawn in the chart (recharts draws axis and reference labels as text.recharts-label). */
const axisTitle = (chart: Locator, text: string) => chart.locator('text.recharts-label').filter({ hasText: new RegExp(`^${text.replace(/[()]/g, '\\$&')}$`) });

const readoutRow = (page: Page, channel: string): Locator =>
  page.getByRole('table', { name: /^Values at/ }).getByRole('row').filter({ has: page.getByRole('rowheader', { name: channel, exact: true }) });

test('the chart has an axis per unit, a legend, pulls and knock marked, and a readout of every ticked channel', async ({ page }) => {
  await page.setViewportSize({ width: 1366, height: 900 });
  await useSession(page, 'tuner@kestrel.test');
  test.setTimeout(180_000);
  await openKnockingLog(page);
  const chart = page.getByRole('group', { name: /^Chart of engine speed/ });
  await expect(chart.locator('.recharts-line')).toHaveCount(5, LOAD);

  // One y-axis per unit, titled with the unit; the x-axis in m:ss.
  for (const unit of ['rpm', 'kPa', 'λ', '°']) await expect(axisTitle(chart, unit)).toHaveCount(1);
  await expect(axisTitle(chart, 'Time from the start of the log (m:ss)')).toHaveCount(1);
  await expect(chart.getByText('1:00', { exact: true })).toBeVisible();

  const legend = page.getByRole('list', { name: 'Legend' });
  for (const item of ['engine speed (rpm)', 'manifold pressure (kPa)', 'knock retard (°)', 'Full-throttle pull', 'Knock retard event']) {
    await expect(legend.getByText(item, { exact: true })).toBeVisible();
  }
  await expect(chart.locator('.recharts-reference-area')).toHaveCount(1);
  await expect(chart.getByText(/^knock −\d\.\d°$/)).toBeVisible();

  // The readout names every ticked channel with its unit, at the precision each is read at.
  const readout = page.getByRole('table', { name: /^Values at/ });
  await expect(readout.getByRole('row')).toHaveCount(6);
  await expect(readoutRow(page, 'engine speed').getByRole('cell')).toHaveText(/^\d+ rpm$/);
  await expect(readoutRow(page, 'manifold pressure').getByRole('cell')).toHaveText(/^\d+\.\d kPa$/);
  await expect(readoutRow(page, 'measured lambda (wideband air-fuel ratio)').getByRole('cell')).toHaveText(/^λ \d\.\d{3}$/);
  await expect(readoutRow(page, 'knock retard').getByRole('cell')).toHaveText(/^\d+\.\d°$/);
  await page.getByLabel('mass air flow (g/s)').check();
  await expect(readoutRow(page, 'mass air flow').getByRole('cell')).toHaveText(/^\d+\.\d g\/s$/, LOAD);
  await expect(axisTitle(chart, 'g/s')).toHaveCount(1);

  // The cursor moves by keyboard; the readout follows it.
  const cursor = page.getByRole('slider', { name: /^Cursor at/ });
  await cursor.focus();
  await page.keyboard.press('Home');
  await expect(readout).toHaveAccessibleName('Values at 0:00.0 (0.0 s)');
  await page.keyboard.press('ArrowRight');
  await expect(readout).toHaveAccessibleName(/^Values at 0:0[01]\.\d/);
  await expect(readoutRow(page, 'engine speed').getByRole('cell')).toHaveText(/^\d+ rpm$/);

  // Pull choice by keyboard: show the pull alone.
  await page.getByLabel('Show').selectOption({ index: 1 });
  await expect(page.getByLabel('Show')).toHaveValue('pull:0');
  await expect(chart.locator('.recharts-reference-area')).toHaveCount(1);

  expect(await seriousAxeFindings(page)).toEqual([]);
  await page.screenshot({ path: '.tmp/datalogs-chart-1366.png', fullPage: true });
});

test('two logs of a job overlaid on a pull, and one channel against another coloured by a third', async ({ page }) => {
  await page.setViewportSize({ width: 1366, height: 900 });
  test.setTimeout(180_000);
  await useSession(page, 'tuner@kestrel.test');
  await openKnockingLog(page);

  // The view switch is a radio group: arrow keys move between views.
  await page.getByRole('radio', { name: 'Over time' }).focus();
  await page.keyboard.press('ArrowRight');
  await expect(page.getByRole('radio', { name: 'Two logs overlaid' })).toBeChecked();
  const overlay = page.getByRole('group', { name: /^Overlay of This log/ });
  await expect(overlay.locator('.recharts-line')).toHaveCount(10, LOAD);
  await expect(overlay.locator('.recharts-line path[stroke-dasharray="5 3"]')).toHaveCount(5);
  await expect(axisTitle(overlay, 'Time from the start of the pull (m:ss)')).toHaveCount(1, LOAD);
  await expect(page.getByLabel('Pull in this log')).toBeEnabled();
  const readout = page.getByRole('table', { name: /^Values at/ });
  await expect(readout.getByRole('columnheader')).toHaveText([/Channel/, /^This log, /, /, (Rev \d|the stock calibration)$/, 'Change']);
  await expect(readoutRow(page, 'engine speed').getByRole('cell')).toHaveText([/^\d+ rpm$/, /^\d+ rpm$/, /^[+−±]\d+ rpm$/]);
  await page.getByLabel('Time from the start of each log').check();
  await expect(axisTitle(overlay, 'Time from the start of each log (m:ss)')).toHaveCount(1, LOAD);
  await expect(page.getByLabel('Pull in this log')).toBeDisabled();
  expect(await seriousAxeFindings(page)).toEqual([]);

  await page.getByRole('radio', { name: 'Two logs overlaid' }).focus();
  await page.keyboard.press('ArrowRight');
  await expect(page.getByRole('radio', { name: 'One channel against another' })).toBeChecked();
  await page.getByLabel('Across (x)').selectOption({ label: 'manifold pressure (kPa)' });
  await page.getByLabel('Up (y)').selectOption({ label: 'knock retard (°)' });
  await page.getByLabel('Colour by').selectOption({ label: 'engine speed (rpm)' });
  const scatter = page.getByRole('group', { name: /^knock retard against manifold pressure, coloured by engine speed/ });
  await expect(axisTitle(scatter, 'manifold pressure (kPa)')).toHaveCount(1, LOAD);
  await expect(axisTitle(scatter, 'knock retard (°)')).toHaveCount(1);
  await expect.poll(() => scatter.locator('.recharts-scatter-symbol').count(), LOAD).toBeGreaterThan(1000);
  const scale = page.getByRole('list', { name: /^Colour: engine speed \(rpm\)/ });
  await expect(scale.getByRole('listitem')).toHaveCount(7);
  await expect(scale.getByRole('listitem').first()).toHaveText(/^\d+–\d+ rpm\s*\(\d+\)$/);
  await page.getByLabel('Samples from').selectOption({ index: 1 });
  await expect(page.getByText(/samples from \d+:\d\d to \d+:\d\d\.$/)).toBeVisible();
  expect(await seriousAxeFindings(page)).toEqual([]);
});

for (const email of ['tuner@kestrel.test', 'customer@kestrel.test']) {
  test(`the report page is never wider than a 390 px phone (${email})`, async ({ page }) => {
    test.setTimeout(180_000);
    await useSession(page, email);
    // Signed in at the default size (the header's main navigation shows there), then onto the phone's width.
    await page.setViewportSize({ width: 390, height: 844 });
    const jobs = (await (await page.request.get('/api/jobs?sort=number&dir=asc&pageSize=100')).json()).data as { id: string }[];
    let logId: string | undefined;
    for (const job of jobs) {
      logId = (await (await page.request.get(`/api/jobs/${job.id}/datalogs`)).json()).data.find((l: { status: string }) => l.status === 'ready')?.id;
      if (logId) break;
    }
    expect(logId, 'a log this user can open').toBeDefined();
    await page.goto(`/datalogs/${logId}`);
    for (const view of ['Over time', 'Two logs overlaid', 'One channel against another']) {
      await page.getByText(view, { exact: true }).click();
      await expect(page.getByRole('radio', { name: view })).toBeChecked();
      await page.waitForLoadState('networkidle');
      expect(await page.evaluate(() => document.documentElement.scrollWidth), view).toBeLessThanOrEqual(390);
    }
    await page.getByText('Over time', { exact: true }).click();
    // The wide chart scrolls inside a box that the keyboard can reach.
    const box = page.getByRole('group', { name: /^Chart of / });
    await expect(box).toHaveAttribute('tabindex', '0');
    expect(await seriousAxeFindings(page)).toEqual([]);
    await page.screenshot({ path: `.tmp/datalogs-chart-390-${email.split('@')[0]}.png`, fullPage: true });
  });
}
