/**
 * Browser journey of a mitigation plan on the demo network: the risk manager runs an analysis
 * (so the register holds the automatic entry of the hidden single point of failure
 * S-2-SHARED-A), drafts a second-source plan from the entry with a task for the buyer, runs the
 * what-if (S-2-SHARED-A stops being a single point of failure) and submits it; the plant
 * managers of P-NORTH and P-SOUTH find it in Approvals with the numbers and approve; the
 * administrator sees the e-mails in Sent mail and the steps in the audit trail; the buyer finds
 * the task in My tasks. Screenshots go to docs/screens/plan-*.png.
 */
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openBrowser, type BrowserSession } from './browser';
import { apiGet, fullPageShot, signIn, startRunFromScreen } from './journey-steps';
import {
  TASK_TITLE,
  approve,
  draftSecondSourcePlan,
  runWhatIf,
  submitPlan,
} from './plan-steps';
import { startTestServer, type TestServer } from './server';

const REFUSED_SUBJECT = 'Weekly digest: 1 overdue task';

/** Writes a given-up e-mail into the server's outbox, as six refused tries would leave it. */
function giveUpOnAnEmail(databasePath: string): void {
  const sqlite = new Database(databasePath);
  try {
    sqlite.prepare(`insert into mail_outbox (kind, to_addresses, subject, text, html, status,
      attempts, next_attempt_at, last_error, created_at) values ('digest', ?, ?, ?, ?, 'failed',
      6, ?, '421 service not available', ?)`).run(JSON.stringify(['risk@demo.test']),
      REFUSED_SUBJECT, 'One task is overdue.', '<p>One task is overdue.</p>',
      new Date().toISOString(), new Date(Date.now() - 86_400_000).toISOString());
  } finally {
    sqlite.close();
  }
}

describe('a mitigation plan from draft to approval', () => {
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

  it('drafts, runs the what-if, submits, is approved by both plants, mails and audits',
    async () => {
      const page = await browser.newPage();
      await signIn(page, server.url, 'risk@demo.test');

      // 1. A run on the demo network puts S-2-SHARED-A in the register automatically.
      await startRunFromScreen(page, 'Plan review');
      const register = await apiGet<{ items: { id: number; supplierCode: string }[] }>(
        page, '/api/register?q=S-2-SHARED-A');
      const entry = register.items.find((item) => item.supplierCode === 'S-2-SHARED-A');
      expect(entry).toBeDefined();

      // 2. From the entry, draft a second-source plan with one change and one task.
      const planId = await draftSecondSourcePlan(page, server.url, entry!.id, 'plan-1-editor');

      // 3. The what-if: after the change, S-2-SHARED-A is no longer a single point of failure.
      await runWhatIf(page, 'plan-2-what-if');

      // 4. Submit: both plants the risk touches must decide.
      await submitPlan(page);
      await expect.poll(() => page.getByText(/Waiting for: /).textContent())
        .toContain('P-NORTH, P-SOUTH');

      // 5. P-NORTH's manager finds it in Approvals with the numbers, and approves.
      await signIn(page, server.url, 'plant.north@demo.test');
      await page.getByRole('navigation', { name: 'Main' })
        .getByRole('link', { name: 'Approvals' }).click();
      const card = page.getByRole('listitem', { name: `Plan ${planId} for S-2-SHARED-A` });
      await card.waitFor({ timeout: 15_000 });
      const cardSpof = card.getByRole('row', { name: /Single point of failure/ });
      await expect.poll(() => cardSpof.textContent()).toMatch(/Yes.*No longer/);
      await expect.poll(() => card.getByRole('link', { name: /risk page/ }).getAttribute('href'))
        .toMatch(/^\/risk\/\d+\/suppliers\/S-2-SHARED-A$/);
      expect(await card.getByRole('button', { name: 'Approve for P-SOUTH' }).count()).toBe(0);
      await fullPageShot(page, 'plan-3-approvals');
      await approve(page, planId, 'P-NORTH');

      // 6. P-SOUTH's manager approves too: the plan is approved and its task starts.
      await signIn(page, server.url, 'plant.south@demo.test');
      await approve(page, planId, 'P-SOUTH');
      await page.goto(`${server.url}/plans/${planId}`);
      await expect.poll(() => page.locator('kl-plan-status-chip').first().textContent(),
        { timeout: 15_000 }).toMatch(/Approved|In progress/);
      const decisions = page.getByRole('table', { name: 'Decisions' });
      await expect.poll(() => decisions.getByRole('row').count()).toBe(3);
      await page.getByRole('heading', { name: 'History' }).waitFor();
      await fullPageShot(page, 'plan-4-approved');

      // 7. The administrator sees the submission and decision e-mails in the sink.
      await signIn(page, server.url, 'admin@demo.test');
      await page.goto(`${server.url}/admin/mail`);
      const mail = page.getByRole('table', { name: 'Sent messages' });
      await expect.poll(() => mail.textContent(), { timeout: 15_000 })
        .toContain('Plan waiting for your approval');
      const subjects = (await mail.textContent()) ?? '';
      expect(subjects).toContain('Plan approved for P-NORTH');
      expect(subjects).toContain('Plan approved for P-SOUTH');
      expect(subjects).toContain(`Task assigned to you: ${TASK_TITLE}`);
      await page.getByText('Every notification e-mail has been taken by the mail server.')
        .waitFor();
      await fullPageShot(page, 'plan-5-mail');

      // 7b. An e-mail the mail server refused until the outbox gave up (written here, as an
      // SMTP outage would leave it) is listed with its error and goes out on "Send them now".
      // The administrator's home page says so first, and leads to Sent mail.
      giveUpOnAnEmail(server.databasePath);
      await page.goto(`${server.url}/`);
      await page.getByText('E-mail not sent yet').waitFor({ timeout: 15_000 });
      await fullPageShot(page, 'home-mail-not-sent');
      await page.getByRole('link', { name: 'See them and send them now' }).click();
      await page.waitForURL(/\/admin\/mail$/);
      const unsent = page.getByRole('table', { name: 'E-mails not sent yet' });
      await expect.poll(() => unsent.textContent(), { timeout: 15_000 })
        .toContain('Given up after 6 tries');
      expect(await unsent.textContent()).toContain('421 service not available');
      await fullPageShot(page, 'mail-outbox');
      await page.getByRole('button', { name: 'Send them now' }).click();
      await expect.poll(() => mail.textContent(), { timeout: 15_000 })
        .toContain(REFUSED_SUBJECT);
      await page.getByText('Every notification e-mail has been taken by the mail server.')
        .waitFor();

      // 8. The buyer finds the task in My tasks.
      await signIn(page, server.url, 'buyer@demo.test');
      await page.getByRole('navigation', { name: 'Main' })
        .getByRole('link', { name: 'My tasks' }).click();
      const tasks = page.getByRole('table', { name: 'My tasks' });
      await expect.poll(() => tasks.textContent(), { timeout: 15_000 }).toContain(TASK_TITLE);
      await expect.poll(() => tasks.getByRole('button', { name: `Mark done: ${TASK_TITLE}` })
        .count()).toBe(1);
      await fullPageShot(page, 'plan-6-my-tasks');

      // 9. The administrator follows up everyone's tasks: the buyer's task, with its owner.
      await signIn(page, server.url, 'admin@demo.test');
      await page.getByRole('navigation', { name: 'Main' })
        .getByRole('link', { name: 'My tasks' }).click();
      await page.getByRole('radio', { name: 'Everyone\'s' }).click();
      await page.waitForURL(/\/tasks\?whose=everyone$/);
      const everyone = page.getByRole('table', { name: 'Everyone\'s tasks' });
      const taskRow = everyone.getByRole('row').filter({ hasText: TASK_TITLE });
      await expect.poll(() => taskRow.textContent(), { timeout: 15_000 }).toContain('Bruno Keller');
      await fullPageShot(page, 'plan-8-everyones-tasks');

      // 10. The audit trail shows the submission and both approvals.
      await page.goto(`${server.url}/admin/audit`);
      await page.getByLabel('Action').fill('plan.');
      await page.getByRole('button', { name: 'Apply' }).click();
      const audit = page.getByRole('table', { name: 'Audit events' });
      const actions = () => audit.locator('td code').allTextContents();
      await expect.poll(async () => (await actions()).filter((a) => a === 'plan.approved').length,
        { timeout: 15_000 }).toBe(2);
      expect(await actions()).toContain('plan.submitted');
      expect(await actions()).toContain('plan.created');
      await fullPageShot(page, 'plan-7-audit');
      await page.close();
    });
});
