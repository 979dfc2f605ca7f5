/**
 * The mitigation-plan steps of the browser journeys: drafting the demo's second-source plan for
 * S-2-SHARED-A from its register entry, running the what-if, submitting, and a plant manager's
 * approval from Approvals.
 */
import type { Locator, Page } from 'playwright-core';
import { expect } from 'vitest';
import { fullPageShot } from './journey-steps';

/**
 * The second source the what-if spec chose for S-2-SHARED-A (apps/api/src/plans/what-if.spec.ts):
 * S-2-011, a tier-2 supplier that buys nothing and is not upstream of S-2-SHARED-A, becomes a
 * qualified source of material M-01 for every buyer S-2-SHARED-A supplies it to today.
 */
export const SECOND_SOURCE = { itemCode: 'M-01', supplierCode: 'S-2-011' };
/** The plan's one task, for the buyer. */
export const TASK_TITLE = 'Audit S-2-011 and release its first M-01 order';

/** A date `days` from today as the date picker reads typed dates (M/D/YYYY, en-US). */
export function typedDate(days: number): string {
  const date = new Date(Date.now() + days * 86_400_000);
  return `${date.getMonth() + 1}/${date.getDate()}/${date.getFullYear()}`;
}

/** Picks `option` in the mat-select labelled `label` inside `scope`. */
export async function choose(page: Page, scope: Locator, label: string,
  option: string): Promise<void> {
  await scope.getByLabel(label).click();
  await page.getByRole('option', { name: option, exact: true }).click();
}

/**
 * From register entry `entryId` (S-2-SHARED-A's), drafts the second-source plan with one change
 * and one task for the buyer, saves it and returns the plan's id. `shot` names a screenshot of
 * the filled editor.
 */
export async function draftSecondSourcePlan(page: Page, url: string, entryId: number,
  shot?: string): Promise<number> {
  await page.goto(`${url}/register/${entryId}`);
  await page.getByRole('heading', { name: 'Mitigation plans' }).waitFor();
  await page.getByRole('link', { name: 'Draft a plan' }).click();
  await page.waitForURL(/\/plans\/new\?entry=\d+/);
  const form = page.locator('form.editor__form');
  await form.getByLabel('Description').waitFor();
  await choose(page, form, 'Strategy', 'Second source');
  await form.getByLabel('Description').fill(
    'Qualify S-2-011 as a second source of M-01 for every tier-1 buyer of S-2-SHARED-A, '
    + 'so a stop at the foundry no longer stops the products.');
  await form.getByLabel('Estimated cost').fill('38000');
  await form.getByLabel('Target date').fill(typedDate(90));
  await page.getByRole('button', { name: 'Add a change' }).click();
  await page.getByRole('menuitem', { name: 'Add a qualified source' }).click();
  const change = page.getByRole('listitem', { name: 'Change 1' });
  // S-2-SHARED-A sells one item only, so the editor fills it in.
  await expect.poll(() => change.getByLabel('Item', { exact: true }).inputValue())
    .toBe(SECOND_SOURCE.itemCode);
  await change.getByLabel('New source (supplier)').fill(SECOND_SOURCE.supplierCode);
  await expect.poll(() => change.getByLabel('Every buyer it supplies today').isChecked())
    .toBe(true);
  await page.getByRole('button', { name: 'Add a task' }).click();
  const task = page.getByRole('listitem', { name: 'Task 1' });
  await task.getByLabel('Task', { exact: true }).fill(TASK_TITLE);
  await choose(page, task, 'Owner', 'Bruno Keller');
  await task.getByLabel('Due date').fill(typedDate(30));
  if (shot) await fullPageShot(page, shot);
  await page.getByRole('button', { name: 'Save draft' }).click();
  await page.waitForURL(/\/plans\/\d+$/, { timeout: 15_000 });
  return Number(/\/plans\/(\d+)$/.exec(page.url())![1]);
}

/**
 * On the plan's page: runs the what-if and checks that S-2-SHARED-A is no longer a single point
 * of failure after the plan. `shot` names a screenshot of the result.
 */
export async function runWhatIf(page: Page, shot?: string): Promise<void> {
  await page.getByRole('button', { name: 'Run what-if' }).click();
  const whatIf = page.getByRole('table', { name: 'What-if: before and after the plan' });
  await whatIf.waitFor({ timeout: 30_000 });
  const spof = whatIf.getByRole('row', { name: /Single point of failure/ });
  await expect.poll(() => spof.getByRole('cell').allTextContents())
    .toEqual(['Yes', 'No longer'].map((text) => expect.stringContaining(text)));
  await expect.poll(() => page.locator('.what-if__note').textContent())
    .toMatch(/numbers the plan is approved on: computed on network version \d+/);
  if (shot) await fullPageShot(page, shot);
}

/** On the plan's page: submits it and waits until it waits for approval. */
export async function submitPlan(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Submit for approval' }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Submit' }).click();
  await expect.poll(() => page.locator('kl-plan-status-chip').first().textContent(),
    { timeout: 15_000 }).toContain('Waiting for approval');
}

/** A plant manager approves plan `planId` for their plant from Approvals. */
export async function approve(page: Page, planId: number, plant: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Approvals' })
    .click();
  const card = page.getByRole('listitem', { name: `Plan ${planId} for S-2-SHARED-A` });
  await card.waitFor({ timeout: 15_000 });
  await card.getByRole('button', { name: `Approve for ${plant}` }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('Comment (optional)').fill(`${plant} agrees: dual sourcing of M-01.`);
  await dialog.getByRole('button', { name: 'Approve' }).click();
  await dialog.waitFor({ state: 'detached' });
  await page.getByText('Nothing waits for your decision.').waitFor({ timeout: 15_000 });
}
