/**
 * Browser journey: every demo account signs in through the sign-in page and sees its own
 * navigation. Screenshots of each home page go to docs/screens/.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { openBrowser, screenshot, type BrowserSession } from './browser';
import { startTestServer, type TestServer } from './server';

const ACCOUNTS = [
  { email: 'admin@demo.test', role: 'admin',
    sees: ['Home', 'Import', 'Network', 'Risk register', 'Users', 'Countries', 'Scoring'],
    hidden: [] },
  { email: 'buyer@demo.test', role: 'buyer', sees: ['Home', 'Import', 'Network'],
    hidden: ['Users', 'Sent mail', 'Countries'] },
  { email: 'risk@demo.test', role: 'risk_manager', sees: ['Home', 'Network'],
    hidden: ['Import', 'Users', 'Sent mail'] },
  { email: 'plant.north@demo.test', role: 'plant_manager', sees: ['Home', 'Network'],
    hidden: ['Import', 'Users', 'Sent mail'] },
  { email: 'viewer@demo.test', role: 'viewer', sees: ['Home', 'Network'],
    hidden: ['Import', 'Users', 'Sent mail'] },
] as const;

describe('signing in as each demo account', () => {
  let server: TestServer;
  let browser: BrowserSession;

  beforeAll(async () => {
    server = await startTestServer();
    browser = await openBrowser();
  });
  // One browser profile serves every test: start each one signed out.
  beforeEach(async () => {
    await browser.context.clearCookies();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('refuses a wrong password with a message that does not say which field was wrong', async () => {
    const page = await browser.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('E-mail').fill('risk@demo.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('E-mail or password is not right');
    await screenshot(page, 'sign-in-refused');
    await page.close();
  });

  for (const account of ACCOUNTS) {
    it(`signs in ${account.email} and shows the ${account.role} navigation`, async () => {
      const page = await browser.newPage();
      await page.goto(`${server.url}/`);
      await page.waitForURL(/\/sign-in/);
      await page.getByLabel('E-mail').fill(account.email);
      await page.getByLabel('Password').fill('keelson-demo');
      await page.getByRole('button', { name: 'Sign in' }).click();
      const navigation = page.getByRole('navigation', { name: 'Main' });
      for (const label of account.sees) {
        await expect.poll(() => navigation.getByRole('link', { name: label, exact: true }).count()).toBe(1);
      }
      for (const label of account.hidden) {
        expect(await navigation.getByRole('link', { name: label, exact: true }).count()).toBe(0);
      }
      // The home page is the role's dashboard, with its note on what the figures are.
      await expect.poll(() => page.locator('[data-card]').count()).toBeGreaterThan(0);
      expect(await page.getByText("Keelson's scores are decision support").count()).toBe(1);
      await screenshot(page, `home-${account.role}`);
      await page.close();
    });
  }

  it('lets the administrator open the users list and the sent mail', async () => {
    const page = await browser.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('E-mail').fill('admin@demo.test');
    await page.getByLabel('Password').fill('keelson-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
    await expect.poll(() => page.getByRole('row').count()).toBeGreaterThanOrEqual(7);
    expect(await page.getByText('plant.north@demo.test').count()).toBeGreaterThan(0);
    await screenshot(page, 'admin-users');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sent mail' }).click();
    await page.waitForURL(/\/admin\/mail/);
    await screenshot(page, 'admin-sent-mail');
    await page.close();
  });

  it('sends a signed-out visitor of an admin page back to sign-in', async () => {
    const page = await browser.newPage();
    await page.goto(`${server.url}/admin/users`);
    await page.waitForURL(/\/sign-in\?returnUrl=/);
    expect(page.url()).toContain('returnUrl=%2Fadmin%2Fusers');
    await page.close();
  });
});
