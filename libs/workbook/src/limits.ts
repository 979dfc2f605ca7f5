/**
 * Bounds on what an uploaded file may make the reader do. An upload is untrusted input: the
 * size, the zip directory and the row count are checked before and while parsing, so a crafted
 * file is refused with an error instead of exhausting memory or time.
 */

/** Limits applied to every file read. */
export interface WorkbookLimits {
  /** Largest accepted file, in bytes (for a zip: the archive itself). */
  maxBytes: number;
  /** Most rows over all sheets (or all CSV files) together, header rows included. */
  maxRows: number;
  /** Largest total of the archive's entries once uncompressed, in bytes. */
  maxUncompressedBytes: number;
  /** Most entries a zip archive (an xlsx is one) may hold. */
  maxZipEntries: number;
}

/** The defaults: 20 MB files, 250 000 rows, 200 MB uncompressed, 2 000 zip entries. */
export const DEFAULT_WORKBOOK_LIMITS: Readonly<WorkbookLimits> = Object.freeze({
  maxBytes: 20 * 1024 * 1024,
  maxRows: 250_000,
  maxUncompressedBytes: 200 * 1024 * 1024,
  maxZipEntries: 2_000,
});

/** The defaults overridden by whatever `limits` gives. */
export function resolveLimits(limits: Partial<WorkbookLimits> | undefined): WorkbookLimits {
  return { ...DEFAULT_WORKBOOK_LIMITS, ...(limits ?? {}) };
}

/** Bytes as a short human text ("20 MB", "512 bytes") for error messages. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) {
    return `${Number((bytes / (1024 * 1024)).toFixed(1))} MB`;
  }
  if (bytes >= 1024) {
    return `${Number((bytes / 1024).toFixed(1))} KB`;
  }
  return `${bytes} bytes`;
}
