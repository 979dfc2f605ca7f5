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
import { type ListSuppliersQuery, SUPPLIER_SORT_FIELDS } from '@keelson/contracts';
import { FilterSelect, codeNameOptions, valueOptions } from '../shared/filter-select';
import { countryOptions, plantOptions } from './filter-options';
import { NetworkBrowseApi } from './network-browse-api';
import { pagedRows } from './paged-rows';
import { routeVersionId } from './route-version-id';
import { TableSearch } from './table-search';
import { NETWORK_PAGE_SIZES, urlTableState } from './url-table-state';

/** Tiers offered by the tier filter (deeper tiers can still be linked to by URL). */
export const TIER_CHOICES = [1, 2, 3, 4, 5, 6] as const;

/**
 * The suppliers of a network version: search as you type, filters by tier, country, region and
 * plant, server-side sort and paging, all kept in the URL. Each row links to the supplier.
 */
@Component({
  selector: 'kl-suppliers-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FilterSelect,
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
  templateUrl: './suppliers-table.html',
  styleUrl: './network-table.scss',
})
export class SuppliersTable {
  private readonly browseApi = inject(NetworkBrowseApi);
  private readonly versionId = routeVersionId();

  protected readonly table = urlTableState({
    filters: ['q', 'tier', 'country', 'region', 'plant'] as const,
    sortFields: SUPPLIER_SORT_FIELDS,
    defaultSort: 'code',
  });
  protected readonly columns = [
    'code',
    'name',
    'country',
    'region',
    'tier',
    'recoveryWeeks',
    'financialHealth',
    'deliveryScore',
    'hasContinuityPlan',
    'sellsCount',
    'buysCount',
    'plants',
  ] as const;
  protected readonly pageSizes = NETWORK_PAGE_SIZES;
  protected readonly plants = plantOptions();
  protected readonly countries = countryOptions();
  protected readonly regions = computed(() =>
    [...new Set(this.countries().map((country) => country.region))].sort(),
  );
  protected readonly plantChoices = computed(() => codeNameOptions(this.plants()));
  protected readonly countryChoices = computed(() => codeNameOptions(this.countries()));
  protected readonly regionChoices = computed(() => valueOptions(this.regions()));
  protected readonly tierChoices = computed(() =>
    valueOptions(this.tiers(), (tier) => `Tier ${tier}`));
  private readonly tiers = computed(() => {
    const chosen = Number(this.table.state().filters.tier);
    const choices: number[] = [...TIER_CHOICES];
    return Number.isInteger(chosen) && chosen > 0 && !choices.includes(chosen)
      ? [...choices, chosen]
      : choices;
  });
  protected readonly hasFilter = computed(
    () => Object.keys(this.table.state().filters).length > 0,
  );

  private readonly query = computed(() => {
    const { filters, sort, order, limit, offset } = this.table.state();
    const query: Partial<ListSuppliersQuery> = {
      q: filters.q,
      tier: filters.tier === undefined ? undefined : Number(filters.tier),
      country: filters.country,
      region: filters.region,
      plant: filters.plant,
      sort: sort as ListSuppliersQuery['sort'],
      order,
      limit,
      offset,
    };
    return { versionId: this.versionId(), query };
  });

  protected readonly page = pagedRows(toObservable(this.query), ({ versionId, query }) =>
    this.browseApi.suppliers(versionId, query),
  );

  protected continuityLabel(hasPlan: boolean | null): string {
    return hasPlan === null ? '—' : hasPlan ? 'Yes' : 'No';
  }

  protected clearFilters(): void {
    this.table.setFilters({
      q: undefined,
      tier: undefined,
      country: undefined,
      region: undefined,
      plant: undefined,
    });
  }
}
