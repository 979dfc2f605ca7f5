/**
 * Steps the browser journeys share: signing in as a demo account, reading the API with the
 * page's own session, starting an analysis run from its screen, and a whole-page screenshot.
 */
import type { Page } from 'playwright-core';
import { screenshot } from './browser';

/** The password of every demo account (demo mode only). */
export const DEMO_PASSWORD = 'keelson-demo';

/** Signs in as `email` (any earlier session is dropped first) and waits for the home page. */
export async function signIn(page: Page, url: string, email: string): Promise<void> {
  await page.context().clearCookies();
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/home/);
}

/** A JSON GET made by the page itself, with its session cookie. */
export async function apiGet<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (url) => {
    const response = await fetch(url, { credentials: 'same-origin' });
    return (await response.json()) as unknown;
  }, path) as Promise<T>;
}

/**
 * Starts an analysis run labelled `label` from the Analysis runs screen and waits for its page;
 * returns the run's id.
 */
export async function startRunFromScreen(page: Page, label: string): Promise<number> {
  await page.getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Analysis runs' }).click();
  await page.getByRole('button', { name: 'Start a run' }).click();
  await page.getByRole('dialog').getByLabel('Label').fill(label);
  await page.getByRole('dialog').getByRole('button', { name: 'Start' }).click();
  await page.waitForURL(/\/runs\/\d+/, { timeout: 60_000 });
  return Number(/\/runs\/(\d+)/.exec(page.url())![1]);
}

/**
 * Closes every snack bar. Two can be on the page at once while one leaves and the next comes in,
 * and the leaving one's button goes away by itself, so the first button still there is clicked
 * until none is left.
 */
export async function closeSnackBars(page: Page): Promise<void> {
  const containers = page.locator('mat-snack-bar-container');
  for (let tries = 0; tries < 20 && (await containers.count()) > 0; tries++) {
    await containers.locator('button').first().click({ timeout: 2_000 }).catch(() => undefined);
    await page.waitForTimeout(200);
  }
  if ((await containers.count()) > 0) throw new Error('a snack bar would not close');
}

/**
 * A screenshot of the whole page: the shell scrolls inside its content pane, so the window is
 * made as tall as the content first; snack bars are closed and focus is let go of.
 */
export async function fullPageShot(page: Page, name: string): Promise<void> {
  await closeSnackBars(page);
  // Strings, not functions: this file is typed without the DOM library.
  await page.evaluate('document.activeElement && document.activeElement.blur()');
  await page.mouse.move(0, 0);
  const size = page.viewportSize()!;
  const content = await page.evaluate<number>(
    "(document.querySelector('mat-sidenav-content') || document.body).scrollHeight");
  await page.setViewportSize({ width: size.width, height: Math.max(size.height, content + 64) });
  await page.waitForTimeout(300);
  await screenshot(page, name);
  await page.setViewportSize(size);
}
