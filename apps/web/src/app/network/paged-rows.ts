import { type Signal, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { Page } from '@keelson/contracts';
import { type Observable, catchError, map, of, switchMap, tap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';

/** One page of a server-side table, as signals. */
export interface PagedRows<T> {
  readonly rows: Signal<T[]>;
  readonly total: Signal<number>;
  readonly isLoading: Signal<boolean>;
  /** The API's message when the last page could not be read. */
  readonly error: Signal<string | null>;
}

type Loaded<T> = { page: Page<T> } | { error: string };

/**
 * Fetches a page for every query the stream emits, dropping answers to superseded queries (a
 * newer search cancels the older request). Call it in an injection context.
 */
export function pagedRows<Q, T>(
  queries: Observable<Q>,
  fetch: (query: Q) => Observable<Page<T>>,
): PagedRows<T> {
  const rows = signal<T[]>([]);
  const total = signal(0);
  const isLoading = signal(true);
  const error = signal<string | null>(null);
  queries
    .pipe(
      tap(() => isLoading.set(true)),
      switchMap((query) =>
        fetch(query).pipe(
          map((page): Loaded<T> => ({ page })),
          catchError((failure: unknown) => of<Loaded<T>>({ error: apiErrorMessage(failure) })),
        ),
      ),
      takeUntilDestroyed(),
    )
    .subscribe((result) => {
      isLoading.set(false);
      if ('error' in result) {
        error.set(result.error);
        rows.set([]);
        total.set(0);
        return;
      }
      error.set(null);
      rows.set(result.page.items);
      total.set(result.page.total);
    });
  return {
    rows: rows.asReadonly(),
    total: total.asReadonly(),
    isLoading: isLoading.asReadonly(),
    error: error.asReadonly(),
  };
}
