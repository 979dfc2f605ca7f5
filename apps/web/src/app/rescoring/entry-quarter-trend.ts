import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { EntryScoreDto, RegisterFlag } from '@keelson/contracts';
import { catchError, of, switchMap } from 'rxjs';
import { RatingChip } from '../register/rating-chip';
import { ComparisonApi } from './comparison-api';
import { signed } from './comparison-section';

const FLAG_WORDS: Record<RegisterFlag, string> = {
  supplier_removed: 'supplier no longer in the network',
  no_longer_matters: 'no longer matters',
};

/** One quarter of the trend, with its change against the quarter before. */
export interface QuarterScore {
  score: EntryScoreDto;
  change: number | null;
  flagText: string | null;
}

/** The scores oldest first, each with the change from the one before it. */
export function quarterScores(scores: readonly EntryScoreDto[]): QuarterScore[] {
  const ordered = [...scores].sort((a, b) => a.createdAt.localeCompare(b.createdAt));
  return ordered.map((score, index) => {
    const before = index > 0 ? ordered[index - 1]!.rating : score.previousRating;
    return {
      score,
      change: before === null ? null : score.rating - before,
      flagText: score.flag ? FLAG_WORDS[score.flag] : null,
    };
  });
}

/**
 * A register entry's rating per quarterly re-scoring, oldest first, for the supplier risk page:
 * each quarter's rating chip and its change. Shows nothing when the entry has no scores yet (or
 * they cannot be read: the page around it still works).
 */
@Component({
  selector: 'kl-entry-quarter-trend',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DecimalPipe, RatingChip],
  template: `
    @if (quarters().length > 0) {
      <h2 class="trend__title">Per quarter</h2>
      <p class="kl-muted trend__note">
        The register entry's rating at each quarterly re-scoring, oldest first.
      </p>
      <ol class="trend__list" aria-label="Rating per quarter">
        @for (quarter of quarters(); track quarter.score.rescoringId) {
          <li class="trend__quarter">
            <span class="trend__label">{{ quarter.score.quarterLabel }}</span>&ngsp;
            <kl-rating-chip [band]="quarter.score.ratingBand" [rating]="quarter.score.rating" />
            @if (quarter.change !== null) {
              <span class="trend__change" [class.trend__change--up]="quarter.change > 0">
                {{ quarter.change === 0 ? 'no change' : changeText(quarter.change) }}
              </span>
            }
            @if (quarter.score.revenueImpact !== null) {
              <span class="kl-muted trend__impact">
                revenue impact {{ quarter.score.revenueImpact | number: '1.0-0' }}
              </span>
            }
            @if (quarter.flagText) {
              <span class="trend__flag">{{ quarter.flagText }}</span>
            }
          </li>
        }
      </ol>
    }
  `,
  styles: `
    .trend__title {
      font: var(--mat-sys-title-large);
      margin: 24px 0 4px;
    }
    .trend__note {
      margin: 0 0 8px;
    }
    .trend__list {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 24px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .trend__quarter {
      display: flex;
      flex-direction: column;
      align-items: flex-start;
      gap: 4px;
      padding: 8px 12px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
    }
    .trend__label {
      font: var(--mat-sys-label-large);
    }
    .trend__change,
    .trend__impact,
    .trend__flag {
      font: var(--mat-sys-body-small);
    }
    .trend__change--up,
    .trend__flag {
      color: var(--mat-sys-error);
    }
  `,
})
export class EntryQuarterTrend {
  private readonly api = inject(ComparisonApi);

  /** The register entry whose scores are shown. */
  readonly entryId = input.required<number>();

  private readonly scores = toSignal(
    toObservable(this.entryId).pipe(
      switchMap((id) => this.api.entryScores(id).pipe(
        catchError(() => of<EntryScoreDto[]>([])),
      )),
    ),
    { initialValue: [] as EntryScoreDto[] },
  );
  protected readonly quarters = computed(() => quarterScores(this.scores()));
  protected readonly changeText = (change: number): string => `${signed(change)} since before`;
}
