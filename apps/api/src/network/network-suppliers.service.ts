import type {
  ListSuppliersQuery,
  NetworkSupplierDto,
  Page,
  SupplierDetailDto,
} from '@keelson/contracts';
import type { NetworkSupplierRow } from '@keelson/db';
import { notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { NetworkSuppliersRepository } from './network-suppliers.repository';
import type { NetworkVersionsRepository } from './network-versions.repository';
import { checkPlantFilter, effectivePlants, plantScopeOf } from './plant-scope';

/**
 * The suppliers of a network version: the searchable, filtered, sorted list and one supplier's
 * page. A plant manager sees only suppliers whose material reaches one of their plants; their
 * plants served and the rows in which they sell are limited to those plants too.
 */
export class NetworkSuppliersService {
  constructor(
    private readonly suppliers: NetworkSuppliersRepository,
    private readonly versions: NetworkVersionsRepository,
  ) {}

  /** A page of suppliers; 403 `plant_forbidden` for a plant filter outside the user's plants. */
  list(user: SessionUser, versionId: number, query: ListSuppliersQuery): Page<NetworkSupplierDto> {
    this.requireVersion(versionId);
    const scope = plantScopeOf(user);
    checkPlantFilter(scope, query.plant);
    const { plant, ...rest } = query;
    const filter = {
      ...rest,
      ...(rest.country ? { country: rest.country.toUpperCase() } : {}),
      plants: effectivePlants(scope, plant),
    };
    const { rows, total } = this.suppliers.list(versionId, filter, scope);
    const codes = rows.map((row) => row.code);
    const plants = this.suppliers.plantsOf(versionId, codes, scope);
    const counts = this.suppliers.sourcingCounts(versionId, codes, scope);
    return {
      items: rows.map((row) => toSupplierDto(row, plants.get(row.code) ?? [],
        counts.get(row.code) ?? { sells: 0, buys: 0 })),
      total,
    };
  }

  /**
   * One supplier with what it sells to whom, what it buys from whom and the import it came
   * from; 404 when the version or supplier does not exist, or (for a plant manager) when the
   * supplier serves none of their plants.
   */
  detail(user: SessionUser, versionId: number, code: string): SupplierDetailDto {
    const batch = this.versions.importBatchOf(versionId);
    if (!batch) throw notFound(`There is no network version ${versionId}.`);
    const scope = plantScopeOf(user);
    const row = this.suppliers.find(versionId, code);
    if (!row || (scope !== null && !this.suppliers.servesAny(versionId, code, scope))) {
      throw notFound(
        scope === null || !row
          ? `There is no supplier ${code} in network version ${versionId}.`
          : `Supplier ${code} does not serve your plants in network version ${versionId}.`,
      );
    }
    const sells = this.suppliers.sells(versionId, code, scope);
    const buys = this.suppliers.buys(versionId, code);
    const plants = this.suppliers.plantsOf(versionId, [code], scope).get(code) ?? [];
    return {
      ...toSupplierDto(row, plants, { sells: sells.length, buys: buys.length }),
      networkVersionId: versionId,
      sells,
      buys,
      attributes: row.attributes ?? {},
      importBatch: batch,
    };
  }

  private requireVersion(versionId: number): void {
    if (!this.versions.find(versionId)) {
      throw notFound(`There is no network version ${versionId}.`);
    }
  }
}

function toSupplierDto(
  row: NetworkSupplierRow,
  plants: string[],
  counts: { sells: number; buys: number },
): NetworkSupplierDto {
  return {
    code: row.code,
    name: row.name,
    country: row.country,
    region: row.region,
    tier: row.tier,
    recoveryWeeks: row.recoveryWeeks,
    financialHealth: row.financialHealth,
    deliveryScore: row.deliveryScore,
    hasContinuityPlan: row.hasContinuityPlan,
    plants,
    sellsCount: counts.sells,
    buysCount: counts.buys,
    row: row.row,
  };
}
