import { computed, inject } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute, type ParamMap, type Params, Router } from '@angular/router';
import { REGISTER_SORT_FIELDS } from '@keelson/contracts';
import { Subject, debounceTime, distinctUntilChanged, map } from 'rxjs';
import type { TableState, UrlTable } from '../network/url-table-state';
import type { RegisterQuery } from './register-api';
import { isFlagFilter, isRatingBand, isRegisterStatus } from './register-labels';

/** Rows per page offered by the register table; the first is the default. */
export const REGISTER_PAGE_SIZES = [25, 50, 100] as const;
/** How long typing pauses before the register's search asks the server. */
export const REGISTER_SEARCH_DEBOUNCE_MS = 250;
/** The query parameters of the register's filters. */
export const REGISTER_FILTERS = ['q', 'status', 'ratingBand', 'plant', 'flag'] as const;
/** One of {@link REGISTER_FILTERS}. */
export type RegisterFilter = (typeof REGISTER_FILTERS)[number];

// The worst risks first: the register's natural reading order, and the server's default.
const DEFAULT_SORT = 'rating';
const DEFAULT_ORDER = 'desc';

/** The register table's state as read from the URL; unknown or malformed values fall back. */
export function readRegisterState(params: ParamMap): TableState<RegisterFilter> {
  const filters: Partial<Record<RegisterFilter, string>> = {};
  for (const key of REGISTER_FILTERS) {
    const value = params.get(key)?.trim();
    if (value) {
      filters[key] = value;
    }
  }
  if (!isRegisterStatus(filters.status)) delete filters.status;
  if (!isRatingBand(filters.ratingBand)) delete filters.ratingBand;
  if (!isFlagFilter(filters.flag)) delete filters.flag;
  const sort = params.get('sort') ?? '';
  const order = params.get('order');
  const limit = Number(params.get('limit'));
  const offset = Number(params.get('offset'));
  return {
    filters,
    sort: (REGISTER_SORT_FIELDS as readonly string[]).includes(sort) ? sort : DEFAULT_SORT,
    order: order === 'asc' || order === 'desc' ? order : DEFAULT_ORDER,
    limit: (REGISTER_PAGE_SIZES as readonly number[]).includes(limit)
      ? limit
      : REGISTER_PAGE_SIZES[0],
    offset: Number.isInteger(offset) && offset > 0 ? offset : 0,
  };
}

/** The query parameters for a state; defaults are left out so plain links stay short. */
export function registerStateParams(state: TableState<RegisterFilter>): Params {
  const params: Params = { ...state.filters };
  if (state.sort !== DEFAULT_SORT || state.order !== DEFAULT_ORDER) {
    params['sort'] = state.sort;
    params['order'] = state.order;
  }
  if (state.limit !== REGISTER_PAGE_SIZES[0]) {
    params['limit'] = state.limit;
  }
  if (state.offset > 0) {
    params['offset'] = state.offset;
  }
  return params;
}

/** The filters and sort of a state as an API query (no paging). */
export function registerFilterQuery(state: TableState<RegisterFilter>): RegisterQuery {
  const { q, status, ratingBand, plant, flag } = state.filters;
  return {
    q,
    status: isRegisterStatus(status) ? status : undefined,
    ratingBand: isRatingBand(ratingBand) ? ratingBand : undefined,
    plant,
    flag: isFlagFilter(flag) ? flag : undefined,
    sort: state.sort as RegisterQuery['sort'],
    order: state.order,
  };
}

/**
 * The register table's state in the URL (filters, sort, page), so back, forward, links and the
 * print layout share it. Call it in an injection context.
 */
export function registerTableState(): UrlTable<RegisterFilter> {
  const router = inject(Router);
  const route = inject(ActivatedRoute);
  const state = toSignal(route.queryParamMap.pipe(map(readRegisterState)), { requireSync: true });
  const go = (next: TableState<RegisterFilter>): void => {
    void router.navigate([], { relativeTo: route, queryParams: registerStateParams(next) });
  };
  const searches = new Subject<string>();
  const table: UrlTable<RegisterFilter> = {
    state,
    pageIndex: computed(() => Math.floor(state().offset / state().limit)),
    setFilters(changes) {
      const filters = { ...state().filters };
      for (const [key, value] of Object.entries(changes) as [RegisterFilter, string?][]) {
        if (value?.trim()) {
          filters[key] = value.trim();
        } else {
          delete filters[key];
        }
      }
      go({ ...state(), filters, offset: 0 });
    },
    search(text) {
      searches.next(text);
    },
    sortBy(sort) {
      const isKnown =
        (REGISTER_SORT_FIELDS as readonly string[]).includes(sort.active) && sort.direction !== '';
      go({
        ...state(),
        sort: isKnown ? sort.active : DEFAULT_SORT,
        order: isKnown ? (sort.direction as 'asc' | 'desc') : DEFAULT_ORDER,
        offset: 0,
      });
    },
    page(event) {
      go({ ...state(), limit: event.pageSize, offset: event.pageIndex * event.pageSize });
    },
  };
  searches
    .pipe(
      map((text) => text.trim()),
      debounceTime(REGISTER_SEARCH_DEBOUNCE_MS),
      distinctUntilChanged(),
      takeUntilDestroyed(),
    )
    .subscribe((q) => {
      if (q !== (state().filters.q ?? '')) {
        table.setFilters({ q });
      }
    });
  return table;
}
