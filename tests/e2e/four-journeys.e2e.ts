/**
 * The four journeys of Keelson in one run, on one server with the demo workspace: the risk
 * manager re-scores the quarter on the demo network; the buyer imports next quarter's workbook
 * (data/demo/keelson-demo-q2.xlsx) through the import screens; the risk manager drafts a
 * second-source plan for the hidden single point of failure S-2-SHARED-A, runs its what-if and
 * submits it; the plant managers of P-NORTH and P-SOUTH approve it; and the next quarter's
 * re-scoring shows exactly what the new workbook changed (tools/demo-network-q2.ts,
 * `Q2_CHANGES`): S-1-096 is a new single point of failure, S-2-SHARED-B is one no longer,
 * S-1-096 was added and S-2-003 removed. Screenshots go to docs/screens/quarter-*.png.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openBrowser, type BrowserSession } from './browser';
import { apiGet, fullPageShot, signIn } from './journey-steps';
import { approve, draftSecondSourcePlan, runWhatIf, submitPlan } from './plan-steps';
import { startTestServer, type TestServer } from './server';

const Q2_WORKBOOK = join(import.meta.dirname, '..', '..', 'data', 'demo', 'keelson-demo-q2.xlsx');

/** Starts a re-scoring of `quarter` on the latest version from its screen; waits for it. */
async function rescore(page: Page, url: string, quarter: string): Promise<void> {
  await page.goto(`${url}/rescoring`);
  await page.getByRole('button', { name: 'Start re-scoring' }).click();
  const dialog = page.getByRole('dialog');
  const quarterField = dialog.getByLabel('Quarter');
  // Type only once the form has written its default (this quarter) into the field, and type
  // again while the field does not hold the quarter: on a slow machine the dialog's first
  // rendering has been seen to replace what was typed.
  await expect.poll(() => quarterField.inputValue()).toMatch(/^\d{4}-Q[1-4]$/);
  await expect.poll(async () => {
    if ((await quarterField.inputValue()) !== quarter) await quarterField.fill(quarter);
    return quarterField.inputValue();
  }, { timeout: 15_000 }).toBe(quarter);
  await dialog.getByRole('button', { name: 'Start' }).click();
  // The dialog closes once the re-scoring is queued; a refusal stays in it as an alert.
  const refusal = dialog.getByRole('alert');
  // Each wait settles to a word (never rejects), so the one that loses the race is harmless.
  const outcome = await Promise.race([
    dialog.waitFor({ state: 'detached', timeout: 30_000 }).then(() => 'closed', () => 'slow'),
    refusal.waitFor({ timeout: 30_000 }).then(() => 'refused', () => 'slow'),
  ]);
  if (outcome !== 'closed') {
    const said = outcome === 'refused' ? await refusal.textContent() : await dialog.textContent();
    throw new Error(`Start re-scoring of ${quarter} did not start (${outcome}): ${said}`);
  }
  const row = page.getByRole('table', { name: 'Re-scorings' }).getByRole('row')
    .filter({ hasText: quarter });
  await expect.poll(() => row.textContent(), { timeout: 90_000 }).toContain('Finished');
}

/** The supplier codes a section of the comparison lists, sorted. */
async function codesOf(page: Page, section: RegExp): Promise<string[]> {
  const codes = await page.getByRole('table', { name: section }).locator('.section__code')
    .allTextContents();
  return codes.map((code) => code.trim()).sort();
}

describe('the four journeys of a quarter', () => {
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

  it('re-scores, imports the next quarter, plans, approves and shows what changed', async () => {
    const page = await browser.newPage();

    // 1. The risk manager re-scores this quarter on the demo network as it stands.
    await signIn(page, server.url, 'risk@demo.test');
    await rescore(page, server.url, '2026-Q4');

    // 2. The buyer imports next quarter's workbook: checked, then committed as version 2.
    await signIn(page, server.url, 'buyer@demo.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Import' })
      .click();
    await page.locator('input[type="file"]').setInputFiles(Q2_WORKBOOK);
    const proceed = page.getByRole('button', { name: 'Continue to commit' });
    await proceed.waitFor({ timeout: 60_000 });
    await proceed.click();
    await page.getByRole('button', { name: 'Commit as a new network version' }).click();
    await page.getByRole('heading', { name: /Network version 2 is saved/ })
      .waitFor({ timeout: 60_000 });
    await fullPageShot(page, 'quarter-0-import');

    // 3. The risk manager drafts a second source for S-2-SHARED-A, runs the what-if, submits.
    await signIn(page, server.url, 'risk@demo.test');
    const register = await apiGet<{ items: { id: number; supplierCode: string }[] }>(
      page, '/api/register?q=S-2-SHARED-A');
    const entry = register.items.find((item) => item.supplierCode === 'S-2-SHARED-A');
    expect(entry).toBeDefined();
    const planId = await draftSecondSourcePlan(page, server.url, entry!.id);
    await runWhatIf(page);
    await submitPlan(page);

    // 4. Both plant managers the risk touches approve it.
    await signIn(page, server.url, 'plant.north@demo.test');
    await approve(page, planId, 'P-NORTH');
    await signIn(page, server.url, 'plant.south@demo.test');
    await approve(page, planId, 'P-SOUTH');
    const plan = await apiGet<{ status: string }>(page, `/api/plans/${planId}`);
    expect(['approved', 'in_progress']).toContain(plan.status);

    // 5. Next quarter's re-scoring on version 2, and the comparison of the two quarters.
    await signIn(page, server.url, 'risk@demo.test');
    await rescore(page, server.url, '2027-Q1');
    await fullPageShot(page, 'quarter-1-rescoring');
    await page.getByRole('table', { name: 'Re-scorings' }).getByRole('row')
      .filter({ hasText: '2027-Q1' }).getByRole('link', { name: /Compare/ }).click();
    await page.waitForURL(/\/rescoring\/compare/);
    await page.getByRole('table', { name: /New single points of failure/ })
      .waitFor({ timeout: 30_000 });
    expect(await codesOf(page, /New single points of failure/)).toEqual(['S-1-096']);
    expect(await codesOf(page, /Single points of failure that went away/))
      .toEqual(['S-2-SHARED-B']);
    expect(await codesOf(page, /Suppliers added/)).toEqual(['S-1-096']);
    expect(await codesOf(page, /Suppliers removed/)).toEqual(['S-2-003']);
    // Each row links to the supplier's risk page in the run that has it.
    await expect.poll(() => page.getByRole('table', { name: /New single points of failure/ })
      .getByRole('link').first().getAttribute('href'))
      .toMatch(/^\/risk\/\d+\/suppliers\/S-1-096$/);
    await fullPageShot(page, 'quarter-2-compare');

    // 6. The risk manager's home page shows the quarter's figures.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' })
      .click();
    await page.getByText('Last quarterly re-scoring').waitFor({ timeout: 15_000 });
    await expect.poll(() => page.getByText('2027-Q1').count()).toBeGreaterThan(0);
    await fullPageShot(page, 'quarter-3-home');
    await page.close();
  });
});
