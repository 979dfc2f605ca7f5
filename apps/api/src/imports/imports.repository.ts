import { and, asc, count, desc, eq, inArray, type SQL } from 'drizzle-orm';
import {
  importBatches,
  importFiles,
  importMappings,
  networkVersions,
  users,
  type ImportBatchRow,
  type KeelsonDatabase,
} from '@keelson/db';
import type { ImportStatus, ListImportBatchesQuery } from '@keelson/contracts';

/** A new row of `import_batches`. */
export type NewImportBatchRow = typeof importBatches.$inferInsert;
/** A row of `import_mappings`. */
export type ImportMappingRow = typeof importMappings.$inferSelect;
/** A new row of `import_mappings`. */
export type NewImportMappingRow = typeof importMappings.$inferInsert;
/** Changes {@link ImportsRepository.updateBatch} can make. */
export type ImportBatchChanges = Partial<Omit<NewImportBatchRow, 'id' | 'createdAt'>>;

/** Drizzle access to `import_batches`, `import_files` and `import_mappings`. */
export class ImportsRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** Stores a batch and its bytes together; returns the stored row. */
  insertBatch(row: NewImportBatchRow, data: Uint8Array): ImportBatchRow {
    return this.db.transaction((tx) => {
      const stored = tx.insert(importBatches).values(row).returning().get();
      tx.insert(importFiles).values({ batchId: stored.id, data: Buffer.from(data) }).run();
      return stored;
    });
  }

  /** The batch with `id`, if any. */
  findBatch(id: number): ImportBatchRow | undefined {
    return this.db.select().from(importBatches).where(eq(importBatches.id, id)).get();
  }

  /** The stored bytes of a batch, if any. */
  fileOf(batchId: number): Uint8Array | undefined {
    const row = this.db
      .select({ data: importFiles.data })
      .from(importFiles)
      .where(eq(importFiles.batchId, batchId))
      .get();
    return row
      ? new Uint8Array(row.data.buffer, row.data.byteOffset, row.data.byteLength)
      : undefined;
  }

  /** Updates a batch and returns the stored row. */
  updateBatch(id: number, changes: ImportBatchChanges): ImportBatchRow {
    return this.db
      .update(importBatches)
      .set(changes)
      .where(eq(importBatches.id, id))
      .returning()
      .get()!;
  }

  /** A page of batches, newest first, and the total matching the filter. */
  listBatches(query: ListImportBatchesQuery): { rows: ImportBatchRow[]; total: number } {
    const conditions: SQL[] = [];
    if (query.status) {
      conditions.push(eq(importBatches.status, query.status));
    }
    const where = conditions.length > 0 ? and(...conditions) : undefined;
    const rows = this.db
      .select()
      .from(importBatches)
      .where(where)
      .orderBy(desc(importBatches.createdAt), desc(importBatches.id))
      .limit(query.limit)
      .offset(query.offset)
      .all();
    const total =
      this.db.select({ value: count() }).from(importBatches).where(where).get()?.value ?? 0;
    return { rows, total };
  }

  /** Number of batches with a status. */
  countByStatus(status: ImportStatus): number {
    return (
      this.db
        .select({ value: count() })
        .from(importBatches)
        .where(eq(importBatches.status, status))
        .get()?.value ?? 0
    );
  }

  /** Names of the users with these ids. */
  userNames(ids: readonly (number | null)[]): Map<number, string> {
    const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
    if (wanted.length === 0) {
      return new Map();
    }
    const rows = this.db
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(inArray(users.id, wanted))
      .all();
    return new Map(rows.map((row) => [row.id, row.name]));
  }

  /** The network version each of these batches became, by batch id. */
  versionsOfBatches(batchIds: readonly number[]): Map<number, number> {
    if (batchIds.length === 0) {
      return new Map();
    }
    const rows = this.db
      .select({ id: networkVersions.id, batchId: networkVersions.importBatchId })
      .from(networkVersions)
      .where(inArray(networkVersions.importBatchId, [...batchIds]))
      .all();
    return new Map(rows.map((row) => [row.batchId, row.id]));
  }

  /** Every saved mapping, by name. */
  listMappings(): ImportMappingRow[] {
    return this.db.select().from(importMappings).orderBy(asc(importMappings.name)).all();
  }

  /** The saved mapping with `id`, if any. */
  findMapping(id: number): ImportMappingRow | undefined {
    return this.db.select().from(importMappings).where(eq(importMappings.id, id)).get();
  }

  /** The saved mapping with this name, if any. */
  findMappingByName(name: string): ImportMappingRow | undefined {
    return this.db.select().from(importMappings).where(eq(importMappings.name, name)).get();
  }

  /** The most recently used (then newest) saved mapping with this header signature. */
  findMappingBySignature(signature: string): ImportMappingRow | undefined {
    return this.db
      .select()
      .from(importMappings)
      .where(eq(importMappings.headerSignature, signature))
      .orderBy(desc(importMappings.lastUsedAt), desc(importMappings.id))
      .limit(1)
      .get();
  }

  /** Stores a mapping and returns the stored row. */
  insertMapping(row: NewImportMappingRow): ImportMappingRow {
    return this.db.insert(importMappings).values(row).returning().get();
  }

  /** Notes that a mapping was used at `at`. */
  touchMapping(id: number, at: string): void {
    this.db.update(importMappings).set({ lastUsedAt: at }).where(eq(importMappings.id, id)).run();
  }

  /** Deletes a mapping; false when there was none. */
  deleteMapping(id: number): boolean {
    return this.db.delete(importMappings).where(eq(importMappings.id, id)).run().changes > 0;
  }
}
