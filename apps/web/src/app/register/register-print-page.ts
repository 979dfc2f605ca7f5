import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  ViewEncapsulation,
  computed,
  inject,
  signal,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import type { RegisterEntryDto } from '@keelson/contracts';
import { catchError, map, of, switchMap, tap } from 'rxjs';
import { apiErrorMessage } from '../shared/api-error-message';
import { RegisterApi } from './register-api';
import { BAND_LABELS, BAND_MARKERS, STATUS_LABELS } from './register-labels';
import {
  readRegisterState,
  registerFilterQuery,
  registerStateParams,
} from './register-table-state';
import { ScoreNote } from './score-note';

type Loaded = { entries: RegisterEntryDto[] } | { error: string };

/** What each sort column is called in the filter summary. */
const SORT_LABELS: Readonly<Record<string, string>> = {
  id: 'number',
  title: 'title',
  supplierCode: 'supplier',
  status: 'status',
  likelihood: 'likelihood',
  impactBand: 'impact band',
  rating: 'rating',
  updatedAt: 'last update',
};

/**
 * The register for a review meeting: every entry matching the register's filters (read in
 * pages of 1000) in one compact table with a heading, the date and a summary of the filters.
 * Its print styles hide the app's navigation, print A4 landscape, repeat the table header on
 * each sheet, keep rows whole and mark bands with shapes, so a black-and-white print reads.
 */
@Component({
  selector: 'kl-register-print-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Not encapsulated: the print rules reach the shell's toolbar and sidenav. Every selector is
  // scoped to this page's class, so nothing leaks while another page is shown.
  encapsulation: ViewEncapsulation.None,
  imports: [DatePipe, MatAnchor, MatButton, MatIcon, MatProgressBar, RouterLink, ScoreNote],
  host: { class: 'register-print' },
  templateUrl: './register-print-page.html',
  styleUrl: './register-print-page.scss',
})
export class RegisterPrintPage {
  private readonly registerApi = inject(RegisterApi);

  protected readonly state = toSignal(
    inject(ActivatedRoute).queryParamMap.pipe(map(readRegisterState)),
    { requireSync: true },
  );
  protected readonly entries = signal<RegisterEntryDto[]>([]);
  protected readonly isLoading = signal(true);
  protected readonly errorMessage = signal<string | null>(null);
  protected readonly printedAt = new Date();
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly bandLabels = BAND_LABELS;
  protected readonly bandMarkers = BAND_MARKERS;
  protected readonly backParams = computed(() => registerStateParams(this.state()));
  protected readonly hasOverride = computed(() =>
    this.entries().some((entry) => entry.likelihoodOverride !== null),
  );
  /** The filters in words ("Status: Open · Plant: P-NORTH · sorted by rating, descending"). */
  protected readonly filterSummary = computed(() => {
    const { filters, sort, order } = this.state();
    const parts: string[] = [];
    if (filters.status) parts.push(`Status: ${STATUS_LABELS[filters.status as 'open']}`);
    if (filters.ratingBand) {
      parts.push(`Rating band: ${BAND_LABELS[filters.ratingBand as 'low']}`);
    }
    if (filters.plant) parts.push(`Plant: ${filters.plant}`);
    if (filters.q) parts.push(`Search: “${filters.q}”`);
    if (parts.length === 0) parts.push('All entries you can see');
    const direction = order === 'desc' ? 'descending' : 'ascending';
    parts.push(`sorted by ${SORT_LABELS[sort] ?? sort}, ${direction}`);
    return parts.join(' · ');
  });

  constructor() {
    inject(ActivatedRoute)
      .queryParamMap.pipe(
        map((params) => registerFilterQuery(readRegisterState(params))),
        tap(() => this.isLoading.set(true)),
        switchMap((query) =>
          this.registerApi.listAll(query).pipe(
            map((entries): Loaded => ({ entries })),
            catchError((error: unknown) => of<Loaded>({ error: apiErrorMessage(error) })),
          ),
        ),
        takeUntilDestroyed(),
      )
      .subscribe((result) => {
        this.isLoading.set(false);
        if ('error' in result) {
          this.entries.set([]);
          this.errorMessage.set(result.error);
          return;
        }
        this.errorMessage.set(null);
        this.entries.set(result.entries);
      });
  }

  protected print(): void {
    window.print();
  }
}
