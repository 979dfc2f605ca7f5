import ExcelJS from 'exceljs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ImportProblemDto } from '@keelson/contracts';
import { ERROR_FILL_ARGB, WARNING_FILL_ARGB } from '@keelson/workbook';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  bearer,
  buildXlsx,
  downloadWorkbook,
  smallNetworkSheets,
  upload,
} from './import-fixtures';

let t: TestApp;
let batchId: number;

/** Three errors (two in Products, one in Sourcing) and one warning (S4 sells nothing). */
beforeAll(async () => {
  t = await createTestApp();
  const sheets = smallNetworkSheets();
  sheets.Products![1]![3] = 'lots';
  sheets.Products![2]![3] = -5;
  sheets.Sourcing!.push(['P1', 'C1', 'S404', 10, 'yes']);
  sheets.Suppliers!.push(['S4', 'Idle Works 50%_off', 'IT', 'Veneto', 3, 3, 3, 'no']);
  const response = await upload(t, await buildXlsx(sheets), 'north q1.final.xlsx');
  expect(response.body).toMatchObject({ status: 'rejected', errorCount: 3, warningCount: 1 });
  batchId = response.body.id;
});
afterAll(() => t.close());

async function problems(query: string) {
  const response = await request(t.app).get(`/api/imports/${batchId}/problems?${query}`)
    .set(bearer(t));
  expect(response.status).toBe(200);
  return response.body as { items: ImportProblemDto[]; total: number };
}

const places = (page: { items: ImportProblemDto[] }) =>
  page.items.map((problem) => `${problem.kind}:${problem.sheet}:${problem.row}`);

describe('GET /api/imports/:id/problems', () => {
  it('lists errors and warnings sorted by sheet, then row', async () => {
    const page = await problems('');
    expect(page.total).toBe(4);
    expect(places(page)).toEqual(['error:Products:2', 'error:Products:3', 'error:Sourcing:6',
      'warning:Suppliers:5']);
    expect(page.items[0]).toEqual({ kind: 'error', sheet: 'Products', row: 2,
      column: 'weekly_revenue', value: 'lots', cell: 'D2',
      message: 'weekly_revenue: expected a number; got "lots"' });
    expect(page.items[3]).toMatchObject({ kind: 'warning', column: null, cell: null });
  });

  it('filters by kind, sheet (any case) and text in column, value or message', async () => {
    expect(places(await problems('kind=warning'))).toEqual(['warning:Suppliers:5']);
    expect(places(await problems('sheet=products'))).toEqual(['error:Products:2',
      'error:Products:3']);
    expect(places(await problems('q=S404'))).toEqual(['error:Sourcing:6']);
    expect((await problems('q=nothing-like-this')).total).toBe(0);
  });

  it('sorts by row descending and by message, and pages', async () => {
    expect(places(await problems('sort=row&order=desc'))).toEqual(['error:Sourcing:6',
      'warning:Suppliers:5', 'error:Products:3', 'error:Products:2']);
    const byMessage = await problems('sort=message');
    const messages = byMessage.items.map((problem) => problem.message.toLowerCase());
    expect(messages).toEqual([...messages].sort());
    const second = await problems('limit=1&offset=1');
    expect(second).toMatchObject({ total: 4 });
    expect(places(second)).toEqual(['error:Products:3']);
  });

  it('answers 400 naming a wrong query parameter', async () => {
    const response = await request(t.app).get(`/api/imports/${batchId}/problems?sort=cell`)
      .set(bearer(t));
    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('query.sort');
  });
});

describe('GET /api/imports/:id/error-report.xlsx', () => {
  it('returns the buyer\'s workbook with problem cells filled, named after the file',
    async () => {
      const { response, workbook } = await downloadWorkbook(t,
        `/api/imports/${batchId}/error-report.xlsx`);
      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toContain('spreadsheetml.sheet');
      expect(response.headers['content-disposition']).toBe(
        'attachment; filename="north q1.final-problems.xlsx"');
      const fill = (sheet: string, cell: string) =>
        (workbook.getWorksheet(sheet)!.getCell(cell).fill as ExcelJS.FillPattern | undefined)
          ?.fgColor?.argb;
      expect(fill('Products', 'D2')).toBe(ERROR_FILL_ARGB);
      expect(fill('Sourcing', 'C6')).toBe(ERROR_FILL_ARGB);
      expect(fill('Suppliers', 'A5')).toBe(WARNING_FILL_ARGB);
      expect(fill('Products', 'A2')).toBeUndefined();
      expect(workbook.getWorksheet('Problems')!.rowCount).toBe(5);
    });

  it('still gives a report (the problem list) for a file that is not a spreadsheet', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0]);
    const uploaded = await upload(t, png, 'photo.xlsx');
    const { response, workbook } = await downloadWorkbook(t,
      `/api/imports/${uploaded.body.id}/error-report.xlsx`);
    expect(response.status).toBe(200);
    const problemsSheet = workbook.getWorksheet('Problems')!;
    expect(String(problemsSheet.getRow(2).getCell(7).value)).toContain('PNG image');
  });
});
