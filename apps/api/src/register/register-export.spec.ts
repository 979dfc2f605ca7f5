import ExcelJS from 'exceljs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REGISTER_ABOUT_SHEET } from '@keelson/contracts';
import { SCORING_DEFAULTS } from '@keelson/scoring';
import { ACCOUNT_OF_ROLE, createTestApp, type TestApp } from '../testing/test-app';
import { REGISTER_EXPORT_COLUMNS } from './register-export';
import { syncRegisterFromRun } from './register-sync';
import { seedRun } from './register-test-runs';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ withDemoNetwork: true });
  const runId = seedRun(t.database.db, [
    // 5 x 4 = 20: critical; 4 x 3 = 12: high.
    { code: 'S-2-SHARED-B', singlePointOfFailure: true, likelihood: 4, impactBand: 5,
      rating: 20, ratingBand: 'critical', plants: ['P-EAST'] },
    { code: 'S-2-SHARED-A', singlePointOfFailure: true, likelihood: 3, impactBand: 4,
      rating: 12, ratingBand: 'high', plants: ['P-NORTH', 'P-SOUTH'] },
  ]);
  syncRegisterFromRun(t.database.db, runId, SCORING_DEFAULTS, t.clock.now);
});
afterAll(() => t.close());

const bearer = (role: keyof typeof ACCOUNT_OF_ROLE) =>
  ({ Authorization: `Bearer ${t.tokenFor(ACCOUNT_OF_ROLE[role])}` });
const entryId = (code: string) => (t.database.sqlite
  .prepare('select id from register_entries where supplier_code = ?')
  .get(code) as { id: number }).id;

async function download(role: keyof typeof ACCOUNT_OF_ROLE, query: Record<string, string> = {}) {
  const response = await request(t.app).get('/api/register/export.xlsx').query(query)
    .set(bearer(role)).buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
  expect(response.status).toBe(200);
  expect(response.headers['content-type']).toContain('spreadsheetml');
  const workbook = new ExcelJS.Workbook();
  const bytes = response.body as Buffer;
  await workbook.xlsx.load(
    bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  return workbook;
}

const rowsOf = (workbook: ExcelJS.Workbook) => {
  const sheet = workbook.getWorksheet('Register')!;
  const header = (sheet.getRow(1).values as ExcelJS.CellValue[]).slice(1);
  const rows: Record<string, ExcelJS.CellValue>[] = [];
  sheet.eachRow((row, number) => {
    if (number === 1) return;
    const values = (row.values as ExcelJS.CellValue[]).slice(1);
    rows.push(Object.fromEntries(header.map((name, i) => [String(name), values[i] ?? ''])));
  });
  return { header, rows };
};

describe('GET /api/register/export.xlsx', () => {
  it('writes every entry with plants, owner and the latest override reason', async () => {
    const id = entryId('S-2-SHARED-A');
    await request(t.app).patch(`/api/register/${id}`).set(bearer('admin'))
      .send({ ownerId: t.userId(ACCOUNT_OF_ROLE.risk_manager) });
    for (const [likelihood, reason] of [[5, 'Plant fire reported'], [4, 'Fire contained']]) {
      await request(t.app).post(`/api/register/${id}/likelihood`).set(bearer('risk_manager'))
        .send({ likelihood, reason });
    }
    const { header, rows } = rowsOf(await download('viewer'));
    expect(header).toEqual([...REGISTER_EXPORT_COLUMNS]);
    expect(rows.map((row) => row['Supplier code'])).toEqual(['S-2-SHARED-B', 'S-2-SHARED-A']);
    // Impact band 4 x override 4 = 16: high.
    expect(rows[1]).toMatchObject({ 'Supplier name': 'Kestrel Forgings',
      Plants: 'P-NORTH, P-SOUTH', Owner: 'Rania Okafor', 'Computed likelihood': 3,
      'Likelihood override': 4, Likelihood: 4, 'Impact band': 4, Rating: 16,
      'Rating band': 'high', 'Latest override reason': 'Fire contained',
      'Latest override by': 'Rania Okafor', Origin: 'automatic', Status: 'open' });
    expect(rows[0]).toMatchObject({ 'Likelihood override': '', 'Latest override reason': '',
      Rating: 20, 'Rating band': 'critical' });
  });

  it('says what the numbers mean and assume, with the settings in force', async () => {
    const about = (await download('buyer')).getWorksheet(REGISTER_ABOUT_SHEET)!;
    const text = (about.getColumn(1).values as ExcelJS.CellValue[]).join('\n');
    expect(text).toContain('impact band (1-5) x likelihood (1-5)');
    expect(text).toContain('below 0.1 % is 1');
    expect(text).toContain('critical 20-25');
    expect(text).toContain('not a standard');
    expect(text).toContain('no re-allocation');
    expect(text).toContain('procedures decide');
  });

  it('keeps to the filters and to a plant manager\'s plants', async () => {
    expect(rowsOf(await download('viewer', { ratingBand: 'critical' })).rows
      .map((row) => row['Supplier code'])).toEqual(['S-2-SHARED-B']);
    expect(rowsOf(await download('plant_manager')).rows.map((row) => row['Supplier code']))
      .toEqual(['S-2-SHARED-A']);
  });
});
