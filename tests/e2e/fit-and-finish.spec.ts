import { expect, test, type Page } from '@playwright/test';
import { LAPTOP } from './a11y';
import { useSession } from './support';

interface ApiJob {
  id: string;
  state: string;
  transitions: Array<{ to: string }>;
}

async function jobsOf(page: Page): Promise<ApiJob[]> {
  return ((await (await page.request.get('/api/jobs?view=table&pageSize=100')).json()) as { data: ApiJob[] }).data;
}

test.use({ viewport: LAPTOP });

test('intake: the vehicle choice goes back to "A vehicle on file" by click and by arrow keys', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  await page.goto('/jobs/new');
  const onFile = page.getByRole('radio', { name: 'A vehicle on file' });
  const another = page.getByRole('radio', { name: 'Another vehicle' });
  await another.check();
  await expect(page.getByLabel('VIN')).toBeVisible();
  await page.getByLabel('Goals').fill('Kept while switching');

  await onFile.click();
  await expect(onFile).toBeChecked();
  await expect(page.getByLabel('Vehicle on file', { exact: true })).toBeVisible();
  await expect(page.getByLabel('VIN')).toHaveCount(0);

  await onFile.focus();
  await page.keyboard.press('ArrowDown');
  await expect(another).toBeChecked();
  await expect(page.getByLabel('VIN')).toBeVisible();
  await page.keyboard.press('ArrowUp');
  await expect(onFile).toBeChecked();
  await expect(page.getByLabel('Vehicle on file', { exact: true })).toBeVisible();
  await expect(page.getByLabel('Goals')).toHaveValue('Kept while switching');
});

test('intake: an empty submit focuses the error summary and shows it; the customer is addressed directly', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  await page.goto('/jobs/new');
  await page.getByRole('button', { name: 'Open the job' }).click();
  const summary = page.getByRole('alert').filter({ hasText: 'Please fix the following' });
  await expect(summary).toBeFocused();
  await expect(summary).toBeInViewport();
  await expect(summary).toContainText('Accept the cautions before the job opens.');
  await expect(page.getByText(/The customer must/)).toHaveCount(0);
});

test('intake: the shop staff still read about "the customer"', async ({ page }) => {
  await useSession(page, 'owner@kestrel.test');
  await page.goto('/jobs/new');
  await expect(page.getByText('The customer has read and accepts these cautions.')).toBeVisible();
});

test('"Show check" on a read opens its check, never an empty row', async ({ page }) => {
  await useSession(page, 'owner@kestrel.test');
  const jobs = await jobsOf(page);
  let jobWithRead: string | undefined;
  for (const job of jobs) {
    const files = ((await (await page.request.get(`/api/jobs/${job.id}/files`)).json()) as { data: Array<{ kind: string }> }).data;
    if (files.some((file) => file.kind === 'read')) {
      jobWithRead = job.id;
      break;
    }
  }
  expect(jobWithRead, 'a demo job with a read').toBeDefined();
  await page.goto(`/jobs/${jobWithRead}`);
  const toggle = page.getByRole('button', { name: /^(Show|Hide) check$/ }).first();
  if ((await toggle.textContent()) === 'Hide check') await toggle.click();
  await expect(toggle).toHaveText('Show check');
  await toggle.click();
  await expect(toggle).toHaveText('Hide check');
  await expect(toggle).toHaveAttribute('aria-expanded', 'true');
  const row = page.locator(`#${await toggle.getAttribute('aria-controls')}`);
  await expect(row).toBeVisible();
  await expect(row).toContainText(/Matches|Differs|Checked|revision|read/i);
  await toggle.click();
  await expect(row).toHaveCount(0);
});

test('"More actions" on a board card closes on Escape and gives focus back', async ({ page }) => {
  await useSession(page, 'owner@kestrel.test');
  await page.goto('/jobs?view=board');
  const more = page.getByRole('button', { name: /^More actions/ }).first();
  await more.click();
  await expect(more).toHaveAttribute('aria-expanded', 'true');
  const panel = page.locator(`[id="${await more.getAttribute('aria-controls')}"]`);
  await expect(panel.getByRole('button', { name: /^Put on hold/ })).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(more).toHaveAttribute('aria-expanded', 'false');
  await expect(panel).toHaveCount(0);
  await expect(more).toBeFocused();
});

test('the upload panel follows the job: its Kind options fit, and no stale bench text after a move', async ({ page }) => {
  await useSession(page, 'owner@kestrel.test');
  const jobs = await jobsOf(page);
  const sendable = jobs.find((job) => job.state === 'on_bench' && job.transitions.some((t) => t.to === 'with_customer'));
  const revisable = jobs.find((job) => job.state === 'log_review' && job.transitions.some((t) => t.to === 'on_bench'));
  const job = sendable ?? revisable;
  expect(job, 'a demo job that moves to or from the bench').toBeDefined();
  await page.goto(`/jobs/${job!.id}`);
  const kind = page.getByLabel('Kind', { exact: true });

  // Every option's text fits the closed select (its width less padding and the arrow).
  const fits = await kind.evaluate((select: HTMLSelectElement) => {
    const probe = document.createElement('span');
    probe.style.font = getComputedStyle(select).font;
    probe.style.position = 'absolute';
    document.body.append(probe);
    const widths = [...select.options].map((option) => {
      probe.textContent = option.text;
      return probe.getBoundingClientRect().width;
    });
    probe.remove();
    return Math.max(...widths) <= select.clientWidth - 40;
  });
  expect(fits).toBe(true);

  if (sendable) {
    await expect(kind).toHaveValue('revision');
    await page.getByRole('button', { name: /^Send revision/ }).first().click();
    await expect(page.getByText('With customer', { exact: true }).first()).toBeVisible();
    await expect(kind).not.toHaveValue('revision');
  } else {
    await expect(kind).not.toHaveValue('revision');
    await page.getByRole('button', { name: /^Revise again/ }).first().click();
    await expect(kind).toHaveValue('revision');
  }
  await expect(page.getByText(/Revisions are (uploaded|taken) while the job is On the bench/)).toHaveCount(0);
});

test('the job page states the log request once; the log upload form points to it', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  // Earlier specs may have moved the customer's waiting job on to review; either takes a log.
  const job = (await jobsOf(page)).find((j) => j.state === 'with_customer' || j.state === 'log_review');
  expect(job, 'a job that takes a log').toBeDefined();
  await page.goto(`/jobs/${job?.id}`);
  await expect(page.getByText('Record what the log request on this page asks for.')).toBeVisible();
  await expect(page.getByText(/Requested: warm up about/)).toHaveCount(0);
  // The log page alone has no log request card, so there the form says what to record.
  await page.goto(`/jobs/${job?.id}/logs`);
  await expect(page.getByText(/Requested: warm up about \d+ minutes/)).toBeVisible();
});
