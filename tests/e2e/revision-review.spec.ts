import { expect, test, type Browser, type Page } from '@playwright/test';
import { openSignedIn } from './support';

// Issue 13 part 2 in the browser: a tuner's revision upload is a draft the customer does not see; another tuner
// approves it (Kestrel asks for approval); the tuner sends it with a note; the customer reads the note and downloads.

interface ListedJob {
  id: string;
  number: number;
  round: number;
  customer: { email: string };
  package: { name: string };
  draftsAwaitingApproval: number;
  facts: { hasRevisionForRound: boolean };
}

/** A page of its own signed in as `email`; at 390 px the main navigation folds into the menu. */
const pageAs = (browser: Browser, email: string, width = 1366): Promise<Page> => openSignedIn(browser, email, { viewport: { width, height: width > 800 ? 900 : 844 } });

/** An engine-only job of this tuner on the bench with no draft yet, found through the API the app uses. */
async function benchJobWithoutDraft(page: Page): Promise<ListedJob> {
  const res = await page.request.get('/api/jobs?state=on_bench&mine=true&sort=number&dir=asc&pageSize=100');
  expect(res.ok()).toBe(true);
  const job = ((await res.json()).data as ListedJob[]).find((j) => j.package.name === 'Engine calibration' && !j.facts.hasRevisionForRound);
  if (!job) throw new Error('no engine-only bench job without a draft for this tuner');
  return job;
}

const filesPanel = (page: Page) => page.locator('section').filter({ has: page.getByRole('heading', { name: 'Calibration files' }) }).first();

test('a draft goes out only after another tuner approves it and the tuner sends it with a note', async ({ browser }) => {
  // Four people and two screen widths in one story: longer than one page's default budget.
  test.setTimeout(240_000);
  const uploader = await pageAs(browser, 'tuner2@kestrel.test');
  const job = await benchJobWithoutDraft(uploader);
  const rev = `Rev ${job.round + 1} (ECM)`;
  await uploader.goto(`/jobs/${job.id}`);
  const form = uploader.getByRole('form', { name: 'Upload a calibration file' });
  await form.getByLabel('Module').selectOption('ECM');
  await form.getByLabel('Kind').selectOption('revision');
  await form.getByLabel('Calibration file').setInputFiles({ name: 'next.bin', mimeType: 'application/octet-stream', buffer: Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 13) & 0xff)) });
  await form.getByRole('button', { name: 'Upload file' }).click();
  await expect(form.getByText(/Saved as a draft/)).toBeVisible({ timeout: 30_000 });
  await expect(filesPanel(uploader).getByText('Awaiting approval').first()).toBeVisible();
  // The uploader may not approve their own draft, and cannot send it before someone does.
  await expect(uploader.getByRole('button', { name: `Approve ${rev}` })).toHaveCount(0);
  await expect(uploader.getByRole('button', { name: /^Send revision/ })).toHaveCount(0);
  await expect(uploader.getByText('On the bench', { exact: true }).first()).toBeVisible();

  // The customer sees nothing of the draft.
  const customer = await pageAs(browser, job.customer.email);
  await customer.goto(`/jobs/${job.id}`);
  await expect(customer.getByRole('heading', { name: 'Calibration files' })).toBeVisible();
  await expect(customer.getByText(rev)).toHaveCount(0);
  await expect(customer.getByRole('button', { name: `Download ${rev}` })).toHaveCount(0);

  // Another tuner finds it on the board by the filter, diffs it in one click and approves it.
  const reviewer = await pageAs(browser, 'tuner@kestrel.test');
  await reviewer.goto('/jobs');
  const filter = reviewer.getByLabel('Drafts awaiting approval');
  await filter.click();
  await expect(filter).toBeChecked();
  const card = reviewer.getByRole('article').filter({ hasText: `#${job.number}` });
  await expect(card.getByText('Awaiting approval')).toBeVisible();
  await reviewer.screenshot({ path: '.tmp/revision-review-board-1366.png', fullPage: false });
  await card.getByRole('link').first().click();
  await reviewer.getByRole('link', { name: `Diff ${rev} against previous` }).click();
  await expect(reviewer.getByRole('heading', { name: 'Compare calibration files' })).toBeVisible();
  await reviewer.goBack();
  await reviewer.getByRole('button', { name: `Approve ${rev}` }).click();
  // The job is not the reviewer's: with nothing left to approve it leaves their reach, and they are back on the board.
  await expect(reviewer).toHaveURL(/\/jobs\?awaiting=approval$/);
  await expect(reviewer.getByRole('article').filter({ hasText: `#${job.number}` })).toHaveCount(0);

  // The uploader sends it with the note; an empty note is refused first.
  const note = 'More fuel at full throttle above 4,500 rpm; spark unchanged.';
  await uploader.reload();
  await expect(filesPanel(uploader).getByText('Approved by Marco Lindqvist')).toBeVisible();
  await uploader.screenshot({ path: '.tmp/revision-review-approved-1366.png', fullPage: true });
  await uploader.getByRole('button', { name: /^Send revision/ }).first().click();
  const dialog = uploader.getByRole('dialog');
  await dialog.getByRole('button', { name: 'Send to the customer' }).click();
  await expect(dialog.getByText('Say what changed in this revision.')).toBeVisible();
  await dialog.getByLabel('What changed').fill(note);
  await uploader.screenshot({ path: '.tmp/revision-review-send-1366.png' });
  await dialog.getByRole('button', { name: 'Send to the customer' }).click();
  await expect(uploader.getByText('With customer', { exact: true }).first()).toBeVisible();

  // The customer reads the note beside the download, on a laptop and on a phone.
  await customer.reload();
  await expect(customer.getByText(note).first()).toBeVisible();
  const [download] = await Promise.all([customer.waitForEvent('download'), customer.getByRole('button', { name: `Download ${rev}` }).click()]);
  expect(download.suggestedFilename()).toMatch(new RegExp(`-ecm-rev${job.round + 1}\\.bin$`));
  await customer.screenshot({ path: '.tmp/revision-review-customer-1366.png', fullPage: true });
  const phone = await pageAs(browser, job.customer.email, 390);
  await phone.goto(`/jobs/${job.id}`);
  await expect(phone.getByText(note).first()).toBeVisible();
  await phone.screenshot({ path: '.tmp/revision-review-customer-390.png', fullPage: true });
  const staffPhone = await pageAs(browser, 'tuner@kestrel.test', 390);
  await staffPhone.goto('/jobs?awaiting=approval');
  await staffPhone.screenshot({ path: '.tmp/revision-review-board-390.png', fullPage: false });
});
