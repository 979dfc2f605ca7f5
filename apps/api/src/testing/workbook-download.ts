/** Specs' download of an .xlsx route: the response and the workbook opened with exceljs. */
import ExcelJS from 'exceljs';
import request from 'supertest';
import type { TestApp } from './test-app';

/** GETs an .xlsx download and opens it; returns the response and the workbook. */
export async function downloadWorkbook(t: TestApp, path: string, email = 'buyer@demo.test') {
  const response = await request(t.app).get(path).set(bearer(t, email)).buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
  const workbook = new ExcelJS.Workbook();
  if (response.status === 200) {
    const bytes = response.body as Buffer;
    await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset,
      bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  }
  return { response, workbook };
}

/** A Bearer header of a demo account. */
export function bearer(t: TestApp, email = 'buyer@demo.test'): Record<string, string> {
  return { Authorization: `Bearer ${t.tokenFor(email)}` };
}
