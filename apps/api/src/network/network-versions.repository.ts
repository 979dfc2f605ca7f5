import { count, desc, eq, max } from 'drizzle-orm';
import {
  importBatches,
  networkVersions,
  users,
  type KeelsonDatabase,
  type NetworkVersionRow,
} from '@keelson/db';

/** A version row with its import batch's file name and its creator's name. */
export interface NetworkVersionRecord extends NetworkVersionRow {
  fileName: string;
  createdByName: string | null;
}

/** Where a version came from: its import batch, when and by whom. */
export interface ImportBatchRecord {
  id: number;
  fileName: string;
  createdAt: string;
  createdBy: string | null;
}

/** Drizzle access to `network_versions` with their batches and creators. */
export class NetworkVersionsRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** A page of versions, newest first, and the number of versions. */
  list(limit: number, offset: number): { rows: NetworkVersionRecord[]; total: number } {
    const rows = this.selectRecords()
      .orderBy(desc(networkVersions.id))
      .limit(limit)
      .offset(offset)
      .all();
    const total = this.db.select({ value: count() }).from(networkVersions).get()?.value ?? 0;
    return { rows, total };
  }

  /** One version, if it exists. */
  find(id: number): NetworkVersionRecord | undefined {
    return this.selectRecords().where(eq(networkVersions.id, id)).get();
  }

  /** The id of the most recent version, or null. */
  latestId(): number | null {
    return this.db.select({ id: max(networkVersions.id) }).from(networkVersions).get()?.id ?? null;
  }

  /** The import batch of a version, if the version exists. */
  importBatchOf(versionId: number): ImportBatchRecord | undefined {
    return this.db
      .select({
        id: importBatches.id,
        fileName: importBatches.fileName,
        createdAt: importBatches.createdAt,
        createdBy: users.name,
      })
      .from(networkVersions)
      .innerJoin(importBatches, eq(importBatches.id, networkVersions.importBatchId))
      .leftJoin(users, eq(users.id, importBatches.createdBy))
      .where(eq(networkVersions.id, versionId))
      .get();
  }

  private selectRecords() {
    return this.db
      .select({
        id: networkVersions.id,
        label: networkVersions.label,
        importBatchId: networkVersions.importBatchId,
        previousVersionId: networkVersions.previousVersionId,
        counts: networkVersions.counts,
        changes: networkVersions.changes,
        createdBy: networkVersions.createdBy,
        createdAt: networkVersions.createdAt,
        fileName: importBatches.fileName,
        createdByName: users.name,
      })
      .from(networkVersions)
      .innerJoin(importBatches, eq(importBatches.id, networkVersions.importBatchId))
      .leftJoin(users, eq(users.id, networkVersions.createdBy))
      .$dynamic();
  }
}
