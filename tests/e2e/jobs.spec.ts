import { expect, test } from '@playwright/test';
import { asPlatformAdmin, DEMO_PASSWORD, fillVehicle, mailTo, useSession } from './support';

test.describe.configure({ mode: 'serial' });

test('a customer opens a job for a new vehicle, with live VIN, tyre and fuel checks, and gets the e-mail', async ({ page, request }) => {
  await useSession(page, 'customer@kestrel.test');
  await expect(page.getByRole('heading', { name: 'My jobs' })).toBeVisible();
  await page.getByRole('link', { name: 'Open a job' }).click();
  await expect(page.getByRole('heading', { name: 'Open a job' })).toBeVisible();

  await page.getByRole('radio', { name: 'Another vehicle' }).check();
  // 1G4AH59H?5G118341: the check digit is 4 (49 CFR 565.15(c) Table V worked example, Table IV weights [STD], REFERENCES "VIN check digit"); 0 is wrong.
  await page.getByLabel('VIN').fill('1G4AH59H05G118341');
  await expect(page.getByText('Check digit is "0" but the other characters give "4"')).toBeVisible();
  // Position 10 "5" with a numeric position 7 → 2005 (49 CFR 565.15(d) [STD]); WMI "1" is North American, so the rule applies.
  await expect(page.getByLabel('Model year')).toHaveValue('2005');
  await page.getByLabel('Keep this VIN as entered').check();

  await fillVehicle(page, 'Grey-market sedan, 3.8 V6, 5-speed manual');
  // Tyre 245/40R20: D = 20·25.4 + 2·245·0.40 = 704.0 mm, C = π·D = 2211.7 mm from the ISO 4000-1 / ETRTO designation [CALC] (REFERENCES "metric tyre size").
  await expect(page.getByText('245/40R20: diameter 704.0 mm, circumference 2,211.7 mm.')).toBeVisible();
  // Ethanol 10 %, E10 blended by mass: 14.10 (REFERENCES "ethanol blend" [CALC]).
  await expect(page.getByText('Stoichiometric air-fuel ratio: 14.10 : 1')).toBeVisible();
  await page.getByLabel('Intercooler').check();

  await page.getByLabel('Package').selectOption({ label: 'Engine calibration (ECM) — $599.00, 4 rounds' });
  await page.getByLabel('Goals').fill('Smoother part throttle and a little more mid-range.');
  await page.getByLabel('New rev limit (rpm)').fill('6200');
  await page.getByLabel('I have read and accept these cautions.').check();
  await page.getByRole('button', { name: 'Open the job' }).click();

  await expect(page.getByRole('heading', { name: /^Job \d+$/ })).toBeVisible();
  const number = (await page.getByRole('heading', { name: /^Job \d+$/ }).textContent())!.replace('Job ', '');
  await expect(page.getByText('Read the calibration off your vehicle and upload it as the stock read.').first()).toBeVisible();
  await expect(page.getByText('6200 rpm')).toBeVisible();

  // The customer is told by e-mail, with the cautions in it.
  await expect.poll(async () => (await mailTo(request, 'customer@kestrel.test')).map((m) => m.subject)).toContainEqual(expect.stringContaining(`We received your job — Job ${number}`));
  const mail = (await mailTo(request, 'customer@kestrel.test')).find((m) => m.subject.includes(`Job ${number}`))!;
  expect(mail.text).toContain('battery supporter');

  // The development mailbox page shows it to the platform admin only: it holds every account's reset links.
  await page.goto('/dev/mailbox');
  await expect(page.getByText('This page is not part of your role')).toBeVisible();
  await expect(page.getByRole('link', { name: 'Development mailbox' })).toHaveCount(0);
  await asPlatformAdmin(page, async (admin) => {
    await admin.goto('/dev/mailbox');
    await expect(admin.getByRole('link', { name: 'Development mailbox' })).toBeVisible();
    await expect(admin.getByText(`We received your job — Job ${number}`).first()).toBeVisible();
  });
});

test('a tuner takes an unassigned ready job and starts work on it from the board', async ({ page }) => {
  await useSession(page, 'tuner@kestrel.test');
  await expect(page.getByRole('heading', { name: 'Jobs', exact: true })).toBeVisible();
  const ready = page.getByRole('region', { name: /^Ready/ });
  const card = ready.getByRole('article').filter({ has: page.getByRole('button', { name: /^Take job/ }) }).first();
  const title = (await card.getByRole('heading').textContent())!;
  const number = /#(\d+)/.exec(title)![1]!;

  await card.getByRole('button', { name: /^Take job/ }).focus();
  await page.keyboard.press('Enter');
  const taken = ready.getByRole('article').filter({ hasText: `#${number}` });
  await expect(taken.getByText('Marco Lindqvist')).toBeVisible();

  await taken.getByRole('button', { name: /^Start work: job/ }).click();
  const bench = page.getByRole('region', { name: /^On the bench/ });
  const moved = bench.getByRole('article').filter({ hasText: `#${number}` });
  await expect(moved).toBeVisible();
  await expect(moved.getByText(/Prepare revision 1/)).toBeVisible();

  await moved.getByRole('link').first().click();
  await expect(page.getByRole('heading', { name: `Job ${number}` })).toBeVisible();
  await expect(page.getByText('Moved from Ready to On the bench')).toBeVisible();
});

test('the dealer sees only its own customers and their jobs', async ({ page, playwright, baseURL }) => {
  const customer = await playwright.request.newContext({ baseURL });
  await customer.post('/api/auth/sign-in', { data: { email: 'customer@kestrel.test', password: DEMO_PASSWORD } });
  const { data } = (await (await customer.get('/api/jobs?pageSize=1')).json()) as { data: Array<{ id: string }> };
  const directJobId = data[0]!.id;
  await customer.dispose();

  await useSession(page, 'dealer@kestrel.test');
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Customers' }).click();
  const table = page.getByRole('table', { name: 'Customers' });
  await expect(table.getByText('Morgan Pryce')).toBeVisible();
  await expect(table.getByText('Taylor Reyes')).toBeVisible();
  await expect(table.getByText('Jordan Hale')).toHaveCount(0);

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' }).click();
  await expect(page.getByRole('heading', { name: /^In progress/ })).toBeVisible();
  const cards = page.getByRole('article');
  expect(await cards.count()).toBeGreaterThan(0);
  for (const text of await cards.allTextContents()) expect(text).toMatch(/Morgan Pryce|Taylor Reyes/);
  await expect(page.getByText('Jordan Hale')).toHaveCount(0);

  await page.goto(`/jobs/${directJobId}`);
  await expect(page.getByText('This job could not be opened')).toBeVisible();
});
