/**
 * Sets every entry's modification time in a zip archive written by this library to one fixed
 * date, so the same model always gives byte-identical files (the zip writer stamps entries with
 * the current time). Only the MS-DOS time and date fields of the local and central headers
 * change (PKWARE APPNOTE 6.3.10, 4.3.7 and 4.3.12); the CRCs cover the data, not these fields.
 */

/** 2024-01-01 00:00:00 in MS-DOS format: ((year - 1980) << 9) | (month << 5) | day. */
const FIXED_DOS_DATE = ((2024 - 1980) << 9) | (1 << 5) | 1;
const FIXED_DOS_TIME = 0;

/** A copy of the archive with fixed entry times; bytes it cannot parse are returned as they are. */
export function withFixedTimestamps(archive: Uint8Array): Uint8Array {
  const patched = archive.slice();
  const view = new DataView(patched.buffer);
  let end = -1;
  for (let at = patched.length - 22; at >= Math.max(0, patched.length - 22 - 0xffff); at -= 1) {
    if (view.getUint32(at, true) === 0x06054b50) {
      end = at;
      break;
    }
  }
  if (end < 0) {
    return archive;
  }
  const count = view.getUint16(end + 10, true);
  let at = view.getUint32(end + 16, true);
  for (let index = 0; index < count; index += 1) {
    if (at + 46 > end || view.getUint32(at, true) !== 0x02014b50) {
      return archive;
    }
    const local = view.getUint32(at + 42, true);
    if (local + 30 > at || view.getUint32(local, true) !== 0x04034b50) {
      return archive;
    }
    view.setUint16(at + 12, FIXED_DOS_TIME, true);
    view.setUint16(at + 14, FIXED_DOS_DATE, true);
    view.setUint16(local + 10, FIXED_DOS_TIME, true);
    view.setUint16(local + 12, FIXED_DOS_DATE, true);
    at += 46 + view.getUint16(at + 28, true) + view.getUint16(at + 30, true) +
      view.getUint16(at + 32, true);
  }
  return patched;
}
