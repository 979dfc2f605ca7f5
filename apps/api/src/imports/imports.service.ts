import type {
  CheckImportInput,
  ImportBatchDto,
  ImportCommitDto,
  ImportProblemDto,
  ListImportBatchesQuery,
  ListImportProblemsQuery,
  Page,
  WorkbookInspection,
  WorkbookMapping,
} from '@keelson/contracts';
import type { ImportBatchRow, KeelsonDatabase } from '@keelson/db';
import {
  inspectWorkbook,
  readWorkbook,
  writeErrorReport,
  writeTemplate,
  type WorkbookLimits,
} from '@keelson/workbook';
import { conflict, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import {
  checkFile,
  cleanFileName,
  errorsOf,
  sha256Of,
  storedErrors,
  storedWarnings,
  warningsOf,
  type FileCheck,
} from './import-check';
import { invalidWorkbook } from './import-errors';
import { alreadyCommitted, commitNetwork, type InsertVersion } from './import-commit';
import { toImportBatchDto } from './import-dto';
import { pageOfProblems, problemsOf } from './import-problems';
import { ImportsRepository } from './imports.repository';

/** What the imports service needs. */
export interface ImportsServiceDeps {
  db: KeelsonDatabase;
  now: () => Date;
  /** Reader limits; `maxBytes` should be the upload limit. */
  limits?: Partial<WorkbookLimits>;
  /** Writes a version; the real one unless a spec makes it fail. */
  insertVersion?: InsertVersion;
}

/** An uploaded file. */
export interface UploadedFile {
  fileName: string;
  data: Uint8Array;
}

/** Which mapping to read a file with: a saved one, one given in full, or none. */
export interface MappingChoice {
  mappingId?: number;
  mapping?: WorkbookMapping;
}

/**
 * The buyer's import: every upload becomes a batch (kept even when rejected, with its bytes),
 * checked against the template, optionally with a column mapping, then committed as a network
 * version in one transaction.
 */
export class ImportsService {
  private readonly batches: ImportsRepository;

  constructor(private readonly deps: ImportsServiceDeps) {
    this.batches = new ImportsRepository(deps.db);
  }

  /** Stores and checks an upload; the batch is recorded whatever the file holds. */
  async upload(
    actor: SessionUser,
    file: UploadedFile,
    choice: MappingChoice = {},
  ): Promise<{ batch: ImportBatchDto; check: FileCheck }> {
    const fileName = cleanFileName(file.fileName);
    const { mapping, mappingId } = this.resolveMapping(choice);
    const check = await checkFile(file.data, { fileName, mapping, limits: this.deps.limits });
    const row = this.batches.insertBatch({
      fileName,
      fileSize: file.data.length,
      sha256: sha256Of(file.data),
      createdBy: actor.id,
      createdAt: this.stamp(),
      mapping: mapping ?? null,
      mappingId,
      ...checkColumns(check),
    }, file.data);
    return { batch: this.dto(row), check };
  }

  /**
   * The automation route: upload, check and commit in one call. 422 `invalid_workbook` with
   * every error located when the file is not ready (the batch stays recorded).
   */
  async uploadAndCommit(
    actor: SessionUser,
    file: UploadedFile,
    choice: MappingChoice = {},
  ): Promise<ImportCommitDto> {
    const { batch, check } = await this.upload(actor, file, choice);
    if (check.status !== 'ready' || check.model === null) {
      throw invalidWorkbook(batch.id, check.errors);
    }
    return this.commitChecked(actor, batch.id, batch.fileName, check);
  }

  /** A page of batches, newest first. */
  list(query: ListImportBatchesQuery): Page<ImportBatchDto> {
    const { rows, total } = this.batches.listBatches(query);
    const names = this.batches.userNames(rows.map((row) => row.createdBy));
    const versions = this.batches.versionsOfBatches(rows.map((row) => row.id));
    return { items: rows.map((row) => this.dto(row, names, versions)), total };
  }

  /** One batch; 404 when unknown. */
  get(id: number): ImportBatchDto {
    return this.dto(this.requireBatch(id));
  }

  /** The inspection of the stored file, with a saved mapping or the batch's own. */
  async inspection(id: number, mappingId?: number): Promise<WorkbookInspection> {
    const batch = this.requireBatch(id);
    const mapping = mappingId === undefined
      ? (batch.mapping as WorkbookMapping | null) ?? undefined
      : this.requireMapping(mappingId);
    return inspectWorkbook(this.requireFile(batch), { fileName: batch.fileName, mapping,
      limits: this.deps.limits });
  }

  /** Reads the stored file again with a mapping and updates the batch. */
  async check(id: number, input: CheckImportInput): Promise<ImportBatchDto> {
    const batch = this.requireBatch(id);
    this.refuseCommitted(batch);
    const { mapping, mappingId } = this.resolveMapping(input);
    const check = await checkFile(this.requireFile(batch),
      { fileName: batch.fileName, mapping, limits: this.deps.limits });
    // A commit may have landed while the file was being read.
    this.refuseCommitted(this.requireBatch(id));
    const row = this.batches.updateBatch(id, { mapping: mapping ?? null, mappingId,
      ...checkColumns(check) });
    return this.dto(row);
  }

  /** Errors and warnings of a batch, filtered, sorted and paged. */
  problems(id: number, query: ListImportProblemsQuery): Page<ImportProblemDto> {
    return pageOfProblems(problemsOf(this.requireBatch(id)), query);
  }

  /** The buyer's file with its problem cells highlighted, and a name for the download. */
  async errorReport(id: number): Promise<{ fileName: string; data: Uint8Array }> {
    const batch = this.requireBatch(id);
    const errors = errorsOf(batch.errors);
    const warnings = warningsOf(batch.warnings);
    const options = { fileName: batch.fileName, limits: this.deps.limits };
    let data: Uint8Array;
    try {
      data = await writeErrorReport(this.requireFile(batch), errors, warnings, options);
    } catch {
      // A file the reader refused may not open at all: the report is then the problem list.
      data = await writeErrorReport(new Uint8Array(0), errors, warnings, options);
    }
    const stem = batch.fileName.replace(/\.[^.]*$/u, '') || 'import';
    return { fileName: `${stem}-problems.xlsx`, data };
  }

  /** Commits a ready batch: 409 when committed or not checked yet, 422 with errors. */
  async commit(actor: SessionUser, id: number): Promise<ImportCommitDto> {
    const batch = this.requireBatch(id);
    this.refuseCommitted(batch);
    if (batch.status === 'rejected') {
      throw invalidWorkbook(id, errorsOf(batch.errors));
    }
    if (batch.status === 'needs_mapping') {
      throw conflict('not_ready', `Import ${id} is not ready to commit: ${batch.errorCount} ` +
        'required sheets or columns were not found. Map them and check the file again.');
    }
    const read = await readWorkbook(this.requireFile(batch), { fileName: batch.fileName,
      mapping: (batch.mapping as WorkbookMapping | null) ?? undefined, limits: this.deps.limits });
    if (read.model === null) {
      throw invalidWorkbook(id, read.errors);
    }
    return this.commitChecked(actor, id, batch.fileName, {
      model: read.model, counts: read.counts as Record<string, number>, warnings: read.warnings,
    });
  }

  /** The empty template workbook with its Read me sheet. */
  template(): Promise<Uint8Array> {
    return writeTemplate();
  }

  private commitChecked(
    actor: SessionUser,
    batchId: number,
    fileName: string,
    check: Pick<FileCheck, 'counts' | 'warnings'> & { model: FileCheck['model'] },
  ): ImportCommitDto {
    const outcome = commitNetwork(this.deps.db, {
      batchId,
      fileName,
      model: check.model!,
      createdBy: actor.id,
      createdAt: this.stamp(),
    }, this.deps.insertVersion);
    return { id: batchId, networkVersionId: outcome.versionId, counts: check.counts,
      warnings: check.warnings, changes: outcome.changes };
  }

  private resolveMapping(choice: MappingChoice): {
    mapping: WorkbookMapping | undefined;
    mappingId: number | null;
  } {
    if (choice.mappingId !== undefined) {
      const mapping = this.requireMapping(choice.mappingId);
      this.batches.touchMapping(choice.mappingId, this.stamp());
      return { mapping, mappingId: choice.mappingId };
    }
    return { mapping: choice.mapping, mappingId: null };
  }

  private requireMapping(id: number): WorkbookMapping {
    const row = this.batches.findMapping(id);
    if (!row) {
      throw notFound(`There is no saved mapping ${id}.`);
    }
    return row.mapping as WorkbookMapping;
  }

  private requireBatch(id: number): ImportBatchRow {
    const row = this.batches.findBatch(id);
    if (!row) {
      throw notFound(`There is no import ${id}.`);
    }
    return row;
  }

  private requireFile(batch: ImportBatchRow): Uint8Array {
    const data = this.batches.fileOf(batch.id);
    if (!data) {
      throw notFound(`The file of import ${batch.id} is no longer stored.`);
    }
    return data;
  }

  private refuseCommitted(batch: ImportBatchRow): void {
    if (batch.status === 'committed') {
      const version = this.batches.versionsOfBatches([batch.id]).get(batch.id) ?? null;
      throw alreadyCommitted(batch.id, version);
    }
  }

  private dto(
    row: ImportBatchRow,
    names?: Map<number, string>,
    versions?: Map<number, number>,
  ): ImportBatchDto {
    const userNames = names ?? this.batches.userNames([row.createdBy]);
    const versionIds = versions ?? this.batches.versionsOfBatches([row.id]);
    const suggested = row.headerSignature === null
      ? undefined
      : this.batches.findMappingBySignature(row.headerSignature);
    return toImportBatchDto(row, {
      createdByName: row.createdBy === null ? null : (userNames.get(row.createdBy) ?? null),
      suggestedMapping: suggested ? { id: suggested.id, name: suggested.name } : null,
      networkVersionId: versionIds.get(row.id) ?? null,
    });
  }

  private stamp(): string {
    return this.deps.now().toISOString();
  }
}

/** The batch columns a check decides. */
function checkColumns(check: FileCheck) {
  return {
    status: check.status,
    format: check.format,
    headerSignature: check.headerSignature,
    sheets: check.sheets,
    counts: check.counts,
    errors: storedErrors(check.errors),
    warnings: storedWarnings(check.warnings),
    errorCount: check.errors.length,
    warningCount: check.warnings.length,
  };
}
