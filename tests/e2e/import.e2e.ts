/**
 * Browser journey of the buyer's import: a messy export (the supplier sheet called "Vendors",
 * non-template headers, text in a revenue cell) is uploaded, mapped, checked; the error report
 * is downloaded and its problem cell found highlighted; the mapping is saved; the fixed file is
 * uploaded, offered the saved mapping, committed; and a supplier of it is found in the network.
 * Screenshots of each step go to docs/screens/import-*.png.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ERROR_FILL_ARGB, readWorkbook, writeWorkbook } from '@keelson/workbook';
import { openBrowser, screenshot, type BrowserSession } from './browser';
import { signIn } from './journey-steps';
import { startTestServer, type TestServer } from './server';

/** An invented supplier name the journey looks for after the commit. */
const NEW_NAME = 'Quillmont Castings';

/**
 * The demo workbook as a buyer's ERP might export it: Suppliers renamed "Vendors" with the
 * headers "Vendor no", "Vendor name" and "TTR"; one supplier renamed to {@link NEW_NAME}; and,
 * when `isBroken`, "n/a" in the third product's weekly revenue (row 4 of Products).
 */
async function messyWorkbook(path: string, isBroken: boolean): Promise<void> {
  const demo = await readWorkbook(new Uint8Array(readFileSync('data/demo/keelson-demo.xlsx')));
  const model = demo.model!;
  model.suppliers[0] = { ...model.suppliers[0]!, name: NEW_NAME };
  const book = new ExcelJS.Workbook();
  await book.xlsx.load((await writeWorkbook(model)) as unknown as ArrayBuffer);
  const suppliers = book.getWorksheet('Suppliers')!;
  suppliers.name = 'Vendors';
  const rename: Record<string, string> = {
    supplier_code: 'Vendor no', supplier_name: 'Vendor name', recovery_weeks: 'TTR',
  };
  suppliers.getRow(1).eachCell((cell) => {
    const header = String(cell.value);
    if (rename[header]) cell.value = rename[header];
  });
  if (isBroken) {
    const products = book.getWorksheet('Products')!;
    products.getRow(1).eachCell((cell, column) => {
      if (cell.value === 'weekly_revenue') products.getRow(4).getCell(column).value = 'n/a';
    });
  }
  writeFileSync(path, Buffer.from(await book.xlsx.writeBuffer()));
}

async function upload(page: Page, path: string): Promise<void> {
  await page.locator('input[type="file"]').setInputFiles(path);
}

describe('the buyer imports a messy supplier spreadsheet', () => {
  let server: TestServer;
  let browser: BrowserSession;
  let folder: string;

  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'keelson-e2e-import-'));
    await messyWorkbook(join(folder, 'varnholm-erp-export.xlsx'), true);
    await messyWorkbook(join(folder, 'varnholm-erp-export-fixed.xlsx'), false);
    server = await startTestServer();
    browser = await openBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
    rmSync(folder, { recursive: true, force: true });
  });

  it('maps, sees the errors, downloads the report, fixes, commits and finds the supplier', async () => {
    const page = await browser.newPage();
    await signIn(page, server.url, 'buyer@demo.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Import' })
      .click();
    await expect.poll(() => page.getByText('Drop your file here, or choose one').count()).toBe(1);
    await screenshot(page, 'import-1-upload');

    // 1. Upload: the Suppliers sheet is not found under its own name, so the mapping step opens.
    await upload(page, join(folder, 'varnholm-erp-export.xlsx'));
    const check = page.getByRole('button', { name: 'Check with this mapping' });
    await check.waitFor();
    const suppliersCard = page.getByRole('table', { name: 'Columns of Suppliers' });
    await expect.poll(() => suppliersCard.textContent()).toContain('Vendor no');
    await screenshot(page, 'import-2-mapping');

    // Save the suggested mapping under a name for next quarter's export.
    await page.getByLabel('Mapping name').fill('Varnholm ERP export');
    await page.getByRole('button', { name: 'Save mapping as…' }).click();
    await expect.poll(() => page.getByText('Varnholm ERP export').count()).toBeGreaterThan(0);

    // 2. Check with the suggested mapping: the text in weekly_revenue is reported where it is.
    await check.click();
    const problems = page.getByRole('table', { name: 'Errors and warnings' });
    await expect.poll(() => problems.textContent(), { timeout: 30_000 }).toContain('n/a');
    const errorRow = problems.getByRole('row').filter({ hasText: 'n/a' });
    expect(await errorRow.textContent()).toContain('Products');
    expect(await errorRow.textContent()).toContain('weekly_revenue');
    await screenshot(page, 'import-3-check-errors');

    // 3. The error report is the buyer's own file with the problem cell highlighted.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download error report (xlsx)' }).click(),
    ]);
    const reportPath = join(folder, 'report.xlsx');
    await download.saveAs(reportPath);
    const report = new ExcelJS.Workbook();
    await report.xlsx.readFile(reportPath);
    const products = report.getWorksheet('Products')!;
    let badCell: ExcelJS.Cell | undefined;
    products.getRow(4).eachCell((cell) => {
      if (cell.value === 'n/a') badCell = cell;
    });
    expect(badCell).toBeDefined();
    expect((badCell!.fill as ExcelJS.FillPattern).fgColor?.argb).toBe(ERROR_FILL_ARGB);

    // 4. Upload the corrected file: the saved mapping is offered, applied, and the file is ready.
    await page.getByRole('button', { name: 'Upload a corrected file' }).click();
    await upload(page, join(folder, 'varnholm-erp-export-fixed.xlsx'));
    const offer = page.getByRole('button', { name: 'Use mapping Varnholm ERP export' });
    await offer.waitFor({ timeout: 30_000 });
    await screenshot(page, 'import-4-mapping-offered');
    await offer.click();
    const proceed = page.getByRole('button', { name: 'Continue to commit' });
    await proceed.waitFor({ timeout: 30_000 });
    await proceed.click();

    // 5. Commit: a new network version, with what changed against the demo's first version.
    await page.getByRole('button', { name: 'Commit as a new network version' }).click();
    const saved = page.getByRole('heading', { name: /Network version 2 is saved/ });
    await saved.waitFor({ timeout: 30_000 });
    const changes = page.getByRole('table', { name: 'Changes against the previous version' });
    expect(await changes.textContent()).toContain('Suppliers changed');
    await screenshot(page, 'import-5-committed');

    // 6. The renamed supplier is in the suppliers table of the new version.
    await page.getByRole('link', { name: 'Open network version 2' }).click();
    await page.waitForURL(/\/network\/2\/suppliers/);
    await page.getByLabel('Search code or name').fill('Quillmont');
    const table = page.getByRole('table', { name: 'Suppliers' });
    await expect.poll(() => table.getByRole('row').count(), { timeout: 15_000 }).toBe(2);
    expect(await table.textContent()).toContain(NEW_NAME);
    await screenshot(page, 'network-suppliers-search');
    await table.getByRole('row').filter({ hasText: NEW_NAME }).getByRole('link').first().click();
    await page.waitForURL(/\/network\/2\/suppliers\//);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent())
      .toContain(NEW_NAME);
    await screenshot(page, 'network-supplier-page');
    await page.close();
  });
});
