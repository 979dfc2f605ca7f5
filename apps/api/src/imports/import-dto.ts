/** Stored import rows as the API's DTOs. */
import type {
  ImportBatchDto,
  ImportMappingDto,
  SheetCounts,
  WorkbookMapping,
} from '@keelson/contracts';
import type { ImportBatchRow } from '@keelson/db';
import type { ImportMappingRow } from './imports.repository';

/** What a batch DTO needs beyond its row. */
export interface BatchExtras {
  /** Name of the uploader, when the user still exists. */
  createdByName: string | null;
  suggestedMapping: { id: number; name: string } | null;
  networkVersionId: number | null;
}

/** A batch row as {@link ImportBatchDto}. */
export function toImportBatchDto(row: ImportBatchRow, extras: BatchExtras): ImportBatchDto {
  return {
    id: row.id,
    status: row.status,
    fileName: row.fileName,
    fileSize: row.fileSize,
    sha256: row.sha256,
    format: row.format,
    createdBy: row.createdBy === null || extras.createdByName === null
      ? null
      : { id: row.createdBy, name: extras.createdByName },
    createdAt: row.createdAt,
    sheets: row.sheets,
    counts: row.counts as SheetCounts,
    errorCount: row.errorCount,
    warningCount: row.warningCount,
    mapping: (row.mapping as WorkbookMapping | null) ?? null,
    suggestedMapping: extras.suggestedMapping,
    networkVersionId: extras.networkVersionId,
    committedAt: row.committedAt,
  };
}

/** A mapping row as {@link ImportMappingDto}. */
export function toImportMappingDto(
  row: ImportMappingRow,
  createdByName: string | null,
): ImportMappingDto {
  return {
    id: row.id,
    name: row.name,
    mapping: row.mapping as WorkbookMapping,
    headerSignature: row.headerSignature,
    createdBy: row.createdBy === null || createdByName === null
      ? null
      : { id: row.createdBy, name: createdByName },
    createdAt: row.createdAt,
    lastUsedAt: row.lastUsedAt,
  };
}
