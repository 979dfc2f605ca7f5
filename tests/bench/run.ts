/**
 * `npm run bench [-- --sizes 1000,10000,50000] [--sample 64] [--no-import] [--no-api]`: speed and memory of
 * the analysis engine on seeded tiered networks (about 20 edges per supplier). Each size runs in its own child
 * process so that its peak RSS (`process.resourceUsage().maxRSS`) is its own. Prints a table and
 * writes tests/bench/results.json. See docs/performance.md for the figures and how to read them.
 */
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { cpus, freemem, loadavg, totalmem } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { measureSize, type SizeResult } from './measure-size';

const here = import.meta.dirname;
const { values } = parseArgs({
  options: {
    sizes: { type: 'string', default: '1000,10000,50000' },
    sample: { type: 'string', default: '64' },
    import: { type: 'boolean', default: true },
    api: { type: 'boolean', default: true },
    child: { type: 'string' },
  },
});

if (values.child !== undefined) {
  const result = measureSize(Number(values.child), Number(values.sample));
  process.stdout.write(`${JSON.stringify(result)}\n`);
} else {
  const sizes = values.sizes.split(',').map((s) => Number(s.trim()));
  if (sizes.some((s) => !Number.isInteger(s) || s < 1)) {
    process.stderr.write(`--sizes must list whole numbers, not "${values.sizes}"\n`);
    process.exit(2);
  }
  const machine = {
    cpu: cpus()[0]?.model ?? 'unknown',
    cores: cpus().length,
    memoryGb: Math.round(totalmem() / 2 ** 30),
    freeMemoryGb: Math.round(freemem() / 2 ** 30),
    node: process.version,
    loadAverageAtStart: loadavg().map((l) => Math.round(l * 100) / 100),
  };
  const results: SizeResult[] = [];
  for (const size of sizes) {
    process.stderr.write(`size ${size}: running in a child process...\n`);
    const output = execFileSync(
      process.execPath,
      [
        '--import', 'tsx', '--expose-gc', join(here, 'run.ts'),
        '--child', String(size), '--sample', values.sample,
      ],
      { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 1 << 24 },
    );
    results.push(JSON.parse(output.trim().split('\n').at(-1)!) as SizeResult);
  }
  let importResult: unknown = null;
  if (values.import) {
    // The buyer's import of a large workbook (issue: 100 000 Sourcing rows, 20 000 suppliers).
    process.stderr.write('import: 20 000 suppliers, about 100 000 Sourcing rows...\n');
    const output = execFileSync(
      process.execPath,
      ['--import', 'tsx', '--expose-gc', join(here, 'measure-import.ts')],
      { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 1 << 24 },
    );
    importResult = JSON.parse(output.trim().split('\n').at(-1)!);
  }
  let apiResult: unknown = null;
  if (values.api) {
    // The ranking and register routes under load (issue: p95 under 100 ms at 10 000 suppliers).
    process.stderr.write('api: ranking and register latency on a 10 000-supplier run...\n');
    const output = execFileSync(
      process.execPath,
      ['--import', 'tsx', join(here, 'measure-api.ts')],
      { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 1 << 24 },
    );
    apiResult = JSON.parse(output.trim().split('\n').at(-1)!);
  }
  const report = {
    command: `npm run bench -- --sizes ${sizes.join(',')} --sample ${values.sample}`,
    date: new Date().toISOString(),
    machine,
    results,
    import: importResult,
    api: apiResult,
  };
  writeFileSync(join(here, 'results.json'), `${JSON.stringify(report, null, 2)}\n`);
  process.stdout.write(formatTable(results));
  if (importResult !== null) process.stdout.write(formatImport(importResult as ImportResult));
  if (apiResult !== null) process.stdout.write(`\nAPI latency: ${JSON.stringify(apiResult)}\n`);
  const { cores, cpu, memoryGb, node } = machine;
  process.stdout.write(`\nMachine: ${cores} x ${cpu}, ${memoryGb} GB, Node ${node}, `);
  process.stdout.write(`load average at start ${machine.loadAverageAtStart.join(' / ')}\n`);
  process.stdout.write(`Wrote ${join(here, 'results.json')}\n`);
}

function formatTable(rows: SizeResult[]): string {
  const header = [
    'suppliers', 'nodes', 'edges', 'analysis s', 'cpu s', 'peak RSS MB', 'single rem. s',
    'one-at-a-time s (est.)', 'speed-up', 'betweenness s', 'graphology s', 'vs graphology',
    'closeness s', 'closeness',
  ];
  const cells = rows.map((r) => [
    String(r.suppliers),
    String(r.nodes),
    String(r.edges),
    r.analysisSeconds.toFixed(2),
    r.analysisCpuSeconds.toFixed(2),
    r.peakRssMb.toFixed(0),
    r.stageSeconds['single removals']!.toFixed(2),
    r.oneAtATime.extrapolatedSeconds.toFixed(1),
    `${r.oneAtATime.speedUp.toFixed(1)}x`,
    r.stageSeconds['betweenness']!.toFixed(2),
    r.graphology.seconds === null ? 'not run' : r.graphology.seconds.toFixed(1),
    r.graphology.speedUpOfSubset === null ? '-' : `${r.graphology.speedUpOfSubset.toFixed(0)}x`,
    r.stageSeconds['closeness']!.toFixed(2),
    r.closenessMethod.method === 'exact'
      ? 'exact'
      : `${r.closenessMethod.pivots} pivots, RSE <= ` +
        `${(100 * r.closenessMethod.maxRelativeStandardError).toFixed(2)} %`,
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...cells.map((c) => c[i]!.length)));
  const line = (row: string[]) => row.map((c, i) => c.padStart(widths[i]!)).join('  ');
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...cells.map(line), ''].join('\n');
}

/** What tests/bench/measure-import.ts prints. */
interface ImportResult {
  suppliers: number;
  sourcingRows: number;
  bytes: number;
  parseSeconds: number;
  commitSeconds: number;
  totalSeconds: number;
  peakRssMb: number;
  uploadSeconds: number;
  secondCommitSeconds: number;
  servicePeakRssMb: number;
  serviceNodeFlags: string[];
}

function formatImport(r: ImportResult): string {
  const mb = (r.bytes / 2 ** 20).toFixed(1);
  return [
    '',
    `Import of ${r.suppliers} suppliers and ${r.sourcingRows} Sourcing rows (${mb} MB .xlsx):`,
    `  parse and validate ${r.parseSeconds.toFixed(2)} s + commit ${r.commitSeconds.toFixed(2)} s` +
      ` = ${r.totalSeconds.toFixed(2)} s, peak RSS ${r.peakRssMb} MB`,
    `  through the import service (upload, check, then commit with the changes against the` +
      ` previous version): ${(r.uploadSeconds + r.secondCommitSeconds).toFixed(2)} s,` +
      ` peak RSS ${r.servicePeakRssMb} MB (node ${r.serviceNodeFlags.join(' ')})`,
    '',
  ].join('\n');
}
