import { expect, test } from '@playwright/test';
import { LAPTOP, PHONE, mainPagesOf, openMainPage, overflowPx } from './a11y';
import { useSession } from './support';

const ROLES = ['owner@kestrel.test', 'tuner@kestrel.test', 'dealer@kestrel.test', 'customer@kestrel.test', 'admin@revloop.test'];

for (const email of ROLES) {
  test(`no page of ${email} is wider than a 390 px phone or a 1366 px laptop`, async ({ page }) => {
    test.setTimeout(600_000);
    await page.setViewportSize(LAPTOP);
    await useSession(page, email);
    const pages = await mainPagesOf(page);
    const wide: string[] = [];
    for (const size of [PHONE, LAPTOP]) {
      await page.setViewportSize(size);
      for (const target of pages) {
        await openMainPage(page, target);
        const over = await overflowPx(page);
        if (over > 0) wide.push(`${target.name} at ${size.width} px is ${over} px too wide`);
      }
    }
    expect(wide).toEqual([]);
  });
}

test.describe('the jobs board on a 1366 px laptop', () => {
  test.use({ viewport: LAPTOP });

  test('shows every open state side by side, and the table clips no column', async ({ page }) => {
    await useSession(page, 'owner@kestrel.test');
    await page.goto('/jobs?view=board');
    for (const state of ['Intake', 'Ready', 'On the bench', 'With customer', 'Log review', 'On hold']) {
      const column = page.getByRole('region', { name: new RegExp(`^${state}`) });
      await expect(column).toBeVisible();
      const box = (await column.boundingBox())!;
      expect(box.x + box.width, `${state} ends inside the window`).toBeLessThanOrEqual(LAPTOP.width);
    }
    await page.goto('/jobs?view=table');
    const table = page.getByRole('region', { name: /^Jobs, sorted by/ });
    await expect(table.getByRole('row').nth(1)).toBeVisible();
    expect(await table.evaluate((region) => region.scrollWidth - region.clientWidth)).toBeLessThanOrEqual(0);
  });

  test('a keyboard reaches any column in a few keys: Tab to the state bar, arrows, Enter', async ({ page }) => {
    await useSession(page, 'tuner@kestrel.test');
    await page.goto('/jobs?view=board');
    const bar = page.getByRole('toolbar', { name: 'Jump to a column' });
    await expect(bar).toBeVisible();
    let tabs = 0;
    while (!(await bar.evaluate((element) => element.contains(document.activeElement))) && tabs < 30) {
      await page.keyboard.press('Tab');
      tabs += 1;
    }
    // From the page's start: the header and menu, the filters and view switch, then the bar.
    expect(tabs).toBeLessThanOrEqual(20);
    for (let i = 0; i < 4; i++) await page.keyboard.press('ArrowRight');
    await expect(bar.getByRole('button', { name: /^Log review/ })).toBeFocused();
    await page.keyboard.press('Enter');
    const column = page.getByRole('region', { name: /^Log review/ });
    await expect(column).toBeFocused();
    await page.keyboard.press('Tab');
    expect(await column.evaluate((element) => element.contains(document.activeElement))).toBe(true);
    console.log(`Keys from page load to a Log review card: ${tabs} Tab + 4 arrows + Enter + 1 Tab`);
  });

  test('each state has its own colour and icon, the same on board and table', async ({ page }) => {
    await useSession(page, 'owner@kestrel.test');
    await page.goto('/jobs?view=table&pageSize=100');
    const badges = page.locator('[data-state]');
    await expect(badges.first()).toBeVisible();
    const looks = await badges.evaluateAll((elements) => elements.map((e) => ({ state: e.getAttribute('data-state'), color: getComputedStyle(e).color, icon: e.querySelector('svg path')?.getAttribute('d') })));
    const byState = new Map(looks.map((look) => [look.state, look]));
    const colours = new Set([...byState.values()].map((look) => look.color));
    const icons = new Set([...byState.values()].map((look) => look.icon));
    expect(byState.size).toBeGreaterThanOrEqual(6);
    expect(colours.size).toBe(byState.size);
    expect(icons.size).toBe(byState.size);
  });
});
