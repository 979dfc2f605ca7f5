import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatChipRemove, MatChipRow, MatChipSet } from '@angular/material/chips';
import {
  MatExpansionPanel,
  MatExpansionPanelHeader,
  MatExpansionPanelTitle,
} from '@angular/material/expansion';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSlideToggle } from '@angular/material/slide-toggle';
import { MatSort, MatSortHeader } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import {
  type ListRunSuppliersQuery,
  RATING_BANDS,
  RUN_SUPPLIER_SORT_FIELDS,
} from '@keelson/contracts';
import { countryOptions, plantOptions } from '../network/filter-options';
import { pagedRows } from '../network/paged-rows';
import { TableSearch } from '../network/table-search';
import { NETWORK_PAGE_SIZES, urlTableState } from '../network/url-table-state';
import { FilterSelect, codeNameOptions, valueOptions } from '../shared/filter-select';
import { RANKING_COLUMN_HELP } from './ranking-help';
import { ratingBandClass, ratingBandLabel } from './run-labels';
import { RunsApi, type RunSupplierQuery } from './runs-api';
import { ScoreAssumptions } from './score-assumptions';

/** Filters of the ranking kept in the URL (`likelihood` + `impactBand` come from the heat map). */
export const RANKING_FILTERS = [
  'q', 'plant', 'tier', 'country', 'region', 'ratingBand', 'singlePointsOnly', 'likelihood',
  'impactBand',
] as const;

/** Tiers offered by the tier filter. */
const TIER_CHOICES = [1, 2, 3, 4, 5, 6] as const;
const TIER_OPTIONS = valueOptions(TIER_CHOICES, (tier) => `Tier ${tier}`);

/**
 * The single-point-of-failure ranking of one run: server-side sort on every column, filters,
 * paging and the heat-map cell, all kept in the URL; an export of the whole ranking; and what
 * each column means. Rows link to the supplier's risk page.
 */
@Component({
  selector: 'kl-run-ranking',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FilterSelect,
    DecimalPipe,
    MatButton,
    MatChipRemove,
    MatChipRow,
    MatChipSet,
    MatExpansionPanel,
    MatExpansionPanelHeader,
    MatExpansionPanelTitle,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatPaginator,
    MatPrefix,
    MatProgressBar,
    MatSlideToggle,
    MatSort,
    MatSortHeader,
    MatTableModule,
    RouterLink,
    ScoreAssumptions,
    TableSearch,
  ],
  templateUrl: './run-ranking.html',
  styleUrls: ['../network/network-table.scss', './run-chips.scss', './run-ranking.scss'],
})
export class RunRanking {
  private readonly runsApi = inject(RunsApi);

  /** The run whose ranking this is. */
  readonly runId = input.required<number>();

  protected readonly table = urlTableState({
    filters: RANKING_FILTERS,
    sortFields: RUN_SUPPLIER_SORT_FIELDS,
    defaultSort: 'rank',
  });
  protected readonly columns = [
    'rank', 'code', 'tier', 'country', 'productsLost', 'revenueExposedPerWeek', 'revenueImpact',
    'betweenness', 'nexusIndex', 'likelihood', 'impactBand', 'rating',
  ] as const;
  protected readonly help = RANKING_COLUMN_HELP;
  protected readonly pageSizes = NETWORK_PAGE_SIZES;
  protected readonly bandChoices = valueOptions(RATING_BANDS, ratingBandLabel);
  protected readonly tierChoices = TIER_OPTIONS;
  protected readonly plants = plantOptions();
  protected readonly countries = countryOptions();
  protected readonly plantChoices = computed(() => codeNameOptions(this.plants()));
  protected readonly countryChoices = computed(() => codeNameOptions(this.countries()));
  protected readonly regionChoices = computed(() => valueOptions(this.regions()));
  protected readonly regions = computed(() =>
    [...new Set(this.countries().map((country) => country.region))].sort(),
  );
  protected readonly bandLabel = ratingBandLabel;
  protected readonly bandClass = ratingBandClass;
  protected readonly hasFilter = computed(
    () => Object.keys(this.table.state().filters).length > 0,
  );
  /** The heat-map cell the ranking is narrowed to, if any. */
  protected readonly cell = computed(() => {
    const { likelihood, impactBand } = this.table.state().filters;
    return likelihood && impactBand ? { likelihood, impactBand } : null;
  });

  private readonly query = computed((): RunSupplierQuery => {
    const { filters, sort, order, limit, offset } = this.table.state();
    const number = (value: string | undefined): number | undefined =>
      value === undefined || !Number.isInteger(Number(value)) ? undefined : Number(value);
    return {
      q: filters.q,
      plant: filters.plant,
      tier: number(filters.tier),
      country: filters.country,
      region: filters.region,
      ratingBand: (RATING_BANDS as readonly string[]).includes(filters.ratingBand ?? '')
        ? (filters.ratingBand as ListRunSuppliersQuery['ratingBand'])
        : undefined,
      singlePointsOnly: filters.singlePointsOnly === 'true' ? 'true' : undefined,
      likelihood: number(filters.likelihood),
      impactBand: number(filters.impactBand),
      sort: sort as ListRunSuppliersQuery['sort'],
      order,
      limit,
      offset,
    };
  });
  private readonly request = computed(() => ({ runId: this.runId(), query: this.query() }));

  protected readonly page = pagedRows(toObservable(this.request), ({ runId, query }) =>
    this.runsApi.suppliers(runId, query),
  );
  protected readonly exportUrl = computed(() =>
    this.runsApi.exportUrl(this.runId(), this.query()));

  protected clearCell(): void {
    this.table.setFilters({ likelihood: undefined, impactBand: undefined });
  }

  protected clearFilters(): void {
    this.table.setFilters(
      Object.fromEntries(RANKING_FILTERS.map((key) => [key, undefined])) as Record<
        (typeof RANKING_FILTERS)[number],
        undefined
      >,
    );
  }
}
