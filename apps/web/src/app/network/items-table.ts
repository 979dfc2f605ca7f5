import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { ITEM_SORT_FIELDS, type ListItemsQuery, type NetworkItemDto } from '@keelson/contracts';
import { FilterSelect, codeNameOptions, valueOptions } from '../shared/filter-select';
import { plantOptions } from './filter-options';
import { NetworkBrowseApi } from './network-browse-api';
import { pagedRows } from './paged-rows';
import { routeVersionId } from './route-version-id';
import { sourcesFlag } from './sourcing-labels';
import { TableSearch } from './table-search';
import { NETWORK_PAGE_SIZES, urlTableState } from './url-table-state';

/**
 * The items (parts and assemblies) of a network version at plants and at the suppliers that
 * buy them: search, plant and kind filters, "single-sourced only", server-side sort and paging
 * kept in the URL. Items made at a plant open their bill of materials.
 */
@Component({
  selector: 'kl-items-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FilterSelect,
    MatButton,
    MatCheckbox,
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
  templateUrl: './items-table.html',
  styleUrl: './network-table.scss',
})
export class ItemsTable {
  private readonly browseApi = inject(NetworkBrowseApi);
  private readonly versionId = routeVersionId();

  protected readonly table = urlTableState({
    filters: ['q', 'plant', 'kind', 'singleSourced'] as const,
    sortFields: ITEM_SORT_FIELDS,
    defaultSort: 'code',
  });
  protected readonly columns = [
    'code',
    'holderCode',
    'holderKind',
    'kind',
    'qualifiedSources',
    'usedIn',
    'weeksOfCover',
  ] as const;
  protected readonly pageSizes = NETWORK_PAGE_SIZES;
  protected readonly plants = plantOptions();
  protected readonly plantChoices = computed(() => codeNameOptions(this.plants()));
  protected readonly kindChoices = [{ value: 'made', label: 'Made' },
    { value: 'bought', label: 'Bought' }];
  protected readonly hasFilter = computed(
    () => Object.keys(this.table.state().filters).length > 0,
  );

  private readonly query = computed(() => {
    const { filters, sort, order, limit, offset } = this.table.state();
    const kind = filters.kind === 'made' || filters.kind === 'bought' ? filters.kind : undefined;
    const query: Partial<ListItemsQuery> = {
      q: filters.q,
      plant: filters.plant,
      kind,
      singleSourced: filters.singleSourced === 'true' ? 'true' : undefined,
      sort: sort as ListItemsQuery['sort'],
      order,
      limit,
      offset,
    };
    return { versionId: this.versionId(), query };
  });

  protected readonly page = pagedRows(toObservable(this.query), ({ versionId, query }) =>
    this.browseApi.items(versionId, query),
  );

  protected flag(item: NetworkItemDto): string | null {
    return item.kind === 'bought' ? sourcesFlag(item.qualifiedSources) : null;
  }

  protected supplierLink(code: string): unknown[] {
    return ['/network', this.versionId(), 'suppliers', code];
  }

  protected bomLink(code: string): unknown[] {
    return ['/network', this.versionId(), 'products', code];
  }

  protected clearFilters(): void {
    this.table.setFilters({
      q: undefined,
      plant: undefined,
      kind: undefined,
      singleSourced: undefined,
    });
  }
}
