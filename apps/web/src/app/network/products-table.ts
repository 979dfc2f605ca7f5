import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { type ListProductsQuery, PRODUCT_SORT_FIELDS } from '@keelson/contracts';
import { FilterSelect, codeNameOptions, valueOptions } from '../shared/filter-select';
import { plantOptions } from './filter-options';
import { NetworkBrowseApi } from './network-browse-api';
import { pagedRows } from './paged-rows';
import { routeVersionId } from './route-version-id';
import { TableSearch } from './table-search';
import { NETWORK_PAGE_SIZES, urlTableState } from './url-table-state';

/**
 * The finished products of a network version: search, plant filter, server-side sort and
 * paging kept in the URL. Each product opens its bill of materials.
 */
@Component({
  selector: 'kl-products-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FilterSelect,
    DecimalPipe,
    MatButton,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatSort,
    MatSortHeader,
    MatTableModule,
    RouterLink,
    TableSearch,
  ],
  templateUrl: './products-table.html',
  styleUrl: './network-table.scss',
})
export class ProductsTable {
  private readonly browseApi = inject(NetworkBrowseApi);
  private readonly versionId = routeVersionId();

  protected readonly table = urlTableState({
    filters: ['q', 'plant'] as const,
    sortFields: PRODUCT_SORT_FIELDS,
    defaultSort: 'code',
  });
  protected readonly columns = [
    'code',
    'name',
    'plantCode',
    'weeklyRevenue',
    'componentCount',
  ] as const;
  protected readonly pageSizes = NETWORK_PAGE_SIZES;
  protected readonly plants = plantOptions();
  protected readonly plantChoices = computed(() => codeNameOptions(this.plants()));
  protected readonly hasFilter = computed(
    () => Object.keys(this.table.state().filters).length > 0,
  );

  private readonly query = computed(() => {
    const { filters, sort, order, limit, offset } = this.table.state();
    const query: Partial<ListProductsQuery> = {
      q: filters.q,
      plant: filters.plant,
      sort: sort as ListProductsQuery['sort'],
      order,
      limit,
      offset,
    };
    return { versionId: this.versionId(), query };
  });

  protected readonly page = pagedRows(toObservable(this.query), ({ versionId, query }) =>
    this.browseApi.products(versionId, query),
  );

  protected clearFilters(): void {
    this.table.setFilters({ q: undefined, plant: undefined });
  }
}
