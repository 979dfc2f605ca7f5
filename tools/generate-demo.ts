/**
 * Writes the demo workbook `data/demo/keelson-demo.xlsx` (seeded, so the same file every time),
 * the same company one quarter later as `data/demo/keelson-demo-q2.xlsx` (exactly the changes of
 * `Q2_CHANGES` in tools/demo-network-q2.ts: supplier S-2-003 removed, S-2-004 a second source of
 * M-02 so S-2-SHARED-B is no longer a single point of failure, and the new S-1-096 the only
 * source of C-056 at P-NORTH, a new single point of failure) and the worked example of
 * docs/methods.md as `data/examples/worked-example.xlsx`.
 * Refuses to write a workbook that does not pass the import's own validation.
 * Run: `npm run demo:generate`.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type { SupplyModel } from '@keelson/contracts';
import { WORKED_EXAMPLE } from '@keelson/supply-graph/testing';
import { validateModel, writeWorkbook } from '@keelson/workbook';
import { buildDemoNetwork } from './demo-network';
import { buildDemoNetworkQ2 } from './demo-network-q2';

const root = join(import.meta.dirname, '..');

async function write(model: SupplyModel, path: string): Promise<void> {
  const { errors, warnings } = validateModel(model);
  if (errors.length > 0) {
    throw new Error(`${path} would not import:\n${errors.map((e) => `  ${e.sheet} row ${e.row}: ${e.message}`).join('\n')}`);
  }
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, await writeWorkbook(model));
  const counts = Object.entries(model).map(([sheet, rows]) => `${sheet} ${(rows as unknown[]).length}`);
  process.stdout.write(`Wrote ${path}: ${counts.join(', ')}; ${warnings.length} warning(s)\n`);
}

await write(buildDemoNetwork(), join(root, 'data', 'demo', 'keelson-demo.xlsx'));
await write(buildDemoNetworkQ2(),
  join(root, 'data', 'demo', 'keelson-demo-q2.xlsx'));
await write(WORKED_EXAMPLE, join(root, 'data', 'examples', 'worked-example.xlsx'));
