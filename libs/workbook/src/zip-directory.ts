/**
 * Reads a zip archive's central directory (PKWARE APPNOTE 6.3.10, sections 4.3.12-4.3.16 and
 * the ZIP64 records of 4.3.14-4.3.15) without inflating anything, so the entry count and the
 * declared uncompressed total can be checked before any parser sees the archive. Every offset is
 * bounds-checked: a truncated or crafted archive yields an error text, never an exception.
 */
import { formatBytes, type WorkbookLimits } from './limits';

/** One file of the archive as its central directory describes it. */
export interface ZipEntry {
  name: string;
  /** 0 = stored, 8 = deflated; others are refused when read. */
  method: number;
  isEncrypted: boolean;
  compressedSize: number;
  uncompressedSize: number;
  /** The CRC-32 of the uncompressed data, as the directory declares it. */
  crc32: number;
  /** Offset of the entry's compressed bytes in the archive. */
  dataOffset: number;
}

/** The entries, or the reason the archive is refused. */
export type ZipDirectory = { entries: ZipEntry[] } | { error: string };

const END_RECORD = 0x06054b50;
const ZIP64_LOCATOR = 0x07064b50;
const ZIP64_END_RECORD = 0x06064b50;
const CENTRAL_HEADER = 0x02014b50;
const LOCAL_HEADER = 0x04034b50;
const MAX_COMMENT = 0xffff;
const CORRUPT = 'the zip archive is truncated or corrupt';

/** The archive's entries after the entry-count and uncompressed-size limits are checked. */
export function readZipDirectory(data: Uint8Array, limits: WorkbookLimits): ZipDirectory {
  const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
  const end = findEndRecord(view);
  if (end < 0) {
    return { error: `${CORRUPT}: its directory (end record) was not found` };
  }
  let count = view.getUint16(end + 10, true);
  let directorySize = view.getUint32(end + 12, true);
  let directoryOffset = view.getUint32(end + 16, true);
  if (count === 0xffff || directorySize === 0xffffffff || directoryOffset === 0xffffffff) {
    const zip64 = readZip64End(view, end);
    if (zip64 === null) {
      return { error: `${CORRUPT}: its ZIP64 directory record is missing` };
    }
    ({ count, directorySize, directoryOffset } = zip64);
  }
  if (count > limits.maxZipEntries) {
    return {
      error: `the archive has ${count} entries; the limit is ${limits.maxZipEntries} entries`,
    };
  }
  if (directoryOffset + directorySize > end) {
    return { error: `${CORRUPT}: its directory lies outside the file` };
  }
  const entries: ZipEntry[] = [];
  let offset = directoryOffset;
  let total = 0;
  for (let index = 0; index < count; index += 1) {
    const parsed = readCentralHeader(view, offset, directoryOffset + directorySize);
    if (typeof parsed === 'string') {
      return { error: `${CORRUPT}: ${parsed}` };
    }
    const dataOffset = locateData(view, parsed.localOffset, directoryOffset);
    if (dataOffset < 0 || dataOffset + parsed.entry.compressedSize > directoryOffset) {
      return { error: `${CORRUPT}: the data of "${parsed.entry.name}" is cut off` };
    }
    entries.push({ ...parsed.entry, dataOffset });
    total += parsed.entry.uncompressedSize;
    offset = parsed.next;
  }
  if (total > limits.maxUncompressedBytes) {
    return {
      error:
        `the archive would unpack to ${total} bytes (${formatBytes(total)}); the limit is ` +
        `${limits.maxUncompressedBytes} bytes (${formatBytes(limits.maxUncompressedBytes)})`,
    };
  }
  return { entries };
}

function findEndRecord(view: DataView): number {
  const lowest = Math.max(0, view.byteLength - 22 - MAX_COMMENT);
  for (let at = view.byteLength - 22; at >= lowest; at -= 1) {
    if (view.getUint32(at, true) === END_RECORD) {
      const commentLength = view.getUint16(at + 20, true);
      if (at + 22 + commentLength <= view.byteLength) {
        return at;
      }
    }
  }
  return -1;
}

function readZip64End(
  view: DataView,
  end: number,
): { count: number; directorySize: number; directoryOffset: number } | null {
  const locator = end - 20;
  if (locator < 0 || view.getUint32(locator, true) !== ZIP64_LOCATOR) {
    return null;
  }
  const record = readUint64(view, locator + 8);
  const isRecord = record !== null && record + 56 <= locator &&
    view.getUint32(record, true) === ZIP64_END_RECORD;
  if (record === null || !isRecord) {
    return null;
  }
  const count = readUint64(view, record + 32);
  const directorySize = readUint64(view, record + 40);
  const directoryOffset = readUint64(view, record + 48);
  if (count === null || directorySize === null || directoryOffset === null) {
    return null;
  }
  return { count, directorySize, directoryOffset };
}

interface CentralHeader {
  entry: Omit<ZipEntry, 'dataOffset'>;
  localOffset: number;
  next: number;
}

function readCentralHeader(view: DataView, at: number, limit: number): CentralHeader | string {
  if (at + 46 > limit || view.getUint32(at, true) !== CENTRAL_HEADER) {
    return 'a directory entry is damaged';
  }
  const flags = view.getUint16(at + 8, true);
  const method = view.getUint16(at + 10, true);
  const crc32 = view.getUint32(at + 16, true);
  let compressedSize = view.getUint32(at + 20, true);
  let uncompressedSize = view.getUint32(at + 24, true);
  const nameLength = view.getUint16(at + 28, true);
  const extraLength = view.getUint16(at + 30, true);
  const commentLength = view.getUint16(at + 32, true);
  let localOffset = view.getUint32(at + 42, true);
  const next = at + 46 + nameLength + extraLength + commentLength;
  if (next > limit) {
    return 'a directory entry runs past the directory';
  }
  const nameBytes = new Uint8Array(view.buffer, view.byteOffset + at + 46, nameLength);
  const name = new TextDecoder('utf-8').decode(nameBytes);
  // ZIP64 extra field (id 1): only the sizes that overflowed are present, in this order.
  let extra = at + 46 + nameLength;
  const extraEnd = extra + extraLength;
  while (extra + 4 <= extraEnd) {
    const id = view.getUint16(extra, true);
    const size = view.getUint16(extra + 2, true);
    if (id === 1) {
      let field = extra + 4;
      const take = (): number | null => {
        if (field + 8 > extra + 4 + size) {
          return null;
        }
        const value = readUint64(view, field);
        field += 8;
        return value;
      };
      if (uncompressedSize === 0xffffffff) {
        uncompressedSize = take() ?? Number.POSITIVE_INFINITY;
      }
      if (compressedSize === 0xffffffff) {
        compressedSize = take() ?? Number.POSITIVE_INFINITY;
      }
      if (localOffset === 0xffffffff) {
        localOffset = take() ?? Number.POSITIVE_INFINITY;
      }
    }
    extra += 4 + size;
  }
  if (![compressedSize, uncompressedSize, localOffset].every(Number.isFinite)) {
    return `the sizes of "${name}" are unreadable`;
  }
  const entry = {
    name, method, isEncrypted: (flags & 1) === 1, compressedSize, uncompressedSize, crc32,
  };
  return { entry, localOffset, next };
}

function locateData(view: DataView, localOffset: number, limit: number): number {
  if (localOffset + 30 > limit || view.getUint32(localOffset, true) !== LOCAL_HEADER) {
    return -1;
  }
  const nameLength = view.getUint16(localOffset + 26, true);
  const extraLength = view.getUint16(localOffset + 28, true);
  return localOffset + 30 + nameLength + extraLength;
}

function readUint64(view: DataView, at: number): number | null {
  if (at + 8 > view.byteLength) {
    return null;
  }
  const value = view.getUint32(at, true) + view.getUint32(at + 4, true) * 2 ** 32;
  return Number.isSafeInteger(value) ? value : null;
}
