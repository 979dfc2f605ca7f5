import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { IMPORT_STATUSES, type ImportBatchDto, type ImportStatus } from '@keelson/contracts';
import { catchError, map, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { formatFileSize } from './file-size';
import { IMPORT_STATUS_LABELS } from './import-status';
import { ImportStatusChip } from './import-status-chip';
import { type BatchQuery, ImportsApi } from './imports-api';

/** Rows per page offered by the paginator; the first is the default. */
export const BATCH_PAGE_SIZES = [25, 50, 100] as const;

type BatchResult = { items: ImportBatchDto[]; total: number } | { error: string };

/**
 * Every upload, newest first, kept even when it was rejected: when, who, which file, how it
 * ended and the network version it became. Opening one shows its check step.
 */
@Component({
  selector: 'kl-import-history-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    ImportStatusChip,
    MatButton,
    MatFormField,
    MatIcon,
    MatInput,
    MatLabel,
    MatPaginator,
    MatProgressBar,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './import-history-page.html',
  styleUrl: './import-history-page.scss',
})
export class ImportHistoryPage {
  private readonly importsApi = inject(ImportsApi);

  protected readonly columns = [
    'createdAt',
    'createdBy',
    'fileName',
    'fileSize',
    'status',
    'errorCount',
    'warningCount',
    'networkVersionId',
  ] as const;
  protected readonly statuses = IMPORT_STATUSES;
  protected readonly statusLabels = IMPORT_STATUS_LABELS;
  protected readonly pageSizes = BATCH_PAGE_SIZES;
  protected readonly query = signal<BatchQuery>({ limit: BATCH_PAGE_SIZES[0], offset: 0 });
  protected readonly batches = signal<ImportBatchDto[]>([]);
  protected readonly total = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly pageIndex = computed(() => {
    const { limit = BATCH_PAGE_SIZES[0], offset = 0 } = this.query();
    return Math.floor(offset / limit);
  });
  protected readonly formatFileSize = formatFileSize;

  constructor() {
    toObservable(this.query)
      .pipe(
        switchMap((query) => {
          this.isLoading.set(true);
          return this.importsApi.list(query).pipe(
            map((page): BatchResult => page),
            catchError((error: unknown) => of<BatchResult>({ error: apiErrorMessage(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.errorMessage.set(result.error);
          return;
        }
        this.errorMessage.set(null);
        this.batches.set(result.items);
        this.total.set(result.total);
      });
  }

  protected onStatus(event: Event): void {
    const value = (event.target as HTMLSelectElement).value;
    const status = IMPORT_STATUSES.find((candidate): candidate is ImportStatus => {
      return candidate === value;
    });
    this.query.update((query) => ({ ...query, status, offset: 0 }));
  }

  protected onPage(event: PageEvent): void {
    this.query.update((query) => ({
      ...query,
      limit: event.pageSize,
      offset: event.pageIndex * event.pageSize,
    }));
  }
}
