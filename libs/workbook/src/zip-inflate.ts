/**
 * Inflates zip entries under a hard cap. The central directory's declared sizes are checked
 * first (zip-directory.ts), but a crafted archive may declare small sizes and inflate to far
 * more; here each entry is inflated in small steps and stopped as soon as it passes its declared
 * size, so the later parser only ever sees archives whose real size is within the limits.
 */
import { Inflate } from 'fflate';
import { Crc32 } from './crc32';
import type { ZipEntry } from './zip-directory';

/** Bytes handed to the inflater per step; bounds one step's output to about 1 000 times this. */
const STEP_BYTES = 16 * 1024;

/** The inflated entry (when collected) or the reason it was refused. */
export type InflateOutcome = { bytes: Uint8Array | null; size: number } | { error: string };

/** Options of {@link inflateEntry}. */
export interface InflateEntryOptions {
  /** Keep and return the inflated bytes (otherwise they are only counted). */
  isCollected: boolean;
  /** Called with each inflated chunk, in order. */
  onChunk?: (chunk: Uint8Array) => void;
}

/** Inflates one entry, refusing it when its real size differs from the declared one. */
export function inflateEntry(
  archive: Uint8Array,
  entry: ZipEntry,
  options: InflateEntryOptions,
): InflateOutcome {
  if (entry.isEncrypted) {
    return { error: `"${entry.name}" in the archive is password-protected` };
  }
  const source = archive.subarray(entry.dataOffset, entry.dataOffset + entry.compressedSize);
  if (entry.method === 0) {
    if (source.length !== entry.uncompressedSize) {
      return { error: sizeMismatch(entry) };
    }
    const checksum = new Crc32();
    checksum.update(source);
    if (checksum.digest() !== entry.crc32) {
      return { error: checksumMismatch(entry) };
    }
    options.onChunk?.(source);
    return { bytes: options.isCollected ? source : null, size: source.length };
  }
  if (entry.method !== 8) {
    return { error: `"${entry.name}" uses an unsupported compression method (${entry.method})` };
  }
  const chunks: Uint8Array[] = [];
  const checksum = new Crc32();
  let size = 0;
  let isOversized = false;
  const inflater = new Inflate((chunk) => {
    size += chunk.length;
    if (size > entry.uncompressedSize) {
      isOversized = true;
      return;
    }
    checksum.update(chunk);
    options.onChunk?.(chunk);
    if (options.isCollected) {
      chunks.push(chunk.slice());
    }
  });
  try {
    for (let at = 0; at < source.length && !isOversized; at += STEP_BYTES) {
      const end = Math.min(at + STEP_BYTES, source.length);
      inflater.push(source.subarray(at, end), end === source.length);
    }
    if (source.length === 0) {
      inflater.push(source, true);
    }
  } catch {
    return { error: `the zip archive is corrupt: "${entry.name}" cannot be unpacked` };
  }
  if (isOversized || size !== entry.uncompressedSize) {
    return { error: sizeMismatch(entry) };
  }
  if (checksum.digest() !== entry.crc32) {
    return { error: checksumMismatch(entry) };
  }
  return { bytes: options.isCollected ? joinChunks(chunks, size) : null, size };
}

function sizeMismatch(entry: ZipEntry): string {
  return (
    `the zip archive is corrupt or crafted: "${entry.name}" does not unpack to the ` +
    `${entry.uncompressedSize} bytes its directory declares`
  );
}

function checksumMismatch(entry: ZipEntry): string {
  return `the zip archive is corrupt: the checksum of "${entry.name}" does not match`;
}

function joinChunks(chunks: readonly Uint8Array[], size: number): Uint8Array {
  const joined = new Uint8Array(size);
  let at = 0;
  for (const chunk of chunks) {
    joined.set(chunk, at);
    at += chunk.length;
  }
  return joined;
}
