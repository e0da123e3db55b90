import { expect, test, type Page } from '@playwright/test';
import { openSignedIn, useSession } from './support';

interface ListedJob {
  id: string;
  number: number;
  round: number;
  customer: { email: string };
  package: { name: string };
  tuner: { id: string } | null;
  facts: { hasRevisionForRound: boolean };
}

/** An on-the-bench, engine-only job of the signed-in tuner with no revision yet this round, found through the API the app uses. */
async function benchJob(page: Page): Promise<ListedJob> {
  const res = await page.request.get('/api/jobs?state=on_bench&mine=true&sort=number&dir=asc&pageSize=100');
  expect(res.ok()).toBe(true);
  const jobs = (await res.json()).data as ListedJob[];
  const job = jobs.find((j) => j.package.name === 'Engine calibration' && !j.facts.hasRevisionForRound);
  if (!job) throw new Error('no engine-only job on the bench for this tuner');
  return job;
}

/** A deterministic 4 MiB raw image: big enough that a slowed upload shows its progress bar for a while. */
function rawImage(): Buffer {
  const bytes = Buffer.alloc(4 * 1024 * 1024);
  for (let i = 0; i < bytes.length; i += 1) bytes[i] = (i * 31 + (i >> 9)) & 0xff;
  return bytes;
}

test('a tuner uploads a revision with a progress bar and the customer downloads it', async ({ browser }) => {
  // The upload is a draft; Kestrel asks for a second person's approval before the tuner sends it (revision-review.spec.ts tells that story in full).
  const tunerPage = await openSignedIn(browser, 'tuner2@kestrel.test');
  const job = await benchJob(tunerPage);
  const revision = job.round + 1;
  await tunerPage.goto(`/jobs/${job.id}`);
  const panel = tunerPage.getByRole('region', { name: 'Calibration files' }).or(tunerPage.locator('section').filter({ has: tunerPage.getByRole('heading', { name: 'Calibration files' }) })).first();
  await expect(panel.getByRole('heading', { name: 'Calibration files' })).toBeVisible();

  // Slow the upload down so the bar is seen moving, as on a shop's real line.
  const cdp = await tunerPage.context().newCDPSession(tunerPage);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 1024 * 1024 });

  const form = tunerPage.getByRole('form', { name: 'Upload a calibration file' });
  await form.getByLabel('Module').selectOption('ECM');
  await form.getByLabel('Kind').selectOption('revision');
  await form.getByLabel('Calibration file').setInputFiles({ name: 'my-revision.bin', mimeType: 'application/octet-stream', buffer: rawImage() });
  await form.getByRole('button', { name: 'Upload file' }).click();

  const bar = form.getByRole('progressbar', { name: /Uploading my-revision\.bin/ });
  await expect(bar).toBeVisible();
  await expect.poll(async () => Number(await bar.getAttribute('aria-valuenow')), { timeout: 20_000 }).toBeGreaterThan(0);
  await expect(form.getByText('Upload complete')).toBeVisible({ timeout: 30_000 });
  await expect(form.getByText(/Saved as a draft/)).toBeVisible();
  await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
  await expect(panel.getByText(`Rev ${revision} (ECM)`).first()).toBeVisible();
  await tunerPage.screenshot({ path: '.tmp/files-tuner.png', fullPage: true });

  // The owner approves the draft; the tuner sends it with the note of what changed, and the job is with the customer.
  const ownerPage = await openSignedIn(browser, 'owner@kestrel.test');
  await ownerPage.goto(`/jobs/${job.id}`);
  await ownerPage.getByRole('button', { name: `Approve Rev ${revision} (ECM)` }).click();
  await expect(ownerPage.getByText(/^Approved by /).first()).toBeVisible();
  await ownerPage.close();
  await tunerPage.reload();
  await tunerPage.getByRole('button', { name: /^Send revision/ }).first().click();
  const dialog = tunerPage.getByRole('dialog');
  await dialog.getByLabel('What changed').fill('Fuel and spark for the new intake.');
  await dialog.getByRole('button', { name: 'Send to the customer' }).click();
  await expect(tunerPage.getByText('With customer', { exact: true }).first()).toBeVisible();
  await tunerPage.close();

  const customerPage = await openSignedIn(browser, job.customer.email);
  await customerPage.goto(`/jobs/${job.id}`);
  await expect(customerPage.getByRole('complementary', { name: 'Before you flash' })).toBeVisible();
  await expect(customerPage.getByText(/battery supporter/).first()).toBeVisible();
  const downloadButton = customerPage.getByRole('button', { name: `Download Rev ${revision} (ECM)` });
  const [download] = await Promise.all([customerPage.waitForEvent('download'), downloadButton.click()]);
  expect(download.suggestedFilename()).toMatch(new RegExp(`^[a-z0-9-]+-ecm-rev${revision}\\.bin$`));
  const path = await download.path();
  expect(path).toBeTruthy();
  await customerPage.screenshot({ path: '.tmp/files-customer.png', fullPage: true });

  // The download is on the job's timeline for the shop.
  await customerPage.reload();
  await expect(customerPage.getByText(`Rev ${revision} (ECM) downloaded`).first()).toBeVisible();
});

test('the owner sees a re-read that differs from its revision and compares two revisions byte by byte', async ({ page }) => {
  await useSession(page, 'owner@kestrel.test');
  const res = await page.request.get('/api/jobs?state=with_customer,log_review&sort=number&dir=asc&pageSize=100');
  const jobs = (await res.json()).data as ListedJob[];
  let found: { job: ListedJob; reRead: string; revision: string } | null = null;
  for (const job of jobs) {
    const files = (await (await page.request.get(`/api/jobs/${job.id}/files`)).json()).data as Array<{ id: string; kind: string; module: string }>;
    const reRead = files.find((f) => f.kind === 're_read');
    const revision = files.find((f) => f.kind === 'revision' && f.module === reRead?.module);
    if (!reRead || !revision) continue;
    const check = (await (await page.request.get(`/api/files/${reRead.id}/verify`)).json()).data as { status: string };
    if (check.status === 'differs') {
      found = { job, reRead: reRead.id, revision: revision.id };
      break;
    }
  }
  if (!found) throw new Error('the demo has no re-read that differs');
  await page.goto(`/jobs/${found.job.id}`);
  await expect(page.getByText(/^Differs in \d+ ranges?$/)).toBeVisible();
  await expect(page.getByText(/changed outside the shop/)).toBeVisible();
  await page.screenshot({ path: '.tmp/files-owner-warning.png', fullPage: true });

  await page.getByLabel('Compare', { exact: true }).selectOption(found.revision);
  await page.getByLabel('With', { exact: true }).selectOption(found.reRead);
  await page.getByRole('link', { name: 'Compare files' }).click();
  await expect(page.getByRole('heading', { name: 'Compare calibration files' })).toBeVisible();
  await expect(page.getByText('Changed bytes')).toBeVisible();
  await expect(page.getByRole('table', { name: 'Bytes side by side' })).toBeVisible();
  await page.screenshot({ path: '.tmp/files-diff.png', fullPage: true });
});
