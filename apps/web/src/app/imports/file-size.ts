/** The upload limit the server applies unless `UPLOAD_MAX_BYTES` says otherwise. */
export const DEFAULT_UPLOAD_LIMIT_BYTES = 20 * 1024 * 1024;

const UNITS = ['bytes', 'KB', 'MB', 'GB'] as const;

/**
 * A byte count for people: "812 bytes", "14.2 KB", "20 MB" (binary multiples, as the server's
 * limit is set, one decimal below 10 and whole numbers above).
 */
export function formatFileSize(bytes: number): string {
  let value = Math.max(0, bytes);
  let unit = 0;
  while (value >= 1024 && unit < UNITS.length - 1) {
    value /= 1024;
    unit += 1;
  }
  if (unit === 0) {
    return `${value} ${value === 1 ? 'byte' : 'bytes'}`;
  }
  const rounded = value < 10 ? Math.round(value * 10) / 10 : Math.round(value);
  return `${rounded} ${UNITS[unit]}`;
}

/** The file kinds the import accepts, as the picker's `accept` attribute lists them. */
export const ACCEPTED_EXTENSIONS = ['.xlsx', '.csv', '.zip'] as const;

/** True when the file name ends in one of {@link ACCEPTED_EXTENSIONS}. */
export function isAcceptedFileName(name: string): boolean {
  const lower = name.toLowerCase();
  return ACCEPTED_EXTENSIONS.some((extension) => lower.endsWith(extension));
}
