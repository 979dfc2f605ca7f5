import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatFormField, MatLabel, MatPrefix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSort, MatSortHeader, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import {
  IMPORT_PROBLEM_SORT_FIELDS,
  type ImportBatchDto,
  type ImportProblemDto,
  SHEET_NAMES,
} from '@keelson/contracts';
import {
  Subject,
  catchError,
  combineLatest,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  switchMap,
} from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { ImportsApi, type ProblemQuery } from './imports-api';

/** Rows per page offered by the paginator; the first is the default. */
export const PROBLEM_PAGE_SIZES = [25, 50, 100] as const;
/** How long typing pauses before the text filter asks the server. */
export const PROBLEM_SEARCH_DEBOUNCE_MS = 300;

type ProblemResult = { items: ImportProblemDto[]; total: number } | { error: string };

/**
 * The errors and warnings of a batch: sorted, filtered and paged on the server, because a large
 * file can have many thousands of them.
 */
@Component({
  selector: 'kl-problems-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
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
  ],
  templateUrl: './problems-table.html',
  styleUrl: './problems-table.scss',
})
export class ProblemsTable {
  private readonly importsApi = inject(ImportsApi);
  private readonly searchInput = new Subject<string>();

  /** The batch whose problems are listed; each new check of it (a new object) reloads them. */
  readonly batch = input.required<ImportBatchDto>();

  protected readonly columns = ['kind', 'sheet', 'row', 'column', 'value', 'message'] as const;
  protected readonly sheets = SHEET_NAMES;
  protected readonly pageSizes = PROBLEM_PAGE_SIZES;
  protected readonly query = signal<ProblemQuery>({ limit: PROBLEM_PAGE_SIZES[0], offset: 0 });
  protected readonly problems = signal<ImportProblemDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly pageIndex = computed(() => {
    const { limit = PROBLEM_PAGE_SIZES[0], offset = 0 } = this.query();
    return Math.floor(offset / limit);
  });
  protected readonly hasFilter = computed(() => {
    const { kind, sheet, q } = this.query();
    return Boolean(kind || sheet || q);
  });

  constructor() {
    this.searchInput
      .pipe(
        map((text) => text.trim()),
        debounceTime(PROBLEM_SEARCH_DEBOUNCE_MS),
        distinctUntilChanged(),
        takeUntilDestroyed(),
      )
      .subscribe((q) => this.query.update((query) => ({ ...query, q, offset: 0 })));

    combineLatest([toObservable(this.batch), toObservable(this.query)])
      .pipe(
        switchMap(([batch, query]) => {
          this.isLoading.set(true);
          return this.importsApi.problems(batch.id, query).pipe(
            catchError((error: unknown) => of<ProblemResult>({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result: ProblemResult) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.errorMessage.set(result.error);
          return;
        }
        this.errorMessage.set(null);
        this.problems.set(result.items);
        this.total.set(result.total);
      });
  }

  protected onSearchInput(event: Event): void {
    this.searchInput.next((event.target as HTMLInputElement).value);
  }

  protected onKind(event: Event): void {
    const value = (event.target as HTMLSelectElement).value;
    const kind = value === 'error' || value === 'warning' ? value : undefined;
    this.query.update((query) => ({ ...query, kind, offset: 0 }));
  }

  protected onSheet(event: Event): void {
    const sheet = (event.target as HTMLSelectElement).value || undefined;
    this.query.update((query) => ({ ...query, sheet, offset: 0 }));
  }

  protected onSort(sort: Sort): void {
    const field = IMPORT_PROBLEM_SORT_FIELDS.find((candidate) => candidate === sort.active);
    this.query.update((query) => ({
      ...query,
      sort: sort.direction && field ? field : undefined,
      order: sort.direction && field ? sort.direction : undefined,
      offset: 0,
    }));
  }

  protected onPage(event: PageEvent): void {
    this.query.update((query) => ({
      ...query,
      limit: event.pageSize,
      offset: event.pageIndex * event.pageSize,
    }));
  }

  protected valueText(problem: ImportProblemDto): string {
    if (problem.value === null) {
      return '';
    }
    if (typeof problem.value === 'boolean') {
      return problem.value ? 'yes' : 'no';
    }
    return String(problem.value);
  }

  protected rowText(problem: ImportProblemDto): string {
    if (problem.row === null) {
      return '—';
    }
    return problem.cell ? `${problem.row} (${problem.cell})` : String(problem.row);
  }
}
