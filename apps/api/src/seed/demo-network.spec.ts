import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { IN_MEMORY, openDatabase } from '@keelson/db';
import { readWorkbook } from '@keelson/workbook';
import { latestNetworkVersionId, readNetworkModel } from '../network/network-store';
import { startServer } from '../server';
import { createTestApp } from '../testing/test-app';
import { DEMO_BUYER_EMAIL, DEMO_WORKBOOK_PATH, importDemoNetwork } from './demo-network';

const folders: string[] = [];
afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

/** What reading the committed demo workbook directly gives. */
async function demoWorkbook() {
  const read = await readWorkbook(new Uint8Array(readFileSync(DEMO_WORKBOOK_PATH)));
  expect(read.errors).toEqual([]);
  return read;
}

describe('importDemoNetwork', () => {
  it('imports the demo workbook as the demo buyer: batch committed, version 1 equal to the file',
    async () => {
      const t = await createTestApp({ withDemoNetwork: true });
      try {
        const read = await demoWorkbook();
        const versionId = latestNetworkVersionId(t.database.db)!;
        expect(readNetworkModel(t.database.db, versionId)).toEqual(read.model);
        const version = t.database.sqlite.prepare(
          'select label, created_by as createdBy, import_batch_id as batchId from ' +
          'network_versions').all() as { label: string; createdBy: number; batchId: number }[];
        expect(version).toEqual([{ label: 'Import 1: keelson-demo.xlsx',
          createdBy: t.userId(DEMO_BUYER_EMAIL), batchId: 1 }]);
        const batch = t.database.sqlite.prepare(
          'select status, created_by as createdBy, warning_count as warnings from import_batches')
          .get() as { status: string; createdBy: number; warnings: number };
        expect(batch).toEqual({ status: 'committed', createdBy: t.userId(DEMO_BUYER_EMAIL),
          warnings: read.warnings.length });
      } finally {
        await t.close();
      }
    });

  it('says which account is missing in a workspace that was not seeded', async () => {
    const opened = openDatabase(IN_MEMORY);
    try {
      await expect(importDemoNetwork(opened.db)).rejects.toThrow(
        'The demo network needs the account buyer@demo.test; seed it first.');
    } finally {
      opened.close();
    }
  });
});

describe('startServer in demo mode', () => {
  const start = (afterSeed?: () => void) => {
    const folder = mkdtempSync(join(tmpdir(), 'keelson-demo-network-'));
    folders.push(folder);
    return startServer({ env: {}, mode: 'demo', port: 0, host: '127.0.0.1',
      databasePath: join(folder, 'keelson.db'), logLevel: 'silent', afterSeed });
  };

  it('imports the demo network by default', async () => {
    const server = await start();
    try {
      const read = await demoWorkbook();
      const versionId = latestNetworkVersionId(server.db);
      expect(versionId).not.toBeNull();
      expect(readNetworkModel(server.db, versionId!)?.suppliers.length)
        .toBe(read.model!.suppliers.length);
    } finally {
      await server.stop();
    }
  });

  it('runs a given afterSeed instead', async () => {
    let calls = 0;
    const server = await start(() => {
      calls += 1;
    });
    try {
      expect(calls).toBe(1);
      expect(latestNetworkVersionId(server.db)).toBeNull();
    } finally {
      await server.stop();
    }
  });
});
