import { expect, test } from '@playwright/test';
import { LAPTOP, PHONE, mainPagesOf, openMainPage, seriousViolations } from './a11y';
import { signIn } from './support';

/**
 * Findings that sit in another engineer's component and are fixed on their branch; each names its owner.
 * Remove an entry when that branch is merged.
 */
const FIXED_ELSEWHERE: Array<{ page: string; rule: string; why: string }> = [
  { page: 'datalog report', rule: 'nested-interactive', why: 'the chart box (datalogs/log-chart.tsx) is rebuilt on the datalog chart branch' },
  { page: 'datalog report', rule: 'scrollable-region-focusable', why: 'the trim grid (datalogs/trim-heat-table.tsx) scroller, on the datalog branches' },
];

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
    await signIn(page, email);
    const found: string[] = [];
    for (const target of await mainPagesOf(page)) {
      await openMainPage(page, target);
      const known = FIXED_ELSEWHERE.filter((entry) => entry.page === target.name).map((entry) => entry.rule);
      found.push(...(await seriousViolations(page)).filter((line) => !known.some((rule) => line.startsWith(`${rule} `))).map((line) => `${target.name} (${target.url}): ${line}`));
    }
    expect(found).toEqual([]);
  });
}
