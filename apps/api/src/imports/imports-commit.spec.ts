import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ImportBatchDto, ImportCommitDto, NetworkChangesDto } from '@keelson/contracts';
import { insertNetworkVersion } from '../network/network-store';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  bearer,
  buildXlsx,
  networkRowCounts,
  smallNetworkSheets,
  upload,
  type SheetRows,
} from './import-fixtures';
import { createImportServices } from './imports.module';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const api = () => request(t.app);

async function uploadReady(sheets: Record<string, SheetRows>, fileName: string) {
  const response = await upload(t, await buildXlsx(sheets), fileName);
  expect(response.body.status).toBe('ready');
  return response.body as ImportBatchDto;
}

const commit = (id: number) => api().post(`/api/imports/${id}/commit`).set(bearer(t));

function rowsOfVersion(table: string, versionId: number): number {
  return (t.database.sqlite.prepare(`select count(*) as n from ${table} where version_id = ?`)
    .get(versionId) as { n: number }).n;
}

/** The small network with a few edits, and the changes they make (worked out by hand). */
function editedNetwork(): {
  sheets: Record<string, SheetRows>;
  changes: Partial<NetworkChangesDto>;
} {
  const sheets = smallNetworkSheets();
  sheets.Suppliers![2]![4] = 10; // S2 gets recovery_weeks 10 (was empty, so 8)
  sheets.Suppliers!.splice(3, 1); // S3 removed ...
  sheets.Sourcing!.splice(4, 1); // ... with the row in which S1 buys from it
  sheets.Suppliers!.push(['S4', 'Nordic Seals AB', 'SE', 'Skåne', 4, 5, 5, 'yes']);
  sheets.Sourcing![2]![3] = 30; // P1 buys C1 from S2: share 40 -> 30
  sheets.Sourcing!.push(['P2', 'B', 'S4', null, 'yes']);
  sheets.Products![2]![3] = 2600; // F2's weekly revenue
  sheets.Products!.push(['F3', 'P2', 'Gasket kit', 300]);
  sheets.BOM!.push(['F3', 'B', 1]);
  return {
    sheets,
    changes: {
      suppliersAdded: ['S4'], suppliersRemoved: ['S3'], suppliersChanged: ['S2'],
      sourcingAdded: 1, sourcingRemoved: 1, sourcingChanged: 1,
      productsAdded: ['F3'], productsRemoved: [], productsChanged: ['F2'],
    },
  };
}

describe('POST /api/imports/:id/commit', () => {
  let first: ImportCommitDto;

  it('commits a ready batch as a version whose rows equal the file\'s', async () => {
    const batch = await uploadReady(smallNetworkSheets(), 'plant-north.xlsx');
    const response = await commit(batch.id);
    expect(response.status).toBe(201);
    first = response.body;
    expect(first).toMatchObject({ id: batch.id, counts: batch.counts });
    expect(rowsOfVersion('network_suppliers', first.networkVersionId)).toBe(3);
    expect(rowsOfVersion('network_sourcing', first.networkVersionId)).toBe(4);
    expect(first.changes).toMatchObject({ previousVersionId: null, productsAdded: ['F1', 'F2'],
      sourcingAdded: 4, suppliersRemoved: [] });
  });

  it('answers 409 already_committed naming the version on a second commit', async () => {
    const response = await commit(first.id);
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('already_committed');
    expect(response.body.error.message).toBe(`Import ${first.id} was already committed as ` +
      `network version ${first.networkVersionId}; upload the file again to make another version.`);
    const check = await api().post(`/api/imports/${first.id}/check`).set(bearer(t)).send({});
    expect(check.status).toBe(409);
  });

  it('reports what changed against the previous version', async () => {
    const { sheets, changes } = editedNetwork();
    const batch = await uploadReady(sheets, 'plant-north-q2.xlsx');
    const response = await commit(batch.id);
    expect(response.status).toBe(201);
    expect(response.body.changes).toEqual({ previousVersionId: first.networkVersionId,
      ...changes });
    const stored = t.database.sqlite.prepare('select changes, previous_version_id as previous '
      + 'from network_versions where id = ?').get(response.body.networkVersionId) as
      { changes: string; previous: number };
    expect(JSON.parse(stored.changes)).toEqual(response.body.changes);
    expect(stored.previous).toBe(first.networkVersionId);
  });

  it('answers 409 not_ready for a batch that needs a mapping, 422 for one with errors',
    async () => {
      const renamed = smallNetworkSheets();
      renamed.Vendors = renamed.Suppliers!;
      delete renamed.Suppliers;
      const unmapped = await upload(t, await buildXlsx(renamed), 'vendors.xlsx');
      expect(unmapped.body.status).toBe('needs_mapping');
      const notReady = await commit(unmapped.body.id);
      expect(notReady.status).toBe(409);
      expect(notReady.body.error.code).toBe('not_ready');
      expect(notReady.body.error.message).toContain('Map them and check the file again');
      const bad = smallNetworkSheets();
      bad.Products![1]![3] = 'n/a';
      const rejected = await upload(t, await buildXlsx(bad), 'bad.xlsx');
      const invalid = await commit(rejected.body.id);
      expect(invalid.status).toBe(422);
      expect(invalid.body.error.details).toEqual([{ sheet: 'Products', row: 2,
        column: 'weekly_revenue', value: 'n/a',
        message: 'weekly_revenue: expected a number; got "n/a"' }]);
    });
});

describe('concurrent commits', () => {
  it('gives two whole versions; the later one\'s previous version is the earlier one',
    async () => {
      const bigger = smallNetworkSheets();
      bigger.Suppliers!.push(['S5', 'Kraków Forge', 'PL', 'Małopolska', 9, 3, 4, 'no']);
      bigger.Sourcing!.push(['P2', 'B', 'S5', null, 'yes']);
      const a = await uploadReady(smallNetworkSheets(), 'buyer-a.xlsx');
      const b = await uploadReady(bigger, 'buyer-b.xlsx');
      const [ra, rb] = await Promise.all([commit(a.id), commit(b.id)]);
      expect([ra.status, rb.status]).toEqual([201, 201]);
      const [earlier, later] = [ra.body, rb.body].sort(
        (x: ImportCommitDto, y: ImportCommitDto) => x.networkVersionId - y.networkVersionId);
      expect(later.changes.previousVersionId).toBe(earlier.networkVersionId);
      for (const [answer, suppliers, sourcing] of [[ra.body, 3, 4], [rb.body, 4, 5]] as const) {
        expect(rowsOfVersion('network_suppliers', answer.networkVersionId)).toBe(suppliers);
        expect(rowsOfVersion('network_sourcing', answer.networkVersionId)).toBe(sourcing);
        expect(rowsOfVersion('network_products', answer.networkVersionId)).toBe(2);
      }
    });

  it('commits one batch once when two commits of it race', async () => {
    const batch = await uploadReady(smallNetworkSheets(), 'twice.xlsx');
    const versionsBefore = networkRowCounts(t).network_versions;
    const answers = await Promise.all([commit(batch.id), commit(batch.id)]);
    expect(answers.map((answer) => answer.status).sort()).toEqual([201, 409]);
    expect(networkRowCounts(t).network_versions).toBe(versionsBefore! + 1);
  });

  it('runs two automation uploads at once into two versions', async () => {
    const data = await buildXlsx(smallNetworkSheets());
    const answers = await Promise.all([
      upload(t, data, 'script-1.xlsx', { query: 'commit=true' }),
      upload(t, data, 'script-2.xlsx', { query: 'commit=true' }),
    ]);
    expect(answers.map((answer) => answer.status)).toEqual([201, 201]);
    const ids = answers.map((answer) => answer.body.networkVersionId as number)
      .sort((x, y) => x - y);
    const later = answers.find((answer) => answer.body.networkVersionId === ids[1])!;
    expect(later.body.changes.previousVersionId).toBe(ids[0]);
  });
});

describe('a commit that fails half-way', () => {
  it('rolls back every network row and leaves the batch ready to commit again', async () => {
    const { imports } = createImportServices(t.database.db, {
      insertVersion: (db, model, meta) => {
        insertNetworkVersion(db, model, meta);
        throw new Error('disk full (simulated after the rows were written)');
      },
    });
    const batch = await uploadReady(smallNetworkSheets(), 'half.xlsx');
    const before = networkRowCounts(t);
    const buyer = { id: t.userId('buyer@demo.test'), email: 'buyer@demo.test', name: 'Bruno',
      role: 'buyer' as const, plantCodes: [] };
    await expect(imports.commit(buyer, batch.id)).rejects.toThrow(/disk full/);
    expect(networkRowCounts(t)).toEqual(before);
    expect((await api().get(`/api/imports/${batch.id}`).set(bearer(t))).body.status)
      .toBe('ready');
    expect((await commit(batch.id)).status).toBe(201);
  });
});
