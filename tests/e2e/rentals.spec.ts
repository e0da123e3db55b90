import fs from 'node:fs';
import zlib from 'node:zlib';
import { expect, test, type Page } from '@playwright/test';
import { LAPTOP, overflowPx, PHONE } from './a11y';
import { useSession } from './support';

// Issue 14's browser path: owner adds a kit; customer asks; owner books and ships; customer pays the fee and the
// hold; the kit comes back damaged; the owner takes part of the deposit; the customer sees why.
test.describe.configure({ mode: 'serial' });

const KIT = `E2E kit ${Date.now()}`;
const REASON = 'Cracked OBD connector housing';
let jobId = '';

/** A PNG chunk: length, type, data and the CRC-32 of type and data (PNG specification, W3C, section 5.3). */
function pngChunk(type: string, data: Buffer): Buffer {
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A valid 1×1 PNG of one opaque colour, made from bytes: signature, IHDR (8-bit RGB), one zlib-packed row, IEND. */
function onePixelPng(rgb: [number, number, number]): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(1, 0);
  header.writeUInt32BE(1, 4);
  header.set([8, 2, 0, 0, 0], 8);
  const row = Buffer.from([0, ...rgb]);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', header),
    pngChunk('IDAT', zlib.deflateSync(row)),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

async function payOnHostedPage(page: Page) {
  await expect(page.getByText('Local test payment page.')).toBeVisible();
  await page.getByRole('button', { name: /^(Pay|Save card)$/ }).click();
}

test('the owner adds a kit and sees it in the list at 1366 and 390 px', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Kits' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Kits' })).toBeVisible();
  await page.getByRole('button', { name: 'Add kit' }).click();
  await page.getByLabel('Name').fill(KIT);
  await page.getByLabel('Interface serial number').fill('IF-E2E-0001');
  await page.getByLabel('Laptop asset tag').fill('LT-E2E-01');
  await page.getByLabel(/Price per week/).fill('120.00');
  await page.getByLabel(/Deposit/).fill('500.00');
  await page.getByLabel(/Late fee per day/).fill('15.00');
  await page.getByLabel('Contents checklist').fill('Vehicle interface\nLaptop\nOBD cable\nBattery supporter');
  await page.getByLabel('Platforms').fill('EA888 gen 3');
  await page.getByRole('button', { name: 'Add kit', exact: true }).last().click();
  const row = page.getByRole('row', { name: new RegExp(KIT) });
  await expect(row).toBeVisible();
  await expect(row.getByText('$120.00')).toBeVisible();
  await page.screenshot({ path: '/tmp/rentals-kits-1366.png', fullPage: true });
  await page.setViewportSize(PHONE);
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-kits-390.png', fullPage: true });
  await row.getByRole('link', { name: KIT }).click();
  await expect(page.getByRole('heading', { level: 1, name: KIT })).toBeVisible();
  await expect(page.getByRole('heading', { name: /^Bookings — / })).toBeVisible();
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-kit-390.png', fullPage: true });
});

test('a customer asks for a kit when opening a job', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  await page.goto('/jobs/new');
  const onFile = page.getByRole('radio', { name: 'A vehicle on file' });
  if (await onFile.isVisible()) await onFile.check();
  const vehicle = page.getByLabel('Vehicle on file', { exact: true });
  await vehicle.selectOption({ index: 1 });
  await page.getByLabel('Package').selectOption({ index: 1 });
  await page.getByLabel('Goals').fill('Smoother part throttle; I have no interface of my own.');
  await page.getByLabel('I need a flashing kit').check();
  await page.getByLabel('Kit needed from').fill('2027-03-01');
  await page.getByLabel('Kit due back').fill('2027-03-14');
  await page.getByLabel('I have read and accept these cautions.').check();
  await page.getByRole('button', { name: 'Open the job' }).click();
  await page.waitForURL(/\/jobs\/(?!new)[^/?]+$/);
  jobId = new URL(page.url()).pathname.split('/').pop()!;
  // The main navigation folds into a menu on a phone; sign in wide, then look at the phone width.
  await page.setViewportSize(PHONE);
  await expect(page.getByRole('article', { name: /Kit rental: kit to be picked/ })).toBeVisible();
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-ask-390.png', fullPage: true });
});

test('the owner books the new kit for the request', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.goto(`/jobs/${jobId}`);
  const rental = page.getByRole('article', { name: /Kit rental: kit to be picked/ }).last();
  await rental.getByRole('button', { name: 'Book the kit' }).first().click();
  await rental.getByLabel('Kit', { exact: true }).selectOption({ label: `${KIT} (IF-E2E-0001)` });
  await rental.getByRole('button', { name: 'Book the kit' }).first().click();
  await expect(page.getByRole('article', { name: `Kit rental: ${KIT}` })).toBeVisible();
  await page.screenshot({ path: '/tmp/rentals-booked-1366.png', fullPage: true });
});

test('the customer agrees, pays the fee and authorises the deposit hold', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  // The main navigation folds into a menu on a phone; sign in wide, then look at the phone width.
  await page.setViewportSize(PHONE);
  await page.goto(`/jobs/${jobId}`);
  const rental = page.getByRole('article', { name: `Kit rental: ${KIT}` });
  await expect(rental.getByText('$500.00')).toBeVisible();
  await rental.getByLabel('I agree to the rental terms').check();
  await rental.getByRole('button', { name: 'Agree to the terms' }).click();
  await rental.getByRole('button', { name: /^Pay the rental fee/ }).click();
  await payOnHostedPage(page);
  await page.goto(`/jobs/${jobId}`);
  await page.getByRole('article', { name: `Kit rental: ${KIT}` }).getByRole('button', { name: /^Authorise the deposit hold/ }).click();
  await payOnHostedPage(page);
  await page.goto(`/jobs/${jobId}`);
  await expect(page.getByRole('article', { name: `Kit rental: ${KIT}` }).getByText('Rental fee paid')).toBeVisible({ timeout: 15_000 });
  await page.screenshot({ path: '/tmp/rentals-paid-390.png', fullPage: true });
});

test('the owner ships, records a damaged return and captures part of the deposit', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.goto(`/jobs/${jobId}`);
  const rental = page.getByRole('article', { name: `Kit rental: ${KIT}` });
  await rental.getByRole('button', { name: 'Mark shipped' }).first().click();
  await rental.getByLabel('Carrier').fill('UPS');
  await rental.getByLabel('Tracking number').fill('1Z999AA10123456784');
  await rental.getByRole('button', { name: 'Mark shipped' }).first().click();
  await expect(rental.getByText(/tracking UPS 1Z999AA10123456784/)).toBeVisible();
  await rental.getByRole('button', { name: 'Kit received back' }).first().click();
  await rental.getByLabel('Vehicle interface').check();
  await rental.getByLabel('Laptop', { exact: true }).check();
  await rental.getByLabel('Battery supporter').check();
  await rental.getByLabel('Condition', { exact: true }).selectOption('damaged');
  await rental.getByLabel('Condition notes').fill(REASON);
  await rental.getByRole('button', { name: 'Kit received back' }).first().click();
  await rental.getByRole('button', { name: 'Settle and close' }).first().click();
  await rental.getByLabel(/Capture from the deposit/).fill('80.00');
  await rental.getByLabel('Reason the customer sees').fill(REASON);
  await rental.getByRole('button', { name: 'Settle and close' }).first().click();
  await expect(rental.getByText('Closed', { exact: true })).toBeVisible();
  await page.screenshot({ path: '/tmp/rentals-closed-1366.png', fullPage: true });
});

test('the customer sees why part of the deposit was taken', async ({ page }) => {
  await useSession(page, 'customer@kestrel.test');
  // The main navigation folds into a menu on a phone; sign in wide, then look at the phone width.
  await page.setViewportSize(PHONE);
  await page.goto(`/jobs/${jobId}`);
  const lines = page.getByRole('article', { name: `Kit rental: ${KIT}` }).getByRole('table', { name: 'Money lines' });
  await expect(lines.getByText(new RegExp(REASON))).toBeVisible();
  await expect(lines.getByText('$80.00')).toBeVisible();
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-customer-390.png', fullPage: true });
});

test('the owner adds a photo to the kit, sees it at 1366 and 390 px, and deletes it', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.goto('/kits');
  await page.getByRole('row', { name: new RegExp(KIT) }).getByRole('link', { name: KIT }).click();
  await expect(page.getByRole('heading', { level: 1, name: KIT })).toBeVisible();
  await expect(page.getByText('No photos of this kit yet.')).toBeVisible();
  await page.getByLabel(/^Add a photo/).setInputFiles({ name: 'kit-case.png', mimeType: 'image/png', buffer: onePixelPng([37, 99, 235]) });
  const photo = page.getByRole('img', { name: 'Kit photo kit-case.png' });
  await expect(photo).toBeVisible();
  // The image the page shows is the one uploaded: the browser decoded it to one pixel.
  await expect.poll(() => photo.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(1);
  await page.screenshot({ path: '/tmp/rentals-kit-photo-1366.png', fullPage: true });
  await page.setViewportSize(PHONE);
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-kit-photo-390.png', fullPage: true });
  await page.getByRole('button', { name: 'Delete photo kit-case.png' }).click();
  await expect(photo).toHaveCount(0);
  await expect(page.getByText('No photos of this kit yet.')).toBeVisible();
});

test('the owner downloads the rental money lines as CSV from the Kits overview', async ({ page }) => {
  await page.setViewportSize(LAPTOP);
  await useSession(page, 'owner@kestrel.test');
  await page.goto('/kits/overview');
  await expect(page.getByRole('heading', { level: 1, name: 'Kits overview' })).toBeVisible();
  await page.screenshot({ path: '/tmp/rentals-overview-1366.png', fullPage: true });
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export money lines (CSV)' }).click()]);
  expect(download.suggestedFilename()).toMatch(/\.csv$/);
  const lines = fs.readFileSync((await download.path())!, 'utf8').trim().split('\r\n');
  expect(lines[0]).toBe('Day,Time (UTC),Job,Customer,Kit,Line,Description,Amount,Currency,Rental');
  // The deposit taken earlier in this story is among the lines, with the reason the customer saw.
  expect(lines.some((line) => line.includes(KIT) && line.includes(REASON) && line.includes('80.00'))).toBe(true);
  await page.setViewportSize(PHONE);
  expect(await overflowPx(page)).toBe(0);
  await page.screenshot({ path: '/tmp/rentals-overview-390.png', fullPage: true });
});
