/**
 * CRC-32 against the standard check value (the CRC of the ASCII text "123456789" is
 * 0xCBF43926 for CRC-32/ISO-HDLC, as listed in Greg Cook's catalogue of parametrised CRC
 * algorithms), and its use on zip entries: a damaged entry of the right size is refused.
 */
import { zipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import { Crc32 } from './crc32';
import { utf8 } from './fixture-workbooks';
import { readWorkbook } from './read-workbook';

describe('Crc32', () => {
  it('gives the check value 0xCBF43926 for "123456789", also when fed in pieces', () => {
    const whole = new Crc32();
    whole.update(utf8('123456789'));
    expect(whole.digest()).toBe(0xcbf43926);
    const pieces = new Crc32();
    pieces.update(utf8('1234'));
    pieces.update(utf8(''));
    pieces.update(utf8('56789'));
    expect(pieces.digest()).toBe(0xcbf43926);
  });

  it('gives 0 for no bytes', () => {
    expect(new Crc32().digest()).toBe(0);
  });
});

describe('damaged zip entries', () => {
  it('refuses a stored entry whose bytes changed but whose size did not', async () => {
    const text = 'plant_code,plant_name\r\nP1,Augsburg\r\n';
    const zip = zipSync({ 'Plants.csv': utf8(text) }, { level: 0 });
    const at = zip.indexOf('A'.charCodeAt(0), 30);
    zip[at] = 'B'.charCodeAt(0);
    const result = await readWorkbook(zip);
    expect(result.errors.map((error) => error.message)).toEqual([
      'the zip archive is corrupt: the checksum of "Plants.csv" does not match',
    ]);
  });
});
