import { DatePipe, PercentPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatPaginator, type PageEvent } from '@angular/material/paginator';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import type { AnalysisRunDto, RunProgressEvent } from '@keelson/contracts';
import { type Subscription } from 'rxjs';
import { Session } from '../auth/session';
import { apiErrorMessage } from '../shared/api-error-message';
import { isFinished, RunProgress } from './run-progress';
import { runDuration, stageLabel, statusClass, statusLabel } from './run-labels';
import { RunsApi } from './runs-api';
import { StartRunDialog } from './start-run-dialog';

/** Rows per page of the run list. */
export const RUN_PAGE_SIZES = [25, 50, 100] as const;

/**
 * The analysis runs, newest first, with paging. Risk managers and admins start and cancel runs;
 * a queued or running run shows live progress from its event stream, and the run started here
 * opens its ranking when it succeeds.
 */
@Component({
  selector: 'kl-runs-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButton,
    MatIcon,
    MatPaginator,
    MatProgressBar,
    MatTableModule,
    PercentPipe,
    RouterLink,
  ],
  host: { class: 'kl-page' },
  templateUrl: './runs-page.html',
  styleUrls: ['./run-chips.scss', './runs-page.scss'],
})
export class RunsPage {
  private readonly runsApi = inject(RunsApi);
  private readonly runProgress = inject(RunProgress);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  private readonly watched = new Map<number, Subscription>();
  /** The run this tab started, whose ranking opens once it succeeds. */
  private startedHere: number | null = null;

  protected readonly columns = [
    'label', 'version', 'status', 'progress', 'startedBy', 'createdAt', 'duration', 'actions',
  ] as const;
  protected readonly pageSizes = RUN_PAGE_SIZES;
  protected readonly runs = signal<AnalysisRunDto[]>([]);
  protected readonly total = signal(0);
  protected readonly limit = signal<number>(RUN_PAGE_SIZES[0]);
  protected readonly offset = signal(0);
  protected readonly isLoading = signal(true);
  protected readonly error = signal<string | null>(null);
  /** Live progress of runs being followed, by id. */
  protected readonly live = signal<ReadonlyMap<number, RunProgressEvent>>(new Map());
  protected readonly canRun = computed(() => this.session.hasRole('risk_manager', 'admin'));
  protected readonly statusLabel = statusLabel;
  protected readonly statusClass = statusClass;
  protected readonly stageLabel = stageLabel;
  protected readonly duration = runDuration;

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      for (const subscription of this.watched.values()) {
        subscription.unsubscribe();
      }
      this.watched.clear();
    });
    this.load();
  }

  /** The run as the list shows it: the latest event overrides the listed progress. */
  protected current(run: AnalysisRunDto): RunProgressEvent {
    return this.live().get(run.id) ?? run;
  }

  protected page(event: PageEvent): void {
    this.limit.set(event.pageSize);
    this.offset.set(event.pageIndex * event.pageSize);
    this.load();
  }

  protected openStart(): void {
    this.dialog
      .open<StartRunDialog, void, number>(StartRunDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((id) => {
        if (id === undefined) {
          return;
        }
        this.startedHere = id;
        this.offset.set(0);
        this.load();
      });
  }

  protected cancel(run: AnalysisRunDto): void {
    this.runsApi.cancel(run.id).subscribe({
      next: () => this.load(),
      error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
    });
  }

  private load(): void {
    this.isLoading.set(true);
    this.runsApi.list(this.limit(), this.offset()).subscribe({
      next: (page) => {
        this.isLoading.set(false);
        this.error.set(null);
        this.runs.set(page.items);
        this.total.set(page.total);
        for (const run of page.items) {
          if (!isFinished(run.status)) {
            this.follow(run.id);
          }
        }
      },
      error: (failure: unknown) => {
        this.isLoading.set(false);
        this.error.set(apiErrorMessage(failure));
      },
    });
  }

  private follow(id: number): void {
    if (this.watched.has(id)) {
      return;
    }
    const subscription = this.runProgress.watch(id).subscribe({
      next: (event) => {
        this.live.update((events) => new Map(events).set(id, event));
        if (isFinished(event.status)) {
          this.finished(event);
        }
      },
      error: () => this.watched.delete(id),
    });
    if (!subscription.closed) {
      this.watched.set(id, subscription);
    }
  }

  private finished(event: RunProgressEvent): void {
    this.watched.get(event.id)?.unsubscribe();
    this.watched.delete(event.id);
    if (event.status === 'succeeded' && event.id === this.startedHere) {
      void this.router.navigate(['/runs', event.id]);
      return;
    }
    // The finished row needs its end time and duration from the server.
    this.load();
  }
}
