import { DatePipe, PercentPipe } from '@angular/common';
import {
  ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type {
  QuarterTrendDto, RescoringRunDto, RescoringScheduleDto, RescoringSummaryDto,
} from '@keelson/contracts';
import { type Subscription, timer } from 'rxjs';
import { Session } from '../auth/session';
import { RUN_POLL_INTERVAL_MS, RunProgress, isFinished } from '../runs/run-progress';
import { apiErrorMessage } from '../shared/api-error-message';
import { ComparisonApi } from './comparison-api';
import { QuarterTrendsChart } from './quarter-trends-chart';
import { RescoringApi } from './rescoring-api';
import { isRescoringActive, rescoringStatusLabel } from './rescoring-labels';
import { RescoringSchedule } from './rescoring-schedule';
import {
  StartRescoringDialog, type StartRescoringData, type StartRescoringResult,
} from './start-rescoring-dialog';

/** Progress of a re-scoring's analysis run as the list shows it. */
interface LiveProgress {
  progress: number;
  stage: string | null;
}

/** The counts of a summary as short phrases: "148 re-scored", "1 new", "3 rating changed". */
export function summaryParts(summary: RescoringSummaryDto | null): string[] {
  if (!summary) return [];
  const parts = [`${summary.rescored} re-scored`, `${summary.created} new`,
    `${summary.ratingChanged} rating changed`];
  if (summary.supplierRemoved > 0) parts.push(`${summary.supplierRemoved} supplier gone`);
  if (summary.noLongerMatters > 0) parts.push(`${summary.noLongerMatters} no longer matter`);
  return parts;
}

/** The rows the page shows: the list, newest first. */
const LIST_LIMIT = 50;

/**
 * The quarterly re-scoring: what it does, its schedule (admins change it), the Start button for
 * risk managers and admins, the re-scorings with live progress, resume or restart after an
 * interruption and a link to compare each with the quarter before, and the trends per quarter.
 */
@Component({
  selector: 'kl-rescoring-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe, MatButton, MatIcon, MatProgressBar, MatTableModule, PercentPipe,
    QuarterTrendsChart, RescoringSchedule, RouterLink,
  ],
  host: { class: 'kl-page' },
  templateUrl: './rescoring-page.html',
  styleUrls: ['../runs/run-chips.scss', './rescoring-page.scss'],
})
export class RescoringPage {
  private readonly api = inject(RescoringApi);
  private readonly comparisonApi = inject(ComparisonApi);
  private readonly runProgress = inject(RunProgress);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(Session);
  /** Analysis runs being followed, by analysis run id. */
  private readonly watched = new Map<number, Subscription>();
  /** Analysis runs whose stream has ended while the re-scoring itself may still be busy. */
  private readonly analysisDone = new Set<number>();
  private reloadTimer: Subscription | null = null;

  protected readonly columns = [
    'quarter', 'status', 'progress', 'attempts', 'summary', 'startedBy', 'finishedAt', 'actions',
  ] as const;
  protected readonly rescorings = signal<RescoringRunDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly error = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);
  protected readonly schedule = signal<RescoringScheduleDto | null>(null);
  protected readonly scheduleError = signal<string | null>(null);
  protected readonly trends = signal<QuarterTrendDto[] | null>(null);
  protected readonly trendsError = signal<string | null>(null);
  /** The row to point at (the existing re-scoring of a refused quarter). */
  protected readonly highlighted = signal<number | null>(null);
  protected readonly live = signal<ReadonlyMap<number, LiveProgress>>(new Map());
  protected readonly canRun = computed(() => this.session.hasRole('risk_manager', 'admin'));
  protected readonly isAdmin = computed(() => this.session.hasRole('admin'));
  protected readonly statusLabel = rescoringStatusLabel;
  protected readonly isActive = isRescoringActive;
  protected readonly summaryParts = summaryParts;

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      for (const subscription of this.watched.values()) subscription.unsubscribe();
      this.watched.clear();
      this.reloadTimer?.unsubscribe();
    });
    this.load();
    this.api.schedule().subscribe({
      next: (schedule) => this.schedule.set(schedule),
      error: (failure: unknown) => this.scheduleError.set(apiErrorMessage(failure)),
    });
    this.loadTrends();
  }

  /** The progress bar's value: the latest event, else the listed progress. */
  protected progressOf(run: RescoringRunDto): LiveProgress {
    return this.live().get(run.id) ?? run;
  }

  /**
   * The comparison link of a finished re-scoring against the one before it, if any; a forced
   * second one of a quarter compares with the earlier one of the same quarter.
   */
  protected compareLink(run: RescoringRunDto):
    { query: { from: number; to: number }; text: string } | null {
    if (run.status !== 'succeeded' || run.analysisRunId === null) return null;
    const rows = this.rescorings();
    const named = run.summary?.previousRescoringId;
    const previous = named ? rows.find((row) => row.id === named)
      : rows.slice(rows.indexOf(run) + 1).find((row) => row.status === 'succeeded');
    if (!previous?.analysisRunId) return null;
    return {
      query: { from: previous.analysisRunId, to: run.analysisRunId },
      text: previous.quarterLabel === run.quarterLabel ? 'Compare with the earlier re-scoring'
        : 'Compare with the previous quarter',
    };
  }

  protected openStart(): void {
    const data: StartRescoringData = {
      isAdmin: this.isAdmin(),
      timeZone: this.schedule()?.timeZone ?? 'UTC',
    };
    this.dialog
      .open<StartRescoringDialog, StartRescoringData, StartRescoringResult>(
        StartRescoringDialog, { data, autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((result) => {
        if (!result) return;
        if ('showExisting' in result) {
          this.highlighted.set(result.showExisting);
          this.notice.set('That quarter has a re-scoring already: it is marked in the list.');
        } else {
          this.highlighted.set(result.started.id);
          this.notice.set(`Re-scoring of ${result.started.quarterLabel} started.`);
        }
        this.load();
      });
  }

  protected resume(run: RescoringRunDto, mode: 'resume' | 'restart'): void {
    this.error.set(null);
    this.api.resume(run.id, { mode }).subscribe({
      next: () => {
        this.notice.set(mode === 'resume'
          ? `Re-scoring of ${run.quarterLabel} resumed on the same network version.`
          : `Re-scoring of ${run.quarterLabel} restarted on the latest network version.`);
        this.load();
      },
      error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
    });
  }

  protected cancel(run: RescoringRunDto): void {
    this.api.cancel(run.id).subscribe({
      next: () => this.load(),
      error: (failure: unknown) => this.error.set(apiErrorMessage(failure)),
    });
  }

  protected scheduleSaved(schedule: RescoringScheduleDto): void {
    this.schedule.set(schedule);
    this.notice.set('Schedule saved.');
  }

  private loadTrends(): void {
    this.comparisonApi.trends().subscribe({
      next: (trends) => this.trends.set(trends.items),
      error: (failure: unknown) => this.trendsError.set(apiErrorMessage(failure)),
    });
  }

  private load(): void {
    this.isLoading.set(true);
    this.api.list(LIST_LIMIT).subscribe({
      next: (list) => {
        const wasActive = this.rescorings().some((run) => isRescoringActive(run.status));
        this.isLoading.set(false);
        this.error.set(null);
        this.rescorings.set(list.items);
        this.followActive(list.items);
        const isActive = list.items.some((run) => isRescoringActive(run.status));
        // A re-scoring that just ended has changed the quarters' totals.
        if (wasActive && !isActive) this.loadTrends();
      },
      error: (failure: unknown) => {
        this.isLoading.set(false);
        this.error.set(apiErrorMessage(failure));
      },
    });
  }

  private followActive(rows: readonly RescoringRunDto[]): void {
    let needsPolling = false;
    for (const run of rows) {
      if (!isRescoringActive(run.status)) continue;
      const analysisRunId = run.analysisRunId;
      // Before its analysis run exists, and while the register is re-scored after it, only the
      // re-scoring's own row can say how it stands.
      if (analysisRunId === null || this.analysisDone.has(analysisRunId)) {
        needsPolling = true;
      } else {
        this.follow(run.id, analysisRunId);
      }
    }
    this.reloadTimer?.unsubscribe();
    this.reloadTimer = needsPolling
      ? timer(RUN_POLL_INTERVAL_MS).subscribe(() => this.load())
      : null;
  }

  private follow(rescoringId: number, analysisRunId: number): void {
    if (this.watched.has(analysisRunId)) return;
    const subscription = this.runProgress.watch(analysisRunId).subscribe({
      next: (event) => {
        this.live.update((events) => new Map(events).set(rescoringId, event));
        if (isFinished(event.status)) {
          this.watched.get(analysisRunId)?.unsubscribe();
          this.watched.delete(analysisRunId);
          this.analysisDone.add(analysisRunId);
          this.load();
        }
      },
      error: () => this.watched.delete(analysisRunId),
    });
    if (!subscription.closed) this.watched.set(analysisRunId, subscription);
  }
}
