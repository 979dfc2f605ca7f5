import type {
  ImportMappingDto,
  ImportMappingListDto,
  SaveImportMappingInput,
} from '@keelson/contracts';
import { conflict, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { toImportMappingDto } from './import-dto';
import type { ImportMappingRow, ImportsRepository } from './imports.repository';

/** What the mappings service needs. */
export interface ImportMappingsServiceDeps {
  repository: ImportsRepository;
  now: () => Date;
}

/**
 * Saved column mappings: made once for a file whose sheets or headers differ from the template,
 * offered again (by header signature) for the next file laid out the same way.
 */
export class ImportMappingsService {
  constructor(private readonly deps: ImportMappingsServiceDeps) {}

  /** Every saved mapping, by name. */
  list(): ImportMappingListDto {
    const rows = this.deps.repository.listMappings();
    const names = this.deps.repository.userNames(rows.map((row) => row.createdBy));
    return { items: rows.map((row) => this.dto(row, names)) };
  }

  /**
   * Saves a mapping under a name, with the header signature of the batch it was made for.
   * 404 for an unknown batch; 409 `mapping_name_taken` for a name in use; 409
   * `no_headers` when the batch's file has no readable sheet to take a signature from.
   */
  save(actor: SessionUser, input: SaveImportMappingInput): ImportMappingDto {
    const batch = this.deps.repository.findBatch(input.batchId);
    if (!batch) {
      throw notFound(`There is no import ${input.batchId} to take the headers from.`);
    }
    if (batch.headerSignature === null) {
      throw conflict('no_headers', `The file of import ${batch.id} has no readable sheets, so ` +
        'a mapping cannot be saved for it.');
    }
    if (this.deps.repository.findMappingByName(input.name)) {
      throw nameTaken(input.name);
    }
    let row: ImportMappingRow;
    try {
      row = this.deps.repository.insertMapping({
        name: input.name,
        headerSignature: batch.headerSignature,
        mapping: input.mapping,
        createdBy: actor.id,
        createdAt: this.deps.now().toISOString(),
        lastUsedAt: null,
      });
    } catch (error) {
      // Two saves of one name at once: the unique index decides.
      if ((error as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') {
        throw nameTaken(input.name);
      }
      throw error;
    }
    return this.dto(row, this.deps.repository.userNames([actor.id]));
  }

  /** Deletes a saved mapping; 404 when there is none. Batches that used it keep their copy. */
  remove(id: number): void {
    if (!this.deps.repository.deleteMapping(id)) {
      throw notFound(`There is no saved mapping ${id}.`);
    }
  }

  private dto(row: ImportMappingRow, names: Map<number, string>): ImportMappingDto {
    return toImportMappingDto(row, row.createdBy === null ? null : (names.get(row.createdBy) ??
      null));
  }
}

function nameTaken(name: string) {
  return conflict('mapping_name_taken', `There is already a saved mapping named "${name}"; ` +
    'choose another name or delete that one first.');
}
