import type {
  ListNetworkVersionsQuery,
  NetworkChangesDto,
  NetworkVersionDto,
  Page,
} from '@keelson/contracts';
import type { KeelsonDatabase } from '@keelson/db';
import { writeWorkbook } from '@keelson/workbook';
import { notFound } from '../http/app-error';
import { readNetworkModel } from './network-store';
import type {
  NetworkVersionRecord,
  NetworkVersionsRepository,
} from './network-versions.repository';

/** An exported version: the workbook's bytes and the file name to offer. */
export interface NetworkExport {
  bytes: Uint8Array;
  fileName: string;
}

const NO_CHANGES: NetworkChangesDto = {
  previousVersionId: null,
  suppliersAdded: [],
  suppliersRemoved: [],
  suppliersChanged: [],
  sourcingAdded: 0,
  sourcingRemoved: 0,
  sourcingChanged: 0,
  productsAdded: [],
  productsRemoved: [],
  productsChanged: [],
};

const NO_COUNTS: NetworkVersionDto['counts'] = {
  plants: 0, products: 0, items: 0, bomLines: 0, suppliers: 0, sourcing: 0, stock: 0,
};

/**
 * Network versions: the list (newest first), one version, the latest, and a version written
 * back as a template workbook. Versions are visible to every signed-in role; what is inside
 * them is scoped by the supplier and catalog services.
 */
export class NetworkVersionsService {
  constructor(
    private readonly versions: NetworkVersionsRepository,
    private readonly db: KeelsonDatabase,
  ) {}

  /** A page of versions, newest first. */
  list(query: ListNetworkVersionsQuery): Page<NetworkVersionDto> {
    const { rows, total } = this.versions.list(query.limit, query.offset);
    const latestId = this.versions.latestId();
    return { items: rows.map((row) => toVersionDto(row, latestId)), total };
  }

  /** The most recent version; 404 when no network has been imported. */
  latest(): NetworkVersionDto {
    const latestId = this.versions.latestId();
    if (latestId === null) {
      throw notFound('No network has been imported yet: import a workbook first.');
    }
    return this.get(latestId);
  }

  /** One version; 404 naming the id when there is none. */
  get(id: number): NetworkVersionDto {
    return toVersionDto(this.require(id), this.versions.latestId());
  }

  /** The version's row; 404 naming the id when there is none. */
  require(id: number): NetworkVersionRecord {
    const row = this.versions.find(id);
    if (!row) throw notFound(`There is no network version ${id}.`);
    return row;
  }

  /** The version as a template workbook that reads back to the same supply model. */
  async exportWorkbook(id: number): Promise<NetworkExport> {
    const model = readNetworkModel(this.db, id);
    if (!model) throw notFound(`There is no network version ${id}.`);
    return { bytes: await writeWorkbook(model), fileName: `keelson-network-version-${id}.xlsx` };
  }
}

function toVersionDto(row: NetworkVersionRecord, latestId: number | null): NetworkVersionDto {
  return {
    id: row.id,
    label: row.label,
    createdAt: row.createdAt,
    createdBy:
      row.createdBy !== null && row.createdByName !== null
        ? { id: row.createdBy, name: row.createdByName }
        : null,
    importBatchId: row.importBatchId,
    fileName: row.fileName,
    previousVersionId: row.previousVersionId,
    counts: { ...NO_COUNTS, ...(row.counts as Partial<NetworkVersionDto['counts']>) },
    changes: {
      ...NO_CHANGES,
      previousVersionId: row.previousVersionId,
      ...(row.changes as Partial<NetworkChangesDto>),
    },
    isLatest: row.id === latestId,
  };
}
