import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { RunSupplierDetailDto } from '@keelson/contracts';
import { catchError, combineLatest, map, of, startWith, switchMap } from 'rxjs';
import { EntryQuarterTrend } from '../rescoring/entry-quarter-trend';
import { apiErrorMessage } from '../shared/api-error-message';
import { FailurePathPicture } from './failure-path-picture';
import { explainMeasures, likelihoodFactorRows } from './measure-explanations';
import { RiskApi } from './risk-api';
import { ScoreHistoryChart } from './score-history-chart';

type Loaded = { supplier: RunSupplierDetailDto } | { error: string } | { isLoading: true };

/** One lost product with its time to survive against the time to recover, for the bars. */
export interface SurviveRecoverBar {
  code: string;
  plantCode: string;
  weeklyRevenue: number;
  timeToSurvive: number;
  timeToRecover: number;
  lostWeeks: number;
  /** Bar lengths in per cent of the longest bar on the page. */
  surviveShare: number;
  recoverShare: number;
}

/** Bars of time to survive against time to recover, scaled to the longest on the page. */
export function surviveRecoverBars(supplier: RunSupplierDetailDto): SurviveRecoverBar[] {
  const longest = Math.max(
    1e-9,
    supplier.timeToRecover,
    ...supplier.products.map((product) => product.timeToSurvive),
  );
  return supplier.products.map((product) => ({
    code: product.code,
    plantCode: product.plantCode,
    weeklyRevenue: product.weeklyRevenue,
    timeToSurvive: product.timeToSurvive,
    timeToRecover: supplier.timeToRecover,
    lostWeeks: product.lostWeeks,
    surviveShare: Math.min(100, (100 * product.timeToSurvive) / longest),
    recoverShare: Math.min(100, (100 * supplier.timeToRecover) / longest),
  }));
}

/**
 * A supplier's risk in one analysis run: why it matters (products lost, revenue exposed, revenue
 * impact, single point of failure, rank), the failure paths to each product it would stop, time
 * to survive against time to recover per product, its network measures explained, its register
 * score with a link to the register entry, the history of its scores across runs and, once its
 * entry has been through a quarterly re-scoring, its rating per quarter. Every figure is
 * decision support; the page says what it assumes.
 */
@Component({
  selector: 'kl-supplier-risk-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DecimalPipe, EntryQuarterTrend, FailurePathPicture, MatAnchor, MatIcon, MatProgressBar,
    RouterLink, ScoreHistoryChart,
  ],
  templateUrl: './supplier-risk-page.html',
  styleUrl: './supplier-risk-page.scss',
})
export class SupplierRiskPage {
  private readonly api = inject(RiskApi);

  /** The `:runId` route parameter. */
  readonly runId = input.required<string>();
  /** The `:code` route parameter: the supplier's code. */
  readonly code = input.required<string>();

  protected readonly run = computed(() => Number(this.runId()));
  private readonly loaded = toSignal(
    combineLatest([toObservable(this.run), toObservable(this.code)]).pipe(
      switchMap(([runId, code]) =>
        this.api.supplierDetail(runId, code).pipe(
          map((supplier): Loaded => ({ supplier })),
          catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          startWith<Loaded>({ isLoading: true }),
        ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded },
  );
  protected readonly supplier = computed(() => {
    const loaded = this.loaded();
    return 'supplier' in loaded ? loaded.supplier : null;
  });
  protected readonly error = computed(() => {
    const loaded = this.loaded();
    return 'error' in loaded ? loaded.error : null;
  });
  protected readonly isLoading = computed(() => 'isLoading' in this.loaded());
  protected readonly measures = computed(() => {
    const supplier = this.supplier();
    return supplier ? explainMeasures(supplier) : [];
  });
  protected readonly factors = computed(() =>
    likelihoodFactorRows(this.supplier()?.likelihoodFactors ?? {}),
  );
  protected readonly bars = computed(() => {
    const supplier = this.supplier();
    return supplier ? surviveRecoverBars(supplier) : [];
  });
}
