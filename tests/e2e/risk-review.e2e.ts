/**
 * Browser journey of the risk manager's review on the demo network: start an analysis run and
 * see it finish at 100 %, sort the ranking, open a supplier's risk page, override a likelihood
 * with a reason in the register, filter the ranking from a heat-map cell, and evaluate a
 * country scenario. Screenshots of each screen go to docs/screens/review-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openBrowser, screenshot, type BrowserSession } from './browser';
import { apiGet, signIn, startRunFromScreen } from './journey-steps';
import { startTestServer, type TestServer } from './server';

describe('the risk manager reviews the single points of failure', () => {
  let server: TestServer;
  let browser: BrowserSession;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await openBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('runs, ranks, opens a supplier, overrides, filters from the heat map, tries a scenario',
    async () => {
      const page = await browser.newPage();
      await signIn(page, server.url, 'risk@demo.test');
      const navigation = page.getByRole('navigation', { name: 'Main' });

      // 1. Start a run on the demo network; it finishes and its ranking opens.
      const runId = await startRunFromScreen(page, 'December review');
      const run = await apiGet<{ status: string; progress: number }>(
        page, `/api/analysis-runs/${runId}`);
      expect(run).toMatchObject({ status: 'succeeded', progress: 1 });
      const ranking = page.getByRole('table', { name: 'Ranking of suppliers' });
      await expect.poll(() => ranking.getByRole('row').count(), { timeout: 30_000 })
        .toBeGreaterThan(10);
      await screenshot(page, 'review-1-ranking');

      // 2. Sort by revenue impact, largest first: the first rows come in that order.
      const header = ranking.getByRole('columnheader', { name: 'Revenue impact' });
      await header.click();
      if ((await header.getAttribute('aria-sort')) !== 'descending') await header.click();
      await expect.poll(() => header.getAttribute('aria-sort')).toBe('descending');
      await expect.poll(() => page.url()).toContain('sort=revenueImpact');

      // 3. The hidden tier-2 supplier's risk page: why it matters, paths, measures, history.
      await page.getByLabel('Search code or name').fill('S-2-SHARED-A');
      await expect.poll(() => ranking.getByRole('row').count(), { timeout: 15_000 }).toBe(2);
      await ranking.getByRole('link', { name: 'S-2-SHARED-A' }).click();
      await page.waitForURL(/\/risk\/\d+\/suppliers\/S-2-SHARED-A/);
      await page.getByRole('heading', { name: 'How a failure travels to the products' })
        .waitFor();
      await screenshot(page, 'review-2-supplier-risk');

      // 4. Its register entry: override the likelihood with a reason; the history keeps it.
      await page.getByRole('link', { name: /Open its register entry/ }).click();
      await page.waitForURL(/\/register\/\d+/);
      await page.getByRole('button', { name: 'Override likelihood' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('New likelihood').click();
      await page.getByRole('option').filter({ hasText: /^\s*5/ }).first().click();
      const reason = 'Sole caster of the housing blanks; the plant is flooded every spring.';
      await dialog.getByLabel('Reason').fill(reason);
      await dialog.getByRole('button', { name: 'Save override' }).click();
      const overrides = page.getByRole('table', { name: 'Likelihood overrides' });
      await expect.poll(() => overrides.textContent(), { timeout: 15_000 }).toContain(reason);
      await screenshot(page, 'review-3-register-override');

      // 5. The heat map: a cell filters the ranking to its suppliers.
      await page.goto(`${server.url}/runs/${runId}`);
      await page.getByRole('tab', { name: 'Heat map' }).click();
      const cells = page.getByRole('group', { name: 'Suppliers by likelihood and impact band' })
        .getByRole('button', { name: /: [1-9]\d* suppliers?,/ });
      await cells.first().waitFor();
      // Let the tab's slide-in animation finish, for the screenshot only.
      await page.waitForTimeout(800);
      await screenshot(page, 'review-4-heat-map');
      const label = (await cells.first().getAttribute('aria-label'))!;
      const [, likelihood, band, count] =
        /Likelihood (\d), impact band (\d): (\d+)/.exec(label)!.map(Number);
      await cells.first().click();
      await expect.poll(() => page.url()).toContain(`likelihood=${likelihood}`);
      expect(page.url()).toContain(`impactBand=${band}`);
      await expect.poll(() => page.getByRole('table', { name: 'Ranking of suppliers' })
        .getByRole('row').count(), { timeout: 15_000 }).toBe(Math.min(count!, 25) + 1);

      // The Pareto chart of revenue impact by supplier.
      await page.getByRole('tab', { name: 'Pareto' }).click();
      await page.locator('canvas').first().waitFor();
      await page.waitForTimeout(1200);
      await screenshot(page, 'review-4b-pareto');

      // 6. A country scenario: every supplier in CZ fails at once.
      await navigation.getByRole('link', { name: 'Scenarios' }).click();
      await page.getByLabel('Countries').click();
      await page.getByRole('option', { name: /^CZ/ }).click();
      await page.keyboard.press('Escape');
      await page.getByRole('button', { name: 'Evaluate' }).click();
      const result = page.locator('section.scenarios__result');
      await expect.poll(() => result.textContent(), { timeout: 30_000 }).toMatch(/lost/i);
      await screenshot(page, 'review-5-scenario');

      // 7. The network picture, laid out in tiers, with this run's single points marked.
      await navigation.getByRole('link', { name: 'Network picture' }).click();
      const picture = page.getByRole('img', { name: /Network picture/ });
      await picture.waitFor({ timeout: 30_000 });
      await expect.poll(() => picture.locator('canvas').count(), { timeout: 30_000 })
        .toBeGreaterThan(0);
      await page.waitForTimeout(2500);
      await screenshot(page, 'review-6-network-picture');

      // 8. The register as printed for the review meeting.
      await page.goto(`${server.url}/register/print`);
      const printed = page.getByRole('table', { name: 'Register entries for print' });
      await expect.poll(() => printed.getByRole('row').count(), { timeout: 15_000 })
        .toBeGreaterThan(10);
      await page.emulateMedia({ media: 'print' });
      await screenshot(page, 'review-7-register-print');
      await page.close();
    });
});
