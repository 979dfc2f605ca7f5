/**
 * Keeps docs/import-format.md in step with the reader: every template column is in the doc's
 * table under its sheet, bold exactly when required, and the limits table shows the defaults.
 */
import { readFileSync } from 'node:fs';
import { SHEET_NAMES } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { DEFAULT_WORKBOOK_LIMITS } from './limits';
import { TEMPLATE_FIELDS } from './template-fields';

const doc = readFileSync(new URL('../../../docs/import-format.md', import.meta.url), 'utf8');

/** The doc's column table as [sheet, column, isRequired, blank means], sheets carried down. */
function documentedColumns(): [string, string, boolean, string][] {
  const rows: [string, string, boolean, string][] = [];
  let sheet = '';
  for (const line of doc.split('\n')) {
    const cells = line.split('|').map((cell) => cell.trim());
    if (cells.length < 7 || cells[2] === 'column' || cells[2]?.startsWith('---')) {
      continue;
    }
    sheet = cells[1] === '' ? sheet : (cells[1] as string);
    const column = cells[2] as string;
    const isRequired = column.startsWith('**');
    rows.push([sheet, column.replaceAll('*', ''), isRequired, cells[4] as string]);
  }
  return rows;
}

describe('docs/import-format.md', () => {
  it('lists every template column under its sheet, bold when required', () => {
    const expected = SHEET_NAMES.flatMap((sheet) => TEMPLATE_FIELDS[sheet]
      .map((field): [string, string, boolean] => [sheet, field.field, field.required]));
    expect(documentedColumns().map((row) => row.slice(0, 3))).toEqual(expected);
  });

  it('gives the blank value of each column as the reader applies it', () => {
    const blanks = new Map(documentedColumns().map((row) => [`${row[0]}.${row[1]}`, row[3]]));
    for (const sheet of SHEET_NAMES) {
      for (const field of TEMPLATE_FIELDS[sheet]) {
        const written = field.default === undefined
          ? (field.required ? 'not allowed' : field.kind === 'text' ? 'empty' : 'not known')
          : field.default === true ? 'yes' : String(field.default);
        expect(blanks.get(`${sheet}.${field.field}`), `${sheet}.${field.field}`).toBe(written);
      }
    }
  });

  it('states the default limits', () => {
    expect(DEFAULT_WORKBOOK_LIMITS).toEqual({ maxBytes: 20 * 2 ** 20, maxRows: 250_000,
      maxUncompressedBytes: 200 * 2 ** 20, maxZipEntries: 2_000 });
    expect(doc).toContain('| file size | 20 MB |');
    expect(doc).toContain('| rows, over all sheets together (header rows included) | 250,000 |');
    expect(doc).toContain('| size once unpacked (an `.xlsx` or `.zip` is compressed) | 200 MB |');
    expect(doc).toContain('| files inside an `.xlsx` or `.zip` | 2,000 |');
  });
});
