import AxeBuilder from '@axe-core/playwright';
import { expect, type Page } from '@playwright/test';

/** The widths every page must fit: a phone (390 × 844) and a small laptop (1366 × 900). */
export const PHONE = { width: 390, height: 844 } as const;
export const LAPTOP = { width: 1366, height: 900 } as const;

export interface MainPage {
  name: string;
  url: string;
}

interface Row {
  id: string;
  state?: string;
  status?: string;
}

async function listOf(page: Page, url: string): Promise<Row[]> {
  const response = await page.request.get(url);
  expect(response.ok(), `${url} answers ${response.status()}`).toBe(true);
  return ((await response.json()) as { data: Row[] }).data;
}

/**
 * The main pages of the signed-in user's role: every link of the main navigation, the settings pages, and the
 * detail pages found through the API so they follow the demo data (a job with two calibration files for the diff,
 * a ready log for its report, a vehicle, a dealer and its statement).
 */
export async function mainPagesOf(page: Page): Promise<MainPage[]> {
  await page.goto('/');
  const nav = page.getByRole('navigation', { name: 'Main' });
  await expect(nav).toBeVisible();
  const pages: MainPage[] = [];
  for (const link of await nav.getByRole('link').all()) pages.push({ name: (await link.textContent())!.trim().toLowerCase(), url: (await link.getAttribute('href'))! });
  const has = (url: string) => pages.some((target) => target.url === url);
  pages.push({ name: 'profile', url: '/settings/profile' }, { name: 'notifications', url: '/settings/notifications' });
  if (has('/settings/shop')) pages.push({ name: 'packages', url: '/settings/packages' });
  if (!has('/jobs')) return pages;

  pages.push({ name: 'jobs table', url: '/jobs?view=table' }, { name: 'intake', url: '/jobs/new' });
  // Finished jobs first: the flows project changes open jobs on the other worker meanwhile (a tuner's open job can be
  // taken or reassigned between this list and the page), while a dialed-in job stays where it is.
  const listed = await listOf(page, '/api/jobs?view=table&pageSize=100');
  const jobs = [...listed.filter((job) => job.state === 'dialed_in'), ...listed.filter((job) => job.state !== 'dialed_in')];
  let withDiff: { job: string; a: string; b: string } | undefined;
  let report: string | undefined;
  for (const job of jobs) {
    if (withDiff && report) break;
    const files = await listOf(page, `/api/jobs/${job.id}/files`);
    if (!withDiff && files.length >= 2) withDiff = { job: job.id, a: files[0]!.id, b: files[1]!.id };
    if (!report) report = (await listOf(page, `/api/jobs/${job.id}/datalogs`)).find((log) => log.status === 'ready')?.id;
  }
  const job = withDiff?.job ?? jobs[0]?.id;
  if (job) pages.push({ name: 'job', url: `/jobs/${job}` });
  if (withDiff) pages.push({ name: 'file diff', url: `/jobs/${withDiff.job}/files/diff?a=${withDiff.a}&b=${withDiff.b}` });
  if (report) pages.push({ name: 'datalog report', url: `/datalogs/${report}` });
  if (has('/vehicles')) {
    const vehicle = (await listOf(page, '/api/vehicles'))[0];
    if (vehicle) pages.push({ name: 'vehicle', url: `/vehicles/${vehicle.id}` });
  }
  if (has('/dealers')) {
    const dealer = (await listOf(page, '/api/dealers'))[0];
    if (dealer) pages.push({ name: 'dealer', url: `/dealers/${dealer.id}` }, { name: 'dealer statement', url: `/billing/statement/${dealer.id}` });
  }
  return pages;
}

/** Opens a main page and waits until its heading is there and nothing is loading any more. */
export async function openMainPage(page: Page, target: MainPage): Promise<void> {
  await page.goto(target.url);
  await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible();
  await expect(page.getByRole('status').filter({ hasText: /Loading/ })).toHaveCount(0, { timeout: 45_000 });
  await page.waitForLoadState('networkidle');
}

/** Axe's critical and serious findings on the page, one line each, so a failure names rule, element and page. */
export async function seriousViolations(page: Page): Promise<string[]> {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice']).analyze();
  return results.violations
    .filter((violation) => violation.impact === 'critical' || violation.impact === 'serious')
    .flatMap((violation) => violation.nodes.map((node) => `${violation.id} (${violation.impact}): ${node.target.join(' ')} — ${violation.help}`));
}

/** How many pixels the page is wider than its viewport (0 when it fits); wide content must scroll in its own box. */
export async function overflowPx(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
}
