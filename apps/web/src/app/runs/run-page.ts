import { DatePipe, DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTab, MatTabContent, MatTabGroup } from '@angular/material/tabs';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import type {
  AnalysisRunDto,
  HeatMapDto,
  ParetoDto,
  RunProgressEvent,
} from '@keelson/contracts';
import { SCORING_DEFAULTS, type ScoringSettings } from '@keelson/scoring';
import {
  BehaviorSubject,
  type Observable,
  catchError,
  combineLatest,
  distinctUntilChanged,
  filter,
  map,
  of,
  switchMap,
} from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { HeatMap, type HeatMapCell } from './heat-map';
import { ParetoChart } from './pareto-chart';
import { isFinished, RunProgress } from './run-progress';
import { RunRanking } from './run-ranking';
import { runDuration, stageLabel, statusClass, statusLabel } from './run-labels';
import { RunsApi } from './runs-api';
import { ScoreAssumptions } from './score-assumptions';

type Loaded<T> = { value: T } | { error: string };

function loaded<T>(source: Observable<T>): Observable<Loaded<T>> {
  return source.pipe(
    map((value): Loaded<T> => ({ value })),
    catchError((failure: unknown) => of<Loaded<T>>({ error: apiErrorMessage(failure) })),
  );
}

/**
 * One analysis run: a summary line, then its ranking, heat map and Pareto chart in tabs.
 * Choosing a heat-map cell narrows the ranking to it (in the URL) and shows the ranking. A run
 * still queued or running shows its progress and loads its results once it succeeds.
 */
@Component({
  selector: 'kl-run-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    HeatMap,
    MatIcon,
    MatProgressBar,
    MatTab,
    MatTabContent,
    MatTabGroup,
    ParetoChart,
    PercentPipe,
    RouterLink,
    RunRanking,
    ScoreAssumptions,
  ],
  host: { class: 'kl-page' },
  templateUrl: './run-page.html',
  styleUrls: ['./run-chips.scss', './run-page.scss'],
})
export class RunPage {
  private readonly runsApi = inject(RunsApi);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);

  protected readonly runId = toSignal(
    this.route.paramMap.pipe(map((params) => Number(params.get('runId')))),
    { requireSync: true },
  );
  private readonly filters = toSignal(this.route.queryParamMap, { requireSync: true });
  protected readonly tab = signal(0);
  /** Asks for the run and its results again (after it finishes while open). */
  private readonly reloads = new BehaviorSubject<void>(undefined);
  private readonly loads = combineLatest([
    this.route.paramMap.pipe(map((params) => Number(params.get('runId')))),
    this.reloads,
  ]).pipe(map(([id]) => id));
  protected readonly run = toSignal(
    this.loads.pipe(switchMap((id) => loaded(this.runsApi.get(id)))),
  );
  protected readonly heatMap = toSignal(
    this.loads.pipe(switchMap((id) => loaded<HeatMapDto>(this.runsApi.heatMap(id)))),
  );
  protected readonly pareto = toSignal(
    this.loads.pipe(switchMap((id) => loaded<ParetoDto>(this.runsApi.pareto(id)))),
  );
  /** The live progress of a run that had not finished when it was read. */
  protected readonly progress = signal<RunProgressEvent | null>(null);
  /** The settings in force; the documented defaults if they cannot be read. */
  protected readonly settings = toSignal(
    this.runsApi.scoringSettings().pipe(catchError(() => of<ScoringSettings>(SCORING_DEFAULTS))),
  );
  protected readonly selectedCell = computed((): HeatMapCell | null => {
    const likelihood = Number(this.filters().get('likelihood'));
    const impactBand = Number(this.filters().get('impactBand'));
    return likelihood > 0 && impactBand > 0 ? { likelihood, impactBand } : null;
  });
  protected readonly statusLabel = statusLabel;
  protected readonly statusClass = statusClass;
  protected readonly duration = runDuration;
  protected readonly stageLabel = stageLabel;

  constructor() {
    const runProgress = inject(RunProgress);
    toObservable(this.runValue)
      .pipe(
        filter((run): run is AnalysisRunDto => run !== null && !isFinished(run.status)),
        map((run) => run.id),
        distinctUntilChanged(),
        switchMap((id) => runProgress.watch(id)),
        takeUntilDestroyed(),
      )
      .subscribe((event) => {
        this.progress.set(event);
        if (isFinished(event.status)) {
          this.reloads.next();
        }
      });
  }

  /** The run once read, or null while loading or after an error. */
  protected readonly runValue = computed((): AnalysisRunDto | null => {
    const result = this.run();
    return result && 'value' in result ? result.value : null;
  });

  protected chooseCell(cell: HeatMapCell): void {
    this.tab.set(0);
    void this.router.navigate([], {
      relativeTo: this.route,
      queryParams: { likelihood: cell.likelihood, impactBand: cell.impactBand, offset: null },
      queryParamsHandling: 'merge',
    });
  }
}
