/**
 * The next quarter's demo workbook (`data/demo/keelson-demo-q2.xlsx`): the committed file is
 * what `npm run demo:generate` writes, and `npm run analyze` on it against the first quarter's
 * file differs in exactly the changes tools/demo-network-q2.ts documents (Q2_CHANGES): the
 * single points of failure and the supplier codes, each set difference by code.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readWorkbook, writeWorkbook } from '@keelson/workbook';
import { buildDemoNetwork } from './demo-network';
import { buildDemoNetworkQ2, Q2_CHANGES } from './demo-network-q2';

const root = join(import.meta.dirname, '..');
const workdir = mkdtempSync(join(tmpdir(), 'keelson-demo-q2-'));

interface AnalysedSupplier { code: string; singlePointOfFailure: boolean; tier: number | null }

function analyze(workbook: string): AnalysedSupplier[] {
  const out = join(workdir, `${workbook.replace(/\W/g, '-')}.json`);
  const run = spawnSync(process.execPath, ['--import', 'tsx', 'tools/analyze.ts', workbook,
    '--json', out], { cwd: root, encoding: 'utf8', timeout: 120_000 });
  if (run.status !== 0) throw new Error(`analyze ${workbook} failed: ${run.stderr}`);
  return (JSON.parse(readFileSync(out, 'utf8')) as { suppliers: AnalysedSupplier[] }).suppliers;
}

const minus = (a: Set<string>, b: Set<string>) => [...a].filter((code) => !b.has(code)).sort();
const spofs = (rows: AnalysedSupplier[]) =>
  new Set(rows.filter((row) => row.singlePointOfFailure).map((row) => row.code));
const codes = (rows: AnalysedSupplier[]) => new Set(rows.map((row) => row.code));

describe('the next quarter of the demo (keelson-demo-q2.xlsx)', () => {
  it('is the committed file that npm run demo:generate writes', async () => {
    const committed = readFileSync(join(root, 'data', 'demo', 'keelson-demo-q2.xlsx'));
    const written = await writeWorkbook(buildDemoNetworkQ2());
    const read = await readWorkbook(new Uint8Array(committed));
    expect(read.model).toEqual((await readWorkbook(written)).model);
  });

  it('changes only the sourcing rows and the suppliers that Q2_CHANGES names', () => {
    const q1 = buildDemoNetwork();
    const q2 = buildDemoNetworkQ2();
    const key = (r: { buyerCode: string; itemCode: string; supplierCode: string }) =>
      `${r.buyerCode}|${r.itemCode}|${r.supplierCode}`;
    const before = new Set(q1.sourcing.map(key));
    const after = new Set(q2.sourcing.map(key));
    const removedRows = minus(before, after);
    expect(removedRows.every((row) => row.includes(Q2_CHANGES.removedSupplier)
      || row.startsWith(`P-NORTH|C-056|`))).toBe(true);
    expect(removedRows.filter((row) => row.startsWith('P-NORTH|C-056|')))
      .toEqual(['P-NORTH|C-056|S-1-009', 'P-NORTH|C-056|S-1-062']);
    expect(minus(after, before)).toEqual(['P-NORTH|C-056|S-1-096', 'S-1-003|M-02|S-2-004',
      'S-1-004|M-02|S-2-004']);
    expect(q2.plants).toEqual(q1.plants);
    expect(q2.products).toEqual(q1.products);
    expect(q2.bom).toEqual(q1.bom);
    expect(q2.stock).toEqual(q1.stock);
    // Nothing the browser journeys use moves: S-2-SHARED-A, S-2-011 and material M-01.
    const m01 = (rows: typeof q1.sourcing) => rows.filter((r) => r.itemCode === 'M-01'
      || [r.supplierCode, r.buyerCode].some((c) => c === 'S-2-SHARED-A' || c === 'S-2-011'));
    expect(m01(q2.sourcing)).toEqual(m01(q1.sourcing));
  });

  it('analyses with exactly one new and one gone single point, one supplier added and one ' +
    'removed', () => {
    const q1 = analyze('data/demo/keelson-demo.xlsx');
    const q2 = analyze('data/demo/keelson-demo-q2.xlsx');
    expect(minus(spofs(q2), spofs(q1))).toEqual([...Q2_CHANGES.expected.newSinglePoints]);
    expect(minus(spofs(q1), spofs(q2))).toEqual([...Q2_CHANGES.expected.goneSinglePoints]);
    expect(minus(codes(q2), codes(q1))).toEqual([...Q2_CHANGES.expected.suppliersAdded]);
    expect(minus(codes(q1), codes(q2))).toEqual([...Q2_CHANGES.expected.suppliersRemoved]);
    // The removed supplier was no single point, so (a) and (c) stay apart.
    expect(spofs(q1).has(Q2_CHANGES.removedSupplier)).toBe(false);
    expect(q2.find((row) => row.code === 'S-1-096')?.tier).toBe(1);
  });
});
