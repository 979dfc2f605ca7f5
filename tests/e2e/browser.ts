import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/** Where browser tests leave their screenshots (committed, shown in the README and docs). */
export const SCREENS_DIR = join(import.meta.dirname, '..', '..', 'docs', 'screens');

/** Flags that keep Debian's chromium quiet on a machine with no outside network. */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** A headless chromium with a fresh profile, and how to close it and remove the profile. */
export interface BrowserSession {
  context: BrowserContext;
  newPage(): Promise<Page>;
  close(): Promise<void>;
}

/** Starts Debian's chromium (never a downloaded build) with an empty profile. */
export async function openBrowser(): Promise<BrowserSession> {
  const profile = mkdtempSync(join(tmpdir(), 'keelson-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env['CHROMIUM_PATH'] ?? '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: 1360, height: 860 },
  });
  return {
    context,
    newPage: () => context.newPage(),
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Saves a full-page screenshot as docs/screens/<name>.png. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENS_DIR, { recursive: true });
  const path = join(SCREENS_DIR, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}
