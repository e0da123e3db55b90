import { expect, test } from '@playwright/test';
import { LAPTOP, PHONE, mainPagesOf, openMainPage, seriousViolations } from './a11y';
import { useSession } from './support';

const ROLES = ['owner@kestrel.test', 'tuner@kestrel.test', 'dealer@kestrel.test', 'customer@kestrel.test', 'admin@revloop.test'];

test.use({ viewport: LAPTOP });

test('the sign-in page has no critical or serious axe findings, on a laptop and a phone', async ({ page }) => {
  for (const size of [LAPTOP, PHONE]) {
    await page.setViewportSize(size);
    await page.goto('/sign-in');
    await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();
    expect(await seriousViolations(page)).toEqual([]);
  }
});

for (const email of ROLES) {
  test(`every main page of ${email} has no critical or serious axe findings`, async ({ page }) => {
    // About fifteen pages, each loaded and scanned by axe: minutes on a busy two-core machine.
    test.setTimeout(900_000);
    await useSession(page, email);
    const found: string[] = [];
    for (const target of await mainPagesOf(page)) {
      await openMainPage(page, target);
      found.push(...(await seriousViolations(page)).map((line) => `${target.name} (${target.url}): ${line}`));
    }
    expect(found).toEqual([]);
  });
}
