import { type Signal, computed, inject } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import { ActivatedRoute, type ParamMap, type Params, Router } from '@angular/router';
import { Subject, debounceTime, distinctUntilChanged, map } from 'rxjs';

/** Rows per page offered by the network tables; the first is the default. */
export const NETWORK_PAGE_SIZES = [25, 50, 100] as const;
/** How long typing pauses before a table's search asks the server. */
export const SEARCH_DEBOUNCE_MS = 250;

/** What a table keeps in the URL besides its filters. */
export interface TableStateOptions<F extends string> {
  /** Query parameter names of the filters (`q` for the search text, `plant` ...). */
  readonly filters: readonly F[];
  /** Columns the server sorts by. */
  readonly sortFields: readonly string[];
  /** The server's default sort column (ascending). */
  readonly defaultSort: string;
}

/** A table's state as read from the URL. */
export interface TableState<F extends string> {
  readonly filters: Readonly<Partial<Record<F, string>>>;
  readonly sort: string;
  readonly order: 'asc' | 'desc';
  readonly limit: number;
  readonly offset: number;
}

/** Reads a table's state from query parameters; unknown or malformed values fall back. */
export function readTableState<F extends string>(
  params: ParamMap,
  options: TableStateOptions<F>,
): TableState<F> {
  const filters: Partial<Record<F, string>> = {};
  for (const key of options.filters) {
    const value = params.get(key)?.trim();
    if (value) {
      filters[key] = value;
    }
  }
  const sort = params.get('sort') ?? '';
  const limit = Number(params.get('limit'));
  const offset = Number(params.get('offset'));
  return {
    filters,
    sort: options.sortFields.includes(sort) ? sort : options.defaultSort,
    order: params.get('order') === 'desc' ? 'desc' : 'asc',
    limit: (NETWORK_PAGE_SIZES as readonly number[]).includes(limit)
      ? limit
      : NETWORK_PAGE_SIZES[0],
    offset: Number.isInteger(offset) && offset > 0 ? offset : 0,
  };
}

/** The query parameters for a state; defaults are left out so plain links stay short. */
export function tableStateParams<F extends string>(
  state: TableState<F>,
  options: TableStateOptions<F>,
): Params {
  const params: Params = {};
  for (const key of options.filters) {
    const value = state.filters[key];
    if (value) {
      params[key] = value;
    }
  }
  if (state.sort !== options.defaultSort || state.order !== 'asc') {
    params['sort'] = state.sort;
    params['order'] = state.order;
  }
  if (state.limit !== NETWORK_PAGE_SIZES[0]) {
    params['limit'] = state.limit;
  }
  if (state.offset > 0) {
    params['offset'] = state.offset;
  }
  return params;
}

/** A table whose filters, sort and page live in the URL, so back, forward and links work. */
export interface UrlTable<F extends string> {
  /** The state of the current URL. */
  readonly state: Signal<TableState<F>>;
  /** The paginator's page index. */
  readonly pageIndex: Signal<number>;
  /** Sets filters (undefined or blank clears one) and goes back to the first page. */
  setFilters(changes: Partial<Record<F, string | undefined>>): void;
  /** Feeds search text; it reaches the URL once typing pauses for {@link SEARCH_DEBOUNCE_MS}. */
  search(text: string): void;
  /** Applies a MatSort change; no direction means the default sort. */
  sortBy(sort: Sort): void;
  /** Applies a paginator change. */
  page(event: PageEvent): void;
}

/**
 * Creates the URL-backed state of a table on the current route. Call it in an injection
 * context (a field initialiser of the table component); `q` must be one of the filters for
 * {@link UrlTable.search}.
 */
export function urlTableState<F extends string>(options: TableStateOptions<F>): UrlTable<F> {
  const router = inject(Router);
  const route = inject(ActivatedRoute);
  const state = toSignal(
    route.queryParamMap.pipe(map((params) => readTableState(params, options))),
    { requireSync: true },
  );
  const go = (next: TableState<F>): void => {
    void router.navigate([], { relativeTo: route, queryParams: tableStateParams(next, options) });
  };
  const searches = new Subject<string>();
  const table: UrlTable<F> = {
    state,
    pageIndex: computed(() => Math.floor(state().offset / state().limit)),
    setFilters(changes) {
      const filters: Partial<Record<F, string>> = { ...state().filters };
      for (const [key, value] of Object.entries(changes) as [F, string | undefined][]) {
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
      const isKnown = options.sortFields.includes(sort.active) && sort.direction !== '';
      go({
        ...state(),
        sort: isKnown ? sort.active : options.defaultSort,
        order: isKnown && sort.direction === 'desc' ? 'desc' : 'asc',
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
      debounceTime(SEARCH_DEBOUNCE_MS),
      distinctUntilChanged(),
      takeUntilDestroyed(),
    )
    .subscribe((q) => {
      if (q !== (state().filters['q' as F] ?? '')) {
        table.setFilters({ ['q' as F]: q } as Partial<Record<F, string>>);
      }
    });
  return table;
}
