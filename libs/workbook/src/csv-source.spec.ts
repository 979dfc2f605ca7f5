/**
 * CSV reading per RFC 4180 (quoted fields, doubled quotes, CRLF), with the byte-order mark and
 * the rule that only "," separates. Expected rows are written out by hand.
 */
import { describe, expect, it } from 'vitest';
import { decodeText, isLikelyText, parseCsv, sheetNameOfFile } from './csv-source';

const rowsOf = (text: string) => {
  const outcome = parseCsv(text, 1000);
  if (!('rows' in outcome)) {
    throw new Error(`expected rows, got ${JSON.stringify(outcome)}`);
  }
  return outcome.rows;
};

describe('parseCsv', () => {
  it('splits on commas and numbers records from 1', () => {
    expect(rowsOf('a,b,c\n1,2,3\n')).toEqual([
      { row: 1, cells: ['a', 'b', 'c'] },
      { row: 2, cells: ['1', '2', '3'] },
    ]);
  });

  it('keeps commas, doubled quotes and line breaks inside quotes', () => {
    expect(rowsOf('"Müller, Guss","say ""hi""","two\r\nlines"\r\nx,y,z')).toEqual([
      { row: 1, cells: ['Müller, Guss', 'say "hi"', 'two\r\nlines'] },
      { row: 2, cells: ['x', 'y', 'z'] },
    ]);
  });

  it('treats CRLF, LF and CR alike and does not add a record for the final line end', () => {
    const cells = rowsOf('a\r\nb\nc\rd\r\n').map((row) => row.cells);
    expect(cells).toEqual([['a'], ['b'], ['c'], ['d']]);
  });

  it('does not split on semicolons', () => {
    expect(rowsOf('plant_code;plant_name\nP1;Augsburg')).toEqual([
      { row: 1, cells: ['plant_code;plant_name'] },
      { row: 2, cells: ['P1;Augsburg'] },
    ]);
  });

  it('keeps blank lines as rows with empty cells (their numbers are kept)', () => {
    expect(rowsOf('a,b\n\n,\nc,d')).toEqual([
      { row: 1, cells: ['a', 'b'] },
      { row: 2, cells: [null] },
      { row: 3, cells: [null, null] },
      { row: 4, cells: ['c', 'd'] },
    ]);
  });

  it('strips a byte-order mark left in the text', () => {
    expect(rowsOf('\ufeffplant_code\nP1')[0]).toEqual({ row: 1, cells: ['plant_code'] });
  });

  it('reports an unclosed quote with the row it opened in', () => {
    expect(parseCsv('a,b\n1,"open\n2,3', 100)).toEqual({
      rows: [{ row: 1, cells: ['a', 'b'] }, { row: 2, cells: ['1', 'open\n2,3'] }],
      problem: { message: 'a quoted field is never closed (a " is missing)', row: 2 },
    });
  });

  it('stops past the row limit', () => {
    expect(parseCsv('a\nb\nc\nd\n', 3)).toEqual({ overLimit: true });
    expect(parseCsv('a\nb\nc\n', 3)).toHaveProperty('rows');
  });
});

describe('decodeText', () => {
  it('drops the UTF-8 byte-order mark and reads UTF-8', () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode('苏州,Müller')]);
    expect(decodeText(bytes)).toBe('苏州,Müller');
  });

  it('falls back to Windows-1252 for bytes that are not UTF-8', () => {
    // 0xFC is "ü" in Windows-1252 (and not valid UTF-8 on its own).
    expect(decodeText(new Uint8Array([0x4d, 0xfc, 0x6c, 0x6c, 0x65, 0x72]))).toBe('Müller');
  });

  it('reads UTF-16 little-endian with its mark', () => {
    const text = 'a,b';
    const bytes = new Uint8Array(2 + text.length * 2);
    bytes.set([0xff, 0xfe]);
    [...text].forEach((char, index) => {
      bytes[2 + index * 2] = char.charCodeAt(0);
    });
    expect(decodeText(bytes)).toBe('a,b');
  });
});

describe('isLikelyText and sheetNameOfFile', () => {
  it('tells text from binary', () => {
    expect(isLikelyText(new TextEncoder().encode('a,b\r\n\t1,2'))).toBe(true);
    expect(isLikelyText(new Uint8Array([0x61, 0x00, 0x62]))).toBe(false);
  });

  it('names a sheet after its file', () => {
    expect(sheetNameOfFile('exports/Plants.csv')).toBe('Plants');
    expect(sheetNameOfFile('C:\\data\\bom.CSV')).toBe('bom');
  });
});
