import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type {
  BomNodeDto,
  ListItemsQuery,
  ListProductsQuery,
  ListSuppliersQuery,
  NetworkItemDto,
  NetworkProductDto,
  NetworkSupplierDto,
  Page,
  SupplierDetailDto,
} from '@keelson/contracts';
import type { Observable } from 'rxjs';

/** A query of the suppliers table; the server fills in what is left out. */
export type SupplierQuery = Partial<ListSuppliersQuery>;
/** A query of the products table. */
export type ProductQuery = Partial<ListProductsQuery>;
/** A query of the items table. */
export type ItemQuery = Partial<ListItemsQuery>;

/** Turns a query into URL parameters, leaving out empty values (blank text, undefined). */
export function browseParams(query: object): HttpParams {
  let params = new HttpParams();
  for (const [key, value] of Object.entries(query) as [string, unknown][]) {
    if (value === undefined || value === null) {
      continue;
    }
    const text = String(value).trim();
    if (text !== '') {
      params = params.set(key, text);
    }
  }
  return params;
}

/**
 * Data access for what one network version holds: suppliers, products, items and its bill of
 * materials. Paging, sorting and filtering run on the server; plant managers get only their
 * plants' share from it.
 */
@Injectable({ providedIn: 'root' })
export class NetworkBrowseApi {
  private readonly http = inject(HttpClient);

  /** GET /api/network-versions/:id/suppliers: one page of suppliers. */
  suppliers(versionId: number, query: SupplierQuery = {}): Observable<Page<NetworkSupplierDto>> {
    return this.http.get<Page<NetworkSupplierDto>>(`${base(versionId)}/suppliers`, {
      params: browseParams(query),
    });
  }

  /** GET /api/network-versions/:id/suppliers/:code: one supplier with what it sells and buys. */
  supplier(versionId: number, code: string): Observable<SupplierDetailDto> {
    return this.http.get<SupplierDetailDto>(
      `${base(versionId)}/suppliers/${encodeURIComponent(code)}`,
    );
  }

  /** GET /api/network-versions/:id/products: one page of finished products. */
  products(versionId: number, query: ProductQuery = {}): Observable<Page<NetworkProductDto>> {
    return this.http.get<Page<NetworkProductDto>>(`${base(versionId)}/products`, {
      params: browseParams(query),
    });
  }

  /** GET /api/network-versions/:id/items: one page of items (parts and assemblies). */
  items(versionId: number, query: ItemQuery = {}): Observable<Page<NetworkItemDto>> {
    return this.http.get<Page<NetworkItemDto>>(`${base(versionId)}/items`, {
      params: browseParams(query),
    });
  }

  /**
   * GET /api/network-versions/:id/bom/:code?plant=: one level of the bill of materials below a
   * product or made item at a plant, or the sources of a bought item there.
   */
  bom(versionId: number, code: string, plant: string): Observable<BomNodeDto> {
    return this.http.get<BomNodeDto>(`${base(versionId)}/bom/${encodeURIComponent(code)}`, {
      params: browseParams({ plant }),
    });
  }
}

function base(versionId: number): string {
  return `/api/network-versions/${versionId}`;
}
