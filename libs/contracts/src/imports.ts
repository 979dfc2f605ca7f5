/**
 * The buyer's import: how a file's sheets and columns map to the template, what the mapping
 * step shows of a file, import batches (every upload, kept even when rejected), network
 * versions (each commit), the problems table and the automation route's answers.
 */
import { z } from 'zod';
import type { SheetName, WorkbookError, WorkbookWarning } from './supply-model';

/** How one template sheet is found in a buyer's file. */
export interface SheetMapping {
  /** The file's sheet to read for this template sheet. */
  sheetName?: string;
  /** The 1-based row that holds the headers; default 1. */
  headerRow?: number;
  /** Template field (snake_case) -> the file's header text for it. */
  columns?: Record<string, string>;
}

/** Mappings of the template sheets that are not found by their own names. */
export type WorkbookMapping = Partial<Record<SheetName, SheetMapping>>;

/** A sheet of the file as the mapping step shows it. */
export interface InspectedSheet {
  name: string;
  /** Rows holding any value. */
  rowCount: number;
  /** The row that looks most like headers (1-based), or null for an empty sheet. */
  headerRow: number | null;
  headers: string[];
  /** Up to 5 non-blank rows below the header row. */
  sampleRows: (string | number | boolean | null)[][];
  /**
   * The first non-blank rows of the sheet (up to 25), so the mapping step can preview another
   * header row the buyer types without asking the server again.
   */
  topRows: InspectedRow[];
}

/** One row of a sheet as the mapping step previews it. */
export interface InspectedRow {
  /** The sheet's own 1-based row number. */
  row: number;
  cells: (string | number | boolean | null)[];
  /** The row's non-blank cells as header texts, as the check would read them. */
  headers: string[];
}

/** What the file offers for one template sheet. */
export interface SheetSuggestion {
  isRequired: boolean;
  /** The file sheet that looks like this template sheet, or null. */
  sheetName: string | null;
  headerRow: number | null;
  /** Template field -> the file's header that looks like it. */
  columns: Record<string, string>;
  /** Required fields with no matching header. */
  missingColumns: string[];
  /** Headers of the sheet not matched to a field (kept as attributes on import). */
  unmatchedHeaders: string[];
}

/** What a file holds, for the mapping step. */
export interface WorkbookInspection {
  format: 'xlsx' | 'csv' | 'zip';
  /** Errors that stop the file from being read at all (size, not a spreadsheet ...). */
  errors: WorkbookError[];
  sheets: InspectedSheet[];
  suggestions: Record<SheetName, SheetSuggestion>;
  /** Required template sheets with no suggested file sheet. */
  missingSheets: SheetName[];
}

const sheetMappingSchema = z
  .object({
    sheetName: z.string().min(1).max(200).optional(),
    headerRow: z.number().int().min(1).max(1000).optional(),
    columns: z.record(z.string().min(1).max(60), z.string().min(1).max(200)).optional(),
  })
  .strict();

/** A {@link WorkbookMapping} as received from a client. */
export const workbookMappingSchema = z
  .object({
    Plants: sheetMappingSchema.optional(),
    Products: sheetMappingSchema.optional(),
    BOM: sheetMappingSchema.optional(),
    Suppliers: sheetMappingSchema.optional(),
    Sourcing: sheetMappingSchema.optional(),
    Stock: sheetMappingSchema.optional(),
  })
  .strict();

/**
 * Where an import batch stands:
 * - `needs_mapping`: a required sheet or column was not found; the buyer maps them;
 * - `rejected`: the file was read but has errors (or cannot be read at all);
 * - `ready`: no errors; it can be committed;
 * - `committed`: it became a network version.
 */
export const IMPORT_STATUSES = ['needs_mapping', 'rejected', 'ready', 'committed'] as const;
/** One of {@link IMPORT_STATUSES}. */
export type ImportStatus = (typeof IMPORT_STATUSES)[number];

/** Data rows per template sheet. */
export type SheetCounts = Partial<Record<SheetName, number>>;

/** A saved column mapping, offered again for a file with the same headers. */
export interface ImportMappingDto {
  id: number;
  name: string;
  mapping: WorkbookMapping;
  /** SHA-256 of the file's sheet names and header rows, as matched. */
  headerSignature: string;
  createdBy: { id: number; name: string } | null;
  createdAt: string;
  lastUsedAt: string | null;
}

/** POST /api/import-mappings body. */
export const saveImportMappingSchema = z.object({
  name: z.string().trim().min(1).max(120),
  /** The batch whose file the mapping was made for (gives the header signature). */
  batchId: z.number().int().positive(),
  mapping: workbookMappingSchema,
});
/** POST /api/import-mappings body. */
export type SaveImportMappingInput = z.infer<typeof saveImportMappingSchema>;

/** GET /api/imports/limits answer: what the server accepts, for the upload screen to state. */
export interface ImportLimitsDto {
  /** The largest upload in bytes (the server's UPLOAD_MAX_BYTES). */
  uploadMaxBytes: number;
}

/** An upload and what became of it. */
export interface ImportBatchDto {
  id: number;
  status: ImportStatus;
  fileName: string;
  fileSize: number;
  sha256: string;
  format: 'xlsx' | 'csv' | 'zip' | null;
  createdBy: { id: number; name: string } | null;
  createdAt: string;
  /** Sheets of the file and their row counts (rows holding any value). */
  sheets: { name: string; rowCount: number }[];
  /** Data rows read per template sheet. */
  counts: SheetCounts;
  errorCount: number;
  warningCount: number;
  /** The mapping the last check used (null: the template's own names). */
  mapping: WorkbookMapping | null;
  /** A saved mapping whose header signature matches this file, if any. */
  suggestedMapping: { id: number; name: string } | null;
  networkVersionId: number | null;
  committedAt: string | null;
}

/** GET /api/imports query: a page of batches, newest first. */
export const listImportBatchesQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(25),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  status: z.enum(IMPORT_STATUSES).optional(),
});
/** GET /api/imports query. */
export type ListImportBatchesQuery = z.infer<typeof listImportBatchesQuerySchema>;

/** GET /api/import-mappings answer. */
export interface ImportMappingListDto {
  items: ImportMappingDto[];
}

/** 413 answer code of an upload over the size limit. */
export const FILE_TOO_LARGE = 'file_too_large';

/** POST /api/imports/:id/check body: check the stored file again with a mapping. */
export const checkImportSchema = z.object({
  mapping: workbookMappingSchema.optional(),
  /** Use a saved mapping instead (its `lastUsedAt` is updated). */
  mappingId: z.number().int().positive().optional(),
});
/** POST /api/imports/:id/check body. */
export type CheckImportInput = z.infer<typeof checkImportSchema>;

/** One row of the problems table: an error or a warning of a batch. */
export interface ImportProblemDto {
  kind: 'error' | 'warning';
  sheet: string | null;
  row: number | null;
  column: string | null;
  value: string | number | boolean | null;
  message: string;
  cell: string | null;
}

/** The fields the problems table sorts by. */
export const IMPORT_PROBLEM_SORT_FIELDS = ['sheet', 'row', 'column', 'value', 'message'] as const;

/** GET /api/imports/:id/problems query. */
export const listImportProblemsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(50),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  kind: z.enum(['error', 'warning']).optional(),
  sheet: z.string().trim().max(60).optional(),
  /** Text to find in the column, value or message. */
  q: z.string().trim().max(120).optional(),
  sort: z.enum(IMPORT_PROBLEM_SORT_FIELDS).default('sheet'),
  order: z.enum(['asc', 'desc']).default('asc'),
});
/** GET /api/imports/:id/problems query. */
export type ListImportProblemsQuery = z.infer<typeof listImportProblemsQuerySchema>;

/** What a commit changed against the previous network version. */
export interface NetworkChangesDto {
  previousVersionId: number | null;
  suppliersAdded: string[];
  suppliersRemoved: string[];
  /** Suppliers whose fields (name, country, recovery weeks ...) changed. */
  suppliersChanged: string[];
  /** Sourcing rows (buyer, item, supplier) added, removed, or with changed share/qualification. */
  sourcingAdded: number;
  sourcingRemoved: number;
  sourcingChanged: number;
  productsAdded: string[];
  productsRemoved: string[];
  productsChanged: string[];
}

/** 201 answer of a commit (POST /api/imports?commit=true and POST /api/imports/:id/commit). */
export interface ImportCommitDto {
  /** The import batch id. */
  id: number;
  networkVersionId: number;
  counts: SheetCounts;
  warnings: WorkbookWarning[];
  changes: NetworkChangesDto;
}

/** 422 answer when a file has errors: `{error: {code: 'invalid_workbook', details}}`. */
export const INVALID_WORKBOOK = 'invalid_workbook';

/** A committed network: the data one import brought, frozen. */
export interface NetworkVersionDto {
  id: number;
  label: string;
  createdAt: string;
  createdBy: { id: number; name: string } | null;
  importBatchId: number;
  fileName: string;
  previousVersionId: number | null;
  counts: {
    plants: number;
    products: number;
    items: number;
    bomLines: number;
    suppliers: number;
    sourcing: number;
    stock: number;
  };
  changes: NetworkChangesDto;
  /** True for the most recent version. */
  isLatest: boolean;
}
