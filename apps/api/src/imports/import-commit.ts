/**
 * Committing a checked model as a new network version, in ONE SQLite transaction: re-check the
 * batch (a concurrent commit of the same batch loses with 409), read the latest version, compare,
 * insert every row, mark the batch committed. better-sqlite3 runs the transaction synchronously,
 * so two commits in flight never interleave inside it: each sees the other's version as whole or
 * not at all, and the later one's previous version is the earlier one. Any throw rolls back
 * everything written here; the batch record itself was stored before and stays.
 */
import type { NetworkChangesDto, SupplyModel } from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { recordAudit } from '../audit/audit-trail';
import { conflict } from '../http/app-error';
import {
  insertNetworkVersion,
  latestNetworkVersionId,
  readNetworkModel,
  type NetworkCounts,
} from '../network/network-store';
import { ImportsRepository } from './imports.repository';
import { networkChanges } from './network-changes';

/** The function that writes a version; the specs wrap it to make a commit fail half-way. */
export type InsertVersion = typeof insertNetworkVersion;

/** What to commit. */
export interface CommitRequest {
  batchId: number;
  fileName: string;
  model: SupplyModel;
  createdBy: number | null;
  createdAt: string;
}

/** What a commit wrote. */
export interface CommitOutcome {
  versionId: number;
  counts: NetworkCounts;
  changes: NetworkChangesDto;
}

/** The label of the version an import becomes: "Import 3: plant-north.xlsx". */
export function versionLabel(batchId: number, fileName: string): string {
  return `Import ${batchId}: ${fileName}`;
}

/** Commits `request.model` as the next network version (see the file header). */
export function commitNetwork(
  db: KeelsonDatabase,
  request: CommitRequest,
  insertVersion: InsertVersion = insertNetworkVersion,
): CommitOutcome {
  return db.transaction((tx) => {
    const batches = new ImportsRepository(tx);
    const batch = batches.findBatch(request.batchId);
    if (batch?.status === 'committed') {
      const version = batches.versionsOfBatches([request.batchId]).get(request.batchId);
      throw alreadyCommitted(request.batchId, version ?? null);
    }
    if (batch?.status !== 'ready') {
      throw conflict('not_ready', `Import ${request.batchId} is not ready to commit ` +
        `(its status is ${batch?.status ?? 'unknown'}).`);
    }
    const previousVersionId = latestNetworkVersionId(tx);
    const previous = previousVersionId === null ? null : readNetworkModel(tx, previousVersionId);
    const changes = networkChanges(previous, request.model, previousVersionId);
    const { id, counts } = insertVersion(tx, request.model, {
      importBatchId: request.batchId,
      label: versionLabel(request.batchId, request.fileName),
      createdBy: request.createdBy,
      createdAt: request.createdAt,
      previousVersionId,
      changes: { ...changes },
    });
    batches.updateBatch(request.batchId, { status: 'committed', committedAt: request.createdAt });
    recordAudit(tx, { action: 'import.committed', subjectType: 'network_version', subjectId: id,
      userId: request.createdBy, after: { importBatchId: request.batchId,
        fileName: request.fileName, counts: { ...counts }, previousVersionId } },
    new Date(request.createdAt));
    return { versionId: id, counts, changes };
  });
}

/** 409 `already_committed`, naming the version when known. */
export function alreadyCommitted(batchId: number, versionId: number | null) {
  const version = versionId === null ? '' : ` as network version ${versionId}`;
  return conflict('already_committed', `Import ${batchId} was already committed${version}; ` +
    'upload the file again to make another version.', versionId === null ? undefined :
    { networkVersionId: versionId });
}
