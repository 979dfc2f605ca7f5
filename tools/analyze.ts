/**
 * The command-line analyser: `npm run analyze -- <workbook> [--json <out.json>] [--fail A,B]
 * [--fail-country XX] [--top N] [--closeness auto|exact|sampled]`. Reads a template workbook (xlsx, csv or zip of CSVs, or a folder
 * of CSVs), analyses it with the same engine the server runs, prints the ranking and writes the
 * JSON of the analysis contract. Exit codes: 0 done, 1 the workbook has errors, 2 bad arguments.
 */
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { parseArgs } from 'node:util';
import { analyse, UnknownSupplierError, type AnalysisResult } from '@keelson/supply-graph';
import { readCsvFiles, readWorkbook, type ReadResult } from '@keelson/workbook';
import { formatRanking, progressBar } from './analyze-output';

const USAGE =
  'Usage: npm run analyze -- <workbook.xlsx|.csv|.zip|folder> [--json out.json] ' +
  '[--fail S1,S2] [--fail-country XX] [--top N] [--closeness auto|exact|sampled]';
const CLOSENESS_MODES = ['auto', 'exact', 'sampled'] as const;

async function main(argv: string[]): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        json: { type: 'string' },
        fail: { type: 'string' },
        'fail-country': { type: 'string' },
        top: { type: 'string', default: '20' },
        closeness: { type: 'string', default: 'auto' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n${USAGE}\n`);
    return 2;
  }
  const { values, positionals } = parsed;
  if (values.help) {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  if (positionals.length !== 1) {
    process.stderr.write(`Give exactly one workbook.\n${USAGE}\n`);
    return 2;
  }
  const top = Number(values.top);
  if (!Number.isInteger(top) || top < 0) {
    process.stderr.write(`--top must be a whole number, not "${values.top}".\n`);
    return 2;
  }
  const closeness = CLOSENESS_MODES.find((mode) => mode === values.closeness);
  if (closeness === undefined) {
    process.stderr.write(`--closeness must be auto, exact or sampled, not "${values.closeness}".\n`);
    return 2;
  }
  const path = positionals[0]!;
  let read: ReadResult;
  try {
    read = await readInput(path);
  } catch (error) {
    process.stderr.write(`Cannot read ${path}: ${(error as Error).message}\n`);
    return 2;
  }
  if (read.errors.length > 0 || !read.model) {
    process.stderr.write(`${path}: ${read.errors.length} error(s); nothing analysed.\n`);
    for (const error of read.errors) {
      const where = [error.sheet, error.row && `row ${error.row}`, error.column].filter(Boolean).join(', ');
      process.stderr.write(`  ${where || 'workbook'}: ${error.message}\n`);
    }
    if (values.json) {
      writeFileSync(values.json, JSON.stringify({ errors: read.errors, warnings: read.warnings }, null, 2));
    }
    return 1;
  }

  const fail = values.fail?.split(',').map((code) => code.trim()).filter(Boolean);
  const isTerminal = process.stderr.isTTY === true;
  let result: AnalysisResult;
  try {
    result = analyse(read.model, {
      fail,
      failCountry: values['fail-country'],
      closeness,
      onProgress: isTerminal ? (fraction, stage) => process.stderr.write(`\r${progressBar(fraction, stage)}`) : undefined,
    });
  } catch (error) {
    if (isTerminal) process.stderr.write('\n');
    if (error instanceof UnknownSupplierError) {
      process.stderr.write(`${error.message}\n`);
      return 2;
    }
    throw error;
  }
  if (isTerminal) process.stderr.write('\n');

  const output = { ...result, warnings: read.warnings };
  process.stdout.write(formatRanking(output, top));
  if (values.json) {
    writeFileSync(values.json, JSON.stringify(output, null, 2));
    process.stdout.write(`\nWrote ${values.json}\n`);
  }
  return 0;
}

/** Reads a workbook file, a zip of CSVs, one CSV, or a folder of CSV files. */
async function readInput(path: string): Promise<ReadResult> {
  if (statSync(path).isDirectory()) {
    const files = readdirSync(path)
      .filter((name) => name.toLowerCase().endsWith('.csv'))
      .map((name) => ({ name, data: new Uint8Array(readFileSync(join(path, name))) }));
    return readCsvFiles(files);
  }
  return readWorkbook(new Uint8Array(readFileSync(path)), { fileName: basename(path) });
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (error: unknown) => {
    process.stderr.write(`Analysis failed: ${(error as Error).stack ?? String(error)}\n`);
    process.exit(1);
  },
);
