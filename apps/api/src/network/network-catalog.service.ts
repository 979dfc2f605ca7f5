import type {
  BomNodeDto,
  ListItemsQuery,
  ListProductsQuery,
  NetworkItemDto,
  NetworkProductDto,
  Page,
} from '@keelson/contracts';
import { invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import type { ItemRecord, NetworkCatalogRepository } from './network-catalog.repository';
import type { NetworkSuppliersRepository } from './network-suppliers.repository';
import type { NetworkVersionsRepository } from './network-versions.repository';
import {
  checkPlantFilter,
  effectivePlants,
  isInScope,
  plantScopeOf,
  type PlantScope,
} from './plant-scope';

/** What the catalog service reads. */
export interface NetworkCatalogDeps {
  catalog: NetworkCatalogRepository;
  suppliers: NetworkSuppliersRepository;
  versions: NetworkVersionsRepository;
}

/**
 * Products, items and the bill of materials of a network version, one level at a time. A plant
 * manager sees the products and BOM of their plants, and the items held there or by suppliers
 * that serve them.
 */
export class NetworkCatalogService {
  constructor(private readonly deps: NetworkCatalogDeps) {}

  /** A page of products; 403 `plant_forbidden` for a plant filter outside the user's plants. */
  products(
    user: SessionUser,
    versionId: number,
    query: ListProductsQuery,
  ): Page<NetworkProductDto> {
    const { plant, ...rest } = query;
    const plants = this.scopedPlants(user, versionId, plant);
    const { rows, total } = this.deps.catalog.listProducts(versionId, { ...rest, plants });
    return { items: rows, total };
  }

  /** A page of items; 403 `plant_forbidden` for a plant filter outside the user's plants. */
  items(user: SessionUser, versionId: number, query: ListItemsQuery): Page<NetworkItemDto> {
    const { plant, ...rest } = query;
    const plants = this.scopedPlants(user, versionId, plant);
    const { rows, total } = this.deps.catalog.listItems(versionId, { ...rest, plants });
    return { items: rows.map(toItemDto), total };
  }

  /**
   * One level of the bill of materials: a product's or made item's children at a plant, or a
   * bought item's sourcing rows there. A product opens at its own plant; an item used at more
   * than one plant needs `plant`. 404 for an unknown version, product or item, or one outside
   * a plant manager's plants.
   */
  bom(user: SessionUser, versionId: number, code: string, plant?: string): BomNodeDto {
    const scope = this.checkedScope(user, versionId, plant);
    const product = this.deps.catalog.findProduct(versionId, code);
    if (product) {
      if (plant !== undefined && plant !== product.plantCode) {
        throw invalidRequest(
          `query.plant: product ${code} is made at plant ${product.plantCode}, not ${plant}.`,
          { issues: [{ path: 'query.plant', message: `Expected ${product.plantCode}.` }] },
        );
      }
      if (!isInScope(scope, product.plantCode)) {
        throw notFound(`Product ${code} is not made at your plants in version ${versionId}.`);
      }
      return {
        code, kind: 'product', plantCode: product.plantCode, name: product.name,
        children: this.children(versionId, code, product.plantCode), sources: [],
      };
    }
    const item = this.itemAt(versionId, code, plant, scope);
    return {
      code,
      kind: item.kind,
      plantCode: item.holderCode,
      name: null,
      children: item.kind === 'made' ? this.children(versionId, code, item.holderCode) : [],
      sources: item.kind === 'bought'
        ? this.deps.suppliers.sourcesOf(versionId, item.holderCode, code)
        : [],
    };
  }

  /** The item row at the chosen (or only visible) plant; 404 or 400 naming what is wrong. */
  private itemAt(
    versionId: number,
    code: string,
    plant: string | undefined,
    scope: PlantScope,
  ): ItemRecord {
    const atPlants = this.deps.catalog.itemAtPlants(versionId, code);
    if (atPlants.length === 0) {
      throw notFound(`There is no product or item ${code} at a plant in version ${versionId}.`);
    }
    if (plant !== undefined) {
      const item = atPlants.find((row) => row.holderCode === plant);
      if (!item) {
        throw notFound(`Item ${code} is not used at plant ${plant} in version ${versionId}.`);
      }
      return item;
    }
    const visible = atPlants.filter((row) => isInScope(scope, row.holderCode));
    if (visible.length === 0) {
      throw notFound(`Item ${code} is not used at your plants in version ${versionId}.`);
    }
    if (visible.length > 1) {
      const plants = visible.map((row) => row.holderCode).join(', ');
      throw invalidRequest(
        `query.plant: item ${code} is used at plants ${plants}; choose one with ?plant=.`,
        { issues: [{ path: 'query.plant', message: `One of ${plants}.` }] },
      );
    }
    return visible[0]!;
  }

  private children(versionId: number, parentCode: string, plantCode: string) {
    return this.deps.catalog.bomChildren(versionId, parentCode, plantCode).map((child) => {
      // Every BOM child below a product at its plant has an item row (derived at commit).
      const kind = child.kind ?? 'bought';
      return {
        code: child.code,
        qtyPer: child.qtyPer,
        kind,
        qualifiedSources: kind === 'made' ? null : (child.qualifiedSources ?? 0),
        weeksOfCover: child.weeksOfCover ?? null,
        hasChildren: kind === 'made',
      };
    });
  }

  private checkedScope(user: SessionUser, versionId: number, plant: string | undefined) {
    if (!this.deps.versions.find(versionId)) {
      throw notFound(`There is no network version ${versionId}.`);
    }
    const scope = plantScopeOf(user);
    checkPlantFilter(scope, plant);
    return scope;
  }

  private scopedPlants(user: SessionUser, versionId: number, plant: string | undefined) {
    return effectivePlants(this.checkedScope(user, versionId, plant), plant);
  }
}

function toItemDto(row: ItemRecord): NetworkItemDto {
  return {
    code: row.code,
    holderCode: row.holderCode,
    holderKind: row.holderKind,
    kind: row.kind,
    qualifiedSources: row.qualifiedSources,
    usedIn: row.usedIn,
    weeksOfCover: row.weeksOfCover,
  };
}
